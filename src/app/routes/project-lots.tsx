// A project's catalyst lots: name, maker, batch size, date, metal content and builds made from each.
import { Link, useParams } from 'react-router-dom';
import { useCreateLot, useLots } from '@/features/lots/api/lots';
import { LotForm } from '@/features/lots/components/lot-form';
import { useProject } from '@/features/projects/api/projects';
import { can } from '@/features/projects/components/permissions';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { formatDate, formatNumber, formatSignificant } from '@/lib/format';

export default function ProjectLots() {
  const projectId = Number(useParams().projectId);
  const lots = useLots(projectId);
  const project = useProject(projectId);
  const create = useCreateLot(projectId);
  if (lots.isLoading || project.isLoading) return <Loading />;
  if (lots.error || project.error) return <ErrorNote error={lots.error ?? project.error} />;
  const mayEdit = can(project.data?.myRole ?? null, 'editLots');
  return (
    <div>
      <PageHeader eyebrow={project.data?.name ?? 'Project'} title="Catalyst lots" subtitle="Each batch with its maker, size, date and metal content; open one to compare it with another at matched recipes." />
      <Panel>
        {(lots.data ?? []).length === 0 ? <EmptyState title="No lots recorded">A PI or researcher records the project’s catalyst batches; each then shows here with the builds made from it.</EmptyState> : (
          <table className="w-full text-sm" aria-label="Catalyst lots">
            <thead className="text-left text-xs text-ink-500"><tr><th className="py-1 font-medium">Lot</th><th className="font-medium">Maker</th><th className="font-medium">Batch size</th><th className="font-medium">Made or received</th><th className="font-medium">Metal content</th><th className="font-medium">Builds</th><th className="font-medium">Files</th></tr></thead>
            <tbody className="divide-y divide-line">
              {lots.data!.map((l) => (
                <tr key={l.id}>
                  <td className="py-1.5"><Link className="text-copper-700 hover:underline" to={`/lots/${l.id}`}>{l.name}</Link></td>
                  <td>{l.maker || '—'}</td>
                  <td className="num">{l.batchSizeG == null ? '—' : `${formatSignificant(l.batchSizeG, 3)} g`}</td>
                  <td className="num">{formatDate(l.madeOn)}</td>
                  <td className="num">{l.metalWtPct == null ? '—' : `${formatNumber(l.metalWtPct, 1)} wt %`}</td>
                  <td className="num">{l.buildCount}</td>
                  <td className="text-xs text-ink-700">{l.files.length ? l.files.map((f) => f.name).join(', ') : '—'}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </Panel>
      {mayEdit && (
        <Panel title="Record a lot" className="mt-4">
          <LotForm submitLabel="Record lot" onSubmit={(v) => create.mutate(v)} pending={create.isPending} error={create.error} done={create.isSuccess} />
        </Panel>
      )}
    </div>
  );
}
