// Invite someone to the project by e-mail, with a role and (for partners) a lab; checked by the
// invitation schema the server validates with, errors under each field.
import { useEffect } from 'react';
import { useForm } from 'react-hook-form';
import type { Lab } from '@shared/api-types';
import { inviteCreateSchema, type InviteCreate } from '@shared/schemas/auth';
import { ROLES, type ProjectRole } from '@shared/schemas/project';
import { Field, Input, Select } from '@/components/ui/field';
import { Button } from '@/components/ui/button';
import { ErrorNote } from '@/components/ui/panel';
import { ApiError } from '@/lib/api-client';
import { schemaResolver } from '@/lib/schema-form';

interface InviteFormValues {
  email: string;
  role: ProjectRole;
  /** lab id, or '' for none */
  labId: string;
}

const EMPTY: InviteFormValues = { email: '', role: 'researcher', labId: '' };

const resolver = schemaResolver<InviteFormValues, InviteCreate>({
  schema: inviteCreateSchema,
  toBody: (v) => ({ email: v.email, role: v.role, labId: v.labId ? Number(v.labId) : null }),
  fieldOf: (path) => (['email', 'role', 'labId'].includes(String(path[0])) ? String(path[0]) : 'root'),
});

/** `onSubmit` gets the checked invitation and a function that empties the form once it is sent. */
export function InviteForm({ labs, pending, error, onSubmit }: { labs: Lab[]; pending: boolean; error: unknown; onSubmit: (body: InviteCreate, done: () => void) => void }) {
  const { register, handleSubmit, reset, setError, formState } = useForm<InviteFormValues>({ defaultValues: EMPTY, resolver });
  const e = formState.errors;
  // a refusal naming a field (e.g. a partner without a lab) lands on that field
  useEffect(() => {
    if (error instanceof ApiError) for (const [path, message] of Object.entries(error.fields)) if (path in EMPTY) setError(path as keyof InviteFormValues, { type: 'server', message });
  }, [error, setError]);
  return (
    <form noValidate className="mt-4 grid gap-3 md:grid-cols-4" aria-label="Invite form" onSubmit={handleSubmit((body) => onSubmit(body as unknown as InviteCreate, () => reset(EMPTY)))}>
      <Field label="Invite by e-mail" error={e.email?.message}>{(fp) => <Input {...fp} type="email" {...register('email')} />}</Field>
      <Field label="Role" error={e.role?.message}>{(fp) => <Select {...fp} {...register('role')}>{ROLES.map((r) => <option key={r} value={r}>{r}</option>)}</Select>}</Field>
      <Field label="Lab" hint="required for partners" error={e.labId?.message}>{(fp) => <Select {...fp} {...register('labId')}><option value="">—</option>{labs.map((l) => <option key={l.id} value={l.id}>{l.name}</option>)}</Select>}</Field>
      <div className="flex items-end"><Button type="submit" variant="primary" disabled={pending}>Send invitation</Button></div>
      <div className="md:col-span-4"><ErrorNote error={error} /></div>
    </form>
  );
}
