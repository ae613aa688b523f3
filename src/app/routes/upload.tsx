// Project upload page: drop several files, pick the build for each, watch each one's progress
// and result; ambiguous files ask for their columns to be confirmed.
import { Link, useParams } from 'react-router-dom';
import { useProject } from '@/features/projects/api/projects';
import { useBuildBriefs } from '@/features/builds/api/builds';
import { DropZone, UploadRows, useUploadBatch } from '@/features/curves/components/upload-panel';
import { PageHeader, Panel, Loading, ErrorNote } from '@/components/ui/panel';
import { StatusBadge } from '@/components/ui/status-badge';
import { Button } from '@/components/ui/button';
import { useMe } from '@/features/auth/api/get-me';
import { canUploadTo, canWrite } from '@/features/projects/components/permissions';

export default function UploadPage() {
  const projectId = Number(useParams().projectId);
  const project = useProject(projectId);
  const builds = useBuildBriefs(projectId);
  const { data: me } = useMe();
  const batch = useUploadBatch(projectId);
  if (project.isLoading || builds.isLoading) return <Loading />;
  if (project.error || builds.error) return <ErrorNote error={project.error ?? builds.error} />;
  const partner = project.data!.myRole === 'partner';
  const choices = builds.data!.filter((b) => b.status !== 'discarded' && canUploadTo(project.data!.myRole, me?.user.labId, b.labId)).map((b) => ({ id: b.id, code: b.code }));

  // A file named after a build code ("C-004_pol.csv") is matched to it.
  const guess = (name: string) => choices.find((c) => name.toUpperCase().includes(c.code.toUpperCase()))?.id ?? null;
  const addFiles = (files: File[]) => {
    const rows = files.map((file, i) => ({ key: `${Date.now()}-${i}-${file.name}`, file, buildId: guess(file.name), state: 'waiting' as const, progress: 0 }));
    batch.setRows((r) => [...rows, ...r]);
  };
  const waiting = batch.rows.filter((r) => r.state === 'waiting' || r.state === 'error');
  // what the page shows before any file is chosen: the builds still without curves
  const mine = new Set(choices.map((c) => c.id));
  const withoutCurves = builds.data!.filter((b) => mine.has(b.id) && b.curveCount === 0 && b.status !== 'planned');

  return (
    <div className="max-w-5xl">
      <PageHeader eyebrow={project.data!.name} title="Upload curves" subtitle="Polarization curves, durability logs and open-circuit holds from any station: CSV, TSV, TXT or XLSX. Each file is checked on its own; a refused file stores nothing." />
      <Panel>
        <DropZone onFiles={addFiles} />
        <UploadRows
          rows={batch.rows}
          projectId={projectId}
          settings={project.data!.settings}
          buildCodeOf={(id) => builds.data!.find((b) => b.id === id)?.code ?? `build ${id}`}
          buildChoices={choices}
          onChooseBuild={(row, id) => batch.patch(row.key, { buildId: id })}
          onConfirm={(row, mapping, opts) => batch.send(row, { mapping, kind: opts.kind, saveProfileAs: opts.saveProfileAs, areaCm2: opts.areaCm2, sheet: opts.sheet })}
          onSkip={(row) => batch.patch(row.key, { state: 'error', message: 'Skipped: nothing was stored.' })}
        />
        {waiting.length > 0 && (
          <div className="mt-3 flex justify-end">
            <Button variant="primary" onClick={() => waiting.forEach((r) => batch.send(r, {}))}>Upload {waiting.length} file{waiting.length > 1 ? 's' : ''}</Button>
          </div>
        )}
      </Panel>
      {batch.rows.length === 0 && (
        <Panel title="Builds without curves yet" className="mt-4">
          {!canWrite(project.data!.myRole) ? (
            <p className="text-sm text-ink-500">Your role in this project reads curves but does not upload them; a researcher or the PI can.</p>
          ) : withoutCurves.length === 0 ? (
            <p className="text-sm text-ink-500">Every {partner ? 'build of your lab' : 'built or tested build'} has at least one curve. Files for a build are matched by its code in the file name (e.g. “{choices[0]?.code ?? 'C-012'}_polarization.csv”), or chosen per file.</p>
          ) : (
            <>
              <p className="mb-2 text-sm text-ink-500">A file whose name holds a build’s code (e.g. “{withoutCurves[0]!.code}_polarization.csv”) is matched to that build; any other file asks which build it belongs to.</p>
              <ul className="flex flex-wrap gap-2" aria-label="Builds without curves">
                {withoutCurves.slice(0, 24).map((b) => (
                  <li key={b.id} className="flex items-center gap-2 rounded-md border border-line bg-white px-2 py-1 text-sm">
                    <Link className="font-medium text-copper-700 hover:underline" to={`/projects/${projectId}/builds/${b.id}`}>{b.code}</Link>
                    <StatusBadge status={b.status} />
                  </li>
                ))}
              </ul>
            </>
          )}
        </Panel>
      )}
    </div>
  );
}
