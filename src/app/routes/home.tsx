// Home: my projects with their best build, uploads waiting for review, recent uploads.
import { Link } from 'react-router-dom';
import { TargetList } from '@/features/targets/components/target-status';
import { useHome } from '@/features/projects/api/projects';
import { useMe } from '@/features/auth/api/get-me';
import { ReviewQueue } from '@/features/review/components/review-queue';
import { PageHeader, Panel, EmptyState, Loading, ErrorNote } from '@/components/ui/panel';
import { formatDate, formatDateTime, formatMetric, formatNumber } from '@/lib/format';

/** A short list of builds that wait for someone, linking to each. */
function BuildList({ title, items }: { title: string; items: { buildId: number; code: string; projectId: number; projectName: string; text: string | null }[] }) {
  if (items.length === 0) return null;
  return (
    <Panel title={title} className="mb-5">
      <ul className="divide-y divide-line">
        {items.map((b) => (
          <li key={b.buildId} className="flex items-center justify-between py-2 text-sm">
            <Link className="font-medium text-copper-700 hover:underline" to={`/projects/${b.projectId}/builds/${b.buildId}`}>{b.code}</Link>
            <span className="flex-1 px-3 text-ink-500">{b.text}</span>
            <span className="text-xs text-ink-500">{b.projectName}</span>
          </li>
        ))}
      </ul>
    </Panel>
  );
}

export default function Home() {
  const { data: me } = useMe();
  const { data, isLoading, error } = useHome();
  if (isLoading) return <Loading />;
  if (error || !data) return <ErrorNote error={error} />;
  const firstName = me?.user.name.replace(/^Dr\.\s*/, '').split(' ')[0];

  return (
    <div className="max-w-6xl">
      <PageHeader eyebrow="Home" title={`Good to see you, ${firstName}`} subtitle="Your projects, the best build in each at its reference point, and what is waiting for you." />
      <ReviewQueue items={data.awaitingReview ?? []} />
      {(data.waitingForData ?? []).length > 0 && (
        <Panel title={`Builds of your lab waiting for data (${data.waitingForData!.length})`} className="mb-5">
          <ul className="divide-y divide-line">
            {data.waitingForData!.map((b) => (
              <li key={b.buildId} className="grid grid-cols-[4.5rem_minmax(0,1fr)_auto] items-center gap-3 py-1.5 text-sm">
                <Link className="font-medium text-copper-700 hover:underline" to={`/projects/${b.projectId}/builds/${b.buildId}`}>{b.code}</Link>
                <span className="truncate text-ink-700">{b.changeNote ?? b.projectName} <span className="text-xs text-ink-500">· {b.status}{b.plannedOn ? ` since ${formatDate(b.plannedOn)}` : ''}</span></span>
                <span className="text-xs text-ink-700">{b.needs.length ? `needs ${b.needs.join(', ')}` : 'has its data'}</span>
              </li>
            ))}
          </ul>
        </Panel>
      )}
      <BuildList title="Needs work (my builds)" items={(data.needsWork ?? []).map((b) => ({ ...b, text: b.comment }))} />
      <div className="grid gap-4 md:grid-cols-2">
        {data.projects.length === 0 && (
          <EmptyState title="No projects yet">Ask a PI to invite you, or create a project from the side rail.</EmptyState>
        )}
        {data.projects.map((p) => (
          <Link key={p.id} to={`/projects/${p.id}`} className="group rounded-lg border border-line bg-panel p-4 transition-colors hover:border-copper-500">
            <div className="flex items-start justify-between gap-3">
              <h2 className="font-semibold text-ink-950 group-hover:text-copper-700">{p.name}</h2>
              <span className="rounded-full bg-ink-100 px-2 py-0.5 text-xs text-ink-700">{p.myRole}</span>
            </div>
            <p className="mt-1 line-clamp-2 text-sm text-ink-500">{p.description}</p>
            <dl className="mt-3 grid grid-cols-3 gap-2 text-sm">
              <div>
                <dt className="text-xs text-ink-500">Builds</dt>
                <dd className="num text-ink-900">{p.buildCount ?? 0}</dd>
              </div>
              <div>
                <dt className="text-xs text-ink-500">Reference point</dt>
                <dd className="num text-ink-900">{formatNumber(p.settings.refCurrentDensity, 2)} A/cm²</dd>
              </div>
              <div>
                <dt className="text-xs text-ink-500">Best V at j_ref</dt>
                <dd className="num text-ink-900">{p.best ? <>{formatMetric('vAtRef', p.best.vAtRef)} <span className="text-ink-500">({p.best.code})</span></> : '—'}</dd>
              </div>
            </dl>
            {p.targets && p.targets.length > 0 && (
              <div className="mt-3 border-t border-line pt-2">
                <TargetList targets={p.targets} compact />
              </div>
            )}
          </Link>
        ))}
      </div>
      <Panel title="Recent uploads" className="mt-5">
        {data.recentUploads.length === 0 ? (
          <EmptyState title="No uploads yet">Upload a polarization curve from a build page or a project’s Upload page to see metrics.</EmptyState>
        ) : (
          <table className="w-full text-sm">
            <thead className="text-left text-xs text-ink-500">
              <tr><th className="py-1 font-medium">File</th><th className="font-medium">Build or record</th><th className="font-medium">Review status</th><th className="font-medium">By</th><th className="font-medium">When</th></tr>
            </thead>
            <tbody className="divide-y divide-line">
              {data.recentUploads.map((u) => (
                <tr key={u.fileId}>
                  <td className="py-1.5 text-ink-900">{u.name}</td>
                  <td>
                    {u.buildId ? <Link className="text-copper-700 hover:underline" to={`/projects/${u.projectId}/builds/${u.buildId}`}>{u.buildCode}</Link>
                      : u.lotId ? <Link className="text-copper-700 hover:underline" to={`/lots/${u.lotId}`}>lot {u.lotName}</Link>
                        : u.referenceCurveId ? <Link className="text-copper-700 hover:underline" to={`/projects/${u.projectId}/benchmark`}>reference curve</Link> : '—'}
                  </td>
                  <td className="text-ink-700">{u.buildStatus ?? (u.lotId ? 'kept with the lot' : u.referenceCurveId ? 'benchmark' : '—')}</td>
                  <td className="text-ink-700">{u.uploadedBy}</td>
                  <td className="num text-ink-500">{formatDateTime(u.uploadedAt)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </Panel>
    </div>
  );
}
