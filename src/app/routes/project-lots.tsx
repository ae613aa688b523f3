// A project's catalyst lots: name, maker, batch size, date, metal content and builds made from each.
import { Link, useParams } from 'react-router-dom';
import { useLots } from '@/features/lots/api/lots';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { formatDate, formatNumber, formatSignificant } from '@/lib/format';

export default function ProjectLots() {
  const projectId = Number(useParams().projectId);
  const lots = useLots(projectId);
  if (lots.isLoading) return <Loading />;
  if (lots.error) return <ErrorNote error={lots.error} />;
  return (
    <div>
      <PageHeader eyebrow="Project" title="Catalyst lots" subtitle="Each batch with its maker, size, date and metal content; open one to compare it with another at matched recipes." />
      <Panel>
        {(lots.data ?? []).length === 0 ? <EmptyState title="No lots recorded">A PI or researcher records the project’s catalyst batches; each then shows here with the builds made from it.</EmptyState> : (
          <table className="w-full text-sm" aria-label="Catalyst lots">
            <thead className="text-left text-xs text-ink-500"><tr><th className="py-1 font-medium">Lot</th><th className="font-medium">Maker</th><th className="font-medium">Batch size</th><th className="font-medium">Made or received</th><th className="font-medium">Metal content</th><th className="font-medium">Builds</th></tr></thead>
            <tbody className="divide-y divide-line">
              {lots.data!.map((l) => (
                <tr key={l.id}>
                  <td className="py-1.5"><Link className="text-copper-700 hover:underline" to={`/lots/${l.id}`}>{l.name}</Link></td>
                  <td>{l.maker || '—'}</td>
                  <td className="num">{l.batchSizeG == null ? '—' : `${formatSignificant(l.batchSizeG, 3)} g`}</td>
                  <td className="num">{formatDate(l.madeOn)}</td>
                  <td className="num">{l.metalWtPct == null ? '—' : `${formatNumber(l.metalWtPct, 1)} wt %`}</td>
                  <td className="num">{l.buildCount}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </Panel>
    </div>
  );
}
