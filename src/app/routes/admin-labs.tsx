// Admin: the home lab and partner labs.
import { useState } from 'react';
import { useLabs } from '@/features/builds/api/builds';
import { useCreateLab } from '@/features/admin/api/admin';
import { PageHeader, Panel, Loading, ErrorNote } from '@/components/ui/panel';
import { Field, Input, Select } from '@/components/ui/field';
import { Button } from '@/components/ui/button';

export default function AdminLabs() {
  const labs = useLabs();
  const create = useCreateLab();
  const [form, setForm] = useState({ name: '', kind: 'partner' as 'home' | 'partner', city: '' });
  if (labs.isLoading) return <Loading />;
  return (
    <div className="max-w-4xl space-y-4">
      <PageHeader eyebrow="Administration" title="Labs" subtitle="Partner labs’ members see only the projects they are invited to and build for their own lab." />
      <Panel>
        <table className="w-full text-sm" aria-label="Labs">
          <thead className="text-left text-xs text-ink-500"><tr><th className="py-1">Name</th><th>Kind</th><th>City</th></tr></thead>
          <tbody className="divide-y divide-line">{labs.data!.map((l) => <tr key={l.id}><td className="py-1.5 font-medium">{l.name}</td><td>{l.kind}</td><td>{l.city ?? '—'}</td></tr>)}</tbody>
        </table>
      </Panel>
      <Panel title="Add a lab">
        <form className="grid gap-3 md:grid-cols-4" onSubmit={(e) => { e.preventDefault(); create.mutate({ name: form.name, kind: form.kind, city: form.city || undefined }, { onSuccess: () => setForm({ name: '', kind: 'partner', city: '' }) }); }}>
          <Field label="Name">{(p) => <Input {...p} required value={form.name} onChange={(e) => setForm({ ...form, name: e.target.value })} />}</Field>
          <Field label="Kind">{(p) => <Select {...p} value={form.kind} onChange={(e) => setForm({ ...form, kind: e.target.value as 'home' | 'partner' })}><option value="partner">partner</option><option value="home">home</option></Select>}</Field>
          <Field label="City">{(p) => <Input {...p} value={form.city} onChange={(e) => setForm({ ...form, city: e.target.value })} />}</Field>
          <div className="flex items-end"><Button type="submit" variant="primary" disabled={create.isPending}>Add lab</Button></div>
          <div className="md:col-span-4"><ErrorNote error={create.error} /></div>
        </form>
      </Panel>
    </div>
  );
}
