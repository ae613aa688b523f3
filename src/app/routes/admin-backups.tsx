// Admin: make a backup now (database copy + raw files + SHA-256 manifest, as one .tar archive in
// the backup folder) and download earlier ones. Restoring is done on the server with npm run restore.
import { useBackups, useMakeBackup } from '@/features/admin/api/admin';
import { Button } from '@/components/ui/button';
import { PageHeader, Panel, Loading, ErrorNote, EmptyState } from '@/components/ui/panel';
import { formatDateTime } from '@/lib/format';

function size(bytes: number): string {
  if (bytes >= 1048576) return `${(bytes / 1048576).toFixed(1)} MB`;
  return `${Math.max(1, Math.round(bytes / 1024))} kB`;
}

export default function AdminBackups() {
  const backups = useBackups();
  const make = useMakeBackup();
  if (backups.isLoading) return <Loading />;
  if (backups.error) return <ErrorNote error={backups.error} />;
  const data = backups.data!;
  return (
    <div className="max-w-5xl space-y-5">
      <PageHeader
        eyebrow="Administration"
        title="Backups"
        subtitle="A backup is an online copy of the database taken while people keep working, plus the raw bytes of every uploaded file, with a manifest of SHA-256 sums. Restore one on the server with “npm run restore -- <archive>”."
        actions={<Button variant="primary" onClick={() => make.mutate()} disabled={make.isPending}>{make.isPending ? 'Writing the backup…' : 'Make a backup now'}</Button>}
      />
      {make.data && (
        <p role="status" className="rounded-md border border-moss-700/30 bg-moss-100 p-3 text-sm text-moss-700">
          Backup {make.data.name} written ({size(make.data.bytes)}): {make.data.counts.projects} projects, {make.data.counts.builds} builds, {make.data.counts.curves} curves and {make.data.rawFiles} raw files, each checked against its SHA-256.
        </p>
      )}
      <ErrorNote error={make.error} />
      <Panel title="In the backup folder">
        <p className="mb-3 text-xs text-ink-500">Folder on the server: <span className="num">{data.folder}</span> · raw files are read from the {data.store}.</p>
        {data.backups.length === 0 ? (
          <EmptyState title="No backups yet">Make the first one with the button above; schedule <span className="num">npm run backup</span> on the server for regular ones.</EmptyState>
        ) : (
          <table className="w-full text-sm" aria-label="Backups">
            <thead className="text-left text-xs text-ink-500"><tr><th className="py-1">Backup</th><th>Written</th><th className="text-right">Size</th><th /></tr></thead>
            <tbody className="divide-y divide-line">
              {data.backups.map((b) => (
                <tr key={b.name}>
                  <td className="num py-1.5">{b.name}</td>
                  <td className="num text-ink-700">{formatDateTime(b.createdAt)}</td>
                  <td className="num text-right">{size(b.bytes)}</td>
                  <td className="text-right">{b.archive ? <a className="text-copper-700 underline" href={`/api/admin/backups/${encodeURIComponent(b.name)}`} download>Download</a> : <span className="text-xs text-ink-500">folder on the server</span>}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </Panel>
    </div>
  );
}
