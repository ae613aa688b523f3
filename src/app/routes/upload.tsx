// Project upload page: drop several files, pick the build for each, watch each one's progress
// and result; ambiguous files ask for their columns to be confirmed.
import { useParams } from 'react-router-dom';
import { useProject } from '@/features/projects/api/projects';
import { useBuilds } from '@/features/builds/api/builds';
import { DropZone, UploadRows, useUploadBatch } from '@/features/curves/components/upload-panel';
import { PageHeader, Panel, Loading, ErrorNote } from '@/components/ui/panel';
import { Button } from '@/components/ui/button';
import { useMe } from '@/features/auth/api/get-me';

export default function UploadPage() {
  const projectId = Number(useParams().projectId);
  const project = useProject(projectId);
  const builds = useBuilds(projectId);
  const { data: me } = useMe();
  const batch = useUploadBatch(projectId);
  if (project.isLoading || builds.isLoading) return <Loading />;
  if (project.error || builds.error) return <ErrorNote error={project.error ?? builds.error} />;
  const partner = project.data!.myRole === 'partner';
  const choices = builds.data!.filter((b) => b.status !== 'discarded' && (!partner || b.labId === me?.user.labId)).map((b) => ({ id: b.id, code: b.code }));

  // A file named after a build code ("C-004_pol.csv") is matched to it.
  const guess = (name: string) => choices.find((c) => name.toUpperCase().includes(c.code.toUpperCase()))?.id ?? null;
  const addFiles = (files: File[]) => {
    const rows = files.map((file, i) => ({ key: `${Date.now()}-${i}-${file.name}`, file, buildId: guess(file.name), state: 'waiting' as const, progress: 0 }));
    batch.setRows((r) => [...rows, ...r]);
  };
  const waiting = batch.rows.filter((r) => r.state === 'waiting' || r.state === 'error');

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
    </div>
  );
}
