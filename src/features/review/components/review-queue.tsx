// "Waiting for my review" on the home page: how many builds wait for the PI's verdict, grouped by
// project, each with how long it has waited, its V at j_ref and the change from its parent.
import { Link } from 'react-router-dom';
import { Panel } from '@/components/ui/panel';
import { formatMetric } from '@/lib/format';

export interface QueueItem {
  buildId: number;
  code: string;
  projectId: number;
  projectName: string;
  changeNote: string | null;
  waitingDays: number | null;
  vAtRef: number | null;
  parentCode: string | null;
  changeFromParent: number | null;
}

function waited(days: number | null): string {
  if (days == null) return 'waiting';
  if (days === 0) return 'since today';
  return days === 1 ? '1 day' : `${days} days`;
}

function change(item: QueueItem): string {
  if (item.changeFromParent == null || !item.parentCode) return item.parentCode ? `no value to compare with ${item.parentCode}` : 'no parent';
  const mv = item.changeFromParent * 1000;
  return `${mv >= 0 ? '+' : '−'}${Math.abs(mv).toFixed(0)} mV vs ${item.parentCode}`;
}

export function ReviewQueue({ items }: { items: QueueItem[] }) {
  if (items.length === 0) return null;
  const projects = [...new Map(items.map((i) => [i.projectId, i.projectName])).entries()];
  return (
    <Panel title={`Waiting for my review (${items.length})`} className="mb-5">
      {projects.map(([projectId, projectName]) => {
        const mine = items.filter((i) => i.projectId === projectId);
        return (
          <section key={projectId} aria-label={`Waiting in ${projectName}`} className="mb-2 last:mb-0">
            <h3 className="mb-1 text-xs font-semibold text-ink-700">{projectName} · {mine.length} {mine.length === 1 ? 'build' : 'builds'}</h3>
            <ul className="divide-y divide-line">
              {mine.map((b) => (
                <li key={b.buildId} className="grid grid-cols-[4.5rem_minmax(0,1fr)_5.5rem_10.5rem_5rem] items-center gap-3 py-1.5 text-sm">
                  <Link className="font-medium text-copper-700 hover:underline" to={`/projects/${b.projectId}/builds/${b.buildId}`}>{b.code}</Link>
                  <span className="truncate text-ink-500" title={b.changeNote ?? undefined}>{b.changeNote ?? '—'}</span>
                  <span className="num text-right text-ink-900" title="V at j_ref of the curve of record">{formatMetric('vAtRef', b.vAtRef)}</span>
                  <span className="num text-right text-xs text-ink-700">{change(b)}</span>
                  <span className="text-right text-xs text-ink-500">{waited(b.waitingDays)}</span>
                </li>
              ))}
            </ul>
          </section>
        );
      })}
    </Panel>
  );
}
