// Admin: the audit log, newest first, filterable by project and entity.
import { useState } from 'react';
import { useAudit } from '@/features/admin/api/admin';
import { useProjects } from '@/features/projects/api/projects';
import { PageHeader, Loading, ErrorNote } from '@/components/ui/panel';
import { Select } from '@/components/ui/field';
import { fieldLabel, formatDateTime, formatFieldValue } from '@/lib/format';

const SKIP = new Set(['updatedAt', 'createdAt', 'id', 'projectId']);

/** What an entry changed, in words: new records by their main fields, updates as before → after. */
function changed(before: unknown, after: unknown): string {
  const fields = (o: unknown) => Object.entries(o as Record<string, unknown>).filter(([k, v]) => !SKIP.has(k) && v != null && v !== '');
  if (!before && after && typeof after === 'object') return fields(after).slice(0, 5).map(([k, v]) => `${fieldLabel(k)}: ${formatFieldValue(v).slice(0, 80)}`).join('; ');
  if (before && !after && typeof before === 'object') return `removed ${fields(before).slice(0, 3).map(([k, v]) => `${fieldLabel(k)}: ${formatFieldValue(v).slice(0, 60)}`).join('; ')}`;
  if (!before || !after || typeof before !== 'object' || typeof after !== 'object') return '';
  const b = before as Record<string, unknown>, a = after as Record<string, unknown>;
  return Object.keys(a).filter((k) => !SKIP.has(k) && JSON.stringify(a[k]) !== JSON.stringify(b[k])).map((k) => `${fieldLabel(k)}: ${formatFieldValue(b[k])} → ${formatFieldValue(a[k])}`).join('; ');
}

export default function AdminAudit() {
  const [projectId, setProjectId] = useState<number | undefined>();
  const [entity, setEntity] = useState<string | undefined>();
  const audit = useAudit({ projectId, entity });
  const projects = useProjects();
  return (
    <div className="max-w-7xl">
      <PageHeader eyebrow="Administration" title="Audit log" subtitle="Every write: who, when, what, and what it changed." />
      <div className="mb-3 flex gap-2">
        <Select aria-label="Project filter" className="w-72" value={projectId ?? ''} onChange={(e) => setProjectId(e.target.value ? Number(e.target.value) : undefined)}>
          <option value="">All projects</option>{projects.data?.map((p) => <option key={p.id} value={p.id}>{p.name}</option>)}
        </Select>
        <Select aria-label="Entity filter" className="w-48" value={entity ?? ''} onChange={(e) => setEntity(e.target.value || undefined)}>
          <option value="">All entities</option>{['build', 'curve', 'project', 'factor', 'response', 'membership', 'invitation', 'review', 'person', 'session', 'lab'].map((x) => <option key={x}>{x}</option>)}
        </Select>
      </div>
      {audit.isLoading ? <Loading /> : audit.error ? <ErrorNote error={audit.error} /> : (
        <div className="overflow-x-auto rounded-lg border border-line bg-panel">
          <table className="w-full text-sm" aria-label="Audit entries">
            <thead className="border-b border-line bg-paper/60 text-left text-xs text-ink-700"><tr><th className="px-3 py-2">When</th><th>Who</th><th>Action</th><th>What</th><th>Change</th></tr></thead>
            <tbody className="divide-y divide-line">
              {audit.data!.map((e) => (
                <tr key={e.id}>
                  <td className="num whitespace-nowrap px-3 py-1.5 text-ink-500">{formatDateTime(e.at)}</td>
                  <td className="whitespace-nowrap">{e.userName ?? '—'}</td>
                  <td>{e.action}</td>
                  <td className="whitespace-nowrap">{e.entity}{e.entityId ? ` #${e.entityId}` : ''}</td>
                  <td className="max-w-xl truncate text-xs text-ink-700" title={changed(e.before, e.after)}>{changed(e.before, e.after)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
