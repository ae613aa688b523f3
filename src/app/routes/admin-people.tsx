// Admin: everyone, their lab, site admin flag, and their role in each project.
import { usePeople, useSetRole, useUpdatePerson } from '@/features/admin/api/admin';
import { useProjects } from '@/features/projects/api/projects';
import { useLabs } from '@/features/builds/api/builds';
import { PageHeader, Loading, ErrorNote } from '@/components/ui/panel';
import { Select } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import type { ProjectRole } from '@shared/schemas/project';
import { useConfirm } from '@/components/ui/confirm-dialog';

export default function AdminPeople() {
  const people = usePeople();
  const projects = useProjects();
  const labs = useLabs();
  const update = useUpdatePerson();
  const setRole = useSetRole();
  const [confirm, confirmDialog] = useConfirm();
  if (people.isLoading || projects.isLoading || labs.isLoading) return <Loading />;
  if (people.error) return <ErrorNote error={people.error} />;
  return (
    <div className="max-w-7xl">
      <PageHeader eyebrow="Administration" title="People" subtitle="Labs, site administrators and project roles. New people join through a project invitation (Settings → People)." />
      {confirmDialog}
      <ErrorNote error={update.error ?? setRole.error} />
      <div className="overflow-x-auto rounded-lg border border-line bg-panel">
        <table className="w-full text-sm" aria-label="People">
          <thead className="border-b border-line bg-paper/60 text-left text-xs text-ink-700">
            <tr><th className="px-3 py-2">Name</th><th>Lab</th><th>Admin</th>{projects.data!.map((p) => <th key={p.id} className="px-2" title={p.name}>{p.name.slice(0, 22)}{p.name.length > 22 ? '…' : ''}</th>)}<th /></tr>
          </thead>
          <tbody className="divide-y divide-line">
            {people.data!.map((person) => (
              <tr key={person.id} className={person.disabledAt ? 'opacity-50' : ''}>
                <td className="px-3 py-1.5"><div className="font-medium">{person.name}</div><div className="text-xs text-ink-500">{person.email}</div></td>
                <td>
                  <Select aria-label={`Lab of ${person.name}`} className="w-48" value={person.labId ?? ''} onChange={(e) => update.mutate({ id: person.id, labId: e.target.value ? Number(e.target.value) : null })}>
                    <option value="">—</option>
                    {labs.data!.map((l) => <option key={l.id} value={l.id}>{l.name}</option>)}
                  </Select>
                </td>
                <td><input type="checkbox" aria-label={`${person.name} is admin`} checked={person.isAdmin} onChange={(e) => update.mutate({ id: person.id, isAdmin: e.target.checked })} /></td>
                {projects.data!.map((p) => {
                  const role = person.roles.find((r) => r.projectId === p.id)?.role ?? 'none';
                  return (
                    <td key={p.id} className="px-2">
                      <Select aria-label={`Role of ${person.name} in ${p.name}`} className="w-32" value={role} onChange={async (e) => { const next = e.target.value; if (next !== 'none' || await confirm({ title: `Remove ${person.name} from ${p.name}?`, message: 'They lose access to the project at once; their builds, curves and comments stay. You can add them again.', confirmLabel: 'Remove from project' })) setRole.mutate({ projectId: p.id, userId: person.id, role: next as ProjectRole | 'none' }); }}>
                        {['none', 'pi', 'researcher', 'partner', 'viewer'].map((r) => <option key={r} value={r}>{r}</option>)}
                      </Select>
                    </td>
                  );
                })}
                <td className="px-2 text-right">
                  <Button variant={person.disabledAt ? 'secondary' : 'danger'} aria-label={`${person.disabledAt ? 'Enable' : 'Disable'} ${person.name}`} onClick={async () => { if (person.disabledAt || await confirm({ title: `Disable ${person.name}?`, message: 'They are signed out everywhere and cannot sign in until you enable them again. Their builds and comments stay.', confirmLabel: `Disable ${person.name}` })) update.mutate({ id: person.id, disabled: !person.disabledAt }); }}>
                    {person.disabledAt ? 'Enable' : 'Disable'}
                  </Button>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
