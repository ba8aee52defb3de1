import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { CreateUserInputSchema, ROLES, type CreateUserInput, type Role, type User } from '../../../../shared/schemas/auth';
import { Button } from '../../../components/ui/button';
import { SelectField, TextField, inputClass } from '../../../components/ui/field';
import { DataTable, columnHelperFor } from '../../../components/ui/data-table';
import { ErrorText } from '../../../components/ui/notice';
import { applyServerIssues } from '../../../lib/form-errors';
import { useCreateUser, useInviteUser, useUpdateUser, useUsers } from '../api';
import { InviteUserForm } from './invite-user-form';
import { ConfirmDialog } from '../../../components/ui/confirm-dialog';
import { Check } from 'lucide-react';

const ROLE_OPTIONS = ROLES.map((r) => ({ value: r, label: r }));

const ROLE_WORK: Record<Role, string> = {
  admin: 'users, roles, invitations, backups and the outbox',
  lead: 'the catalog, naming, releases, sign-off, jobs and the audit trail',
  programmer: 'the catalog, templates, jobs and part programs',
  reviewer: 'signing template versions off',
  operator: 'measured bars and load lists at the machine',
};

/** A role changes only after the admin confirms it in a dialog, and the row then says it was saved. */
function RoleCell({ user }: { user: User }) {
  const update = useUpdateUser();
  const [pending, setPending] = useState<Role | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const confirm = () => {
    if (!pending) return;
    const to = pending;
    update.mutate({ id: user.id, patch: { role: to } }, {
      onSuccess: () => { setSaved(`Saved: ${user.name} is now ${to}.`); setPending(null); },
      onError: () => setPending(null),
    });
  };
  return (
    <div className="flex flex-col gap-1">
      <select aria-label={`Role of ${user.email}`} className={`${inputClass} w-40`} value={pending ?? user.role} disabled={update.isPending}
        onChange={(ev) => { const r = ev.target.value as Role; setSaved(null); update.reset(); if (r !== user.role) setPending(r); }}>
        {ROLES.map((r) => <option key={r} value={r}>{r}</option>)}
      </select>
      <ConfirmDialog open={pending !== null} title={`Change the role of ${user.name}?`} confirmLabel={`Make ${pending ?? ''}`} pending={update.isPending}
        onConfirm={confirm} onCancel={() => setPending(null)}>
        <p>{user.email} goes from <strong>{user.role}</strong> to <strong>{pending}</strong>: from their next request they may do what a {pending} does ({pending ? ROLE_WORK[pending] : ''}) and no longer what only a {user.role} does.</p>
      </ConfirmDialog>
      {saved ? <span role="status" className="inline-flex items-center gap-1 text-sm text-slate-800"><Check aria-hidden className="h-4 w-4" />{saved}</span> : null}
      {update.error ? <span role="alert" className="text-sm text-danger-700">{update.error.message}</span> : null}
    </div>
  );
}

/** An invited user has no password yet: a new link is what helps, not reactivation. */
function InvitedCell({ user }: { user: User }) {
  const invite = useInviteUser();
  return (
    <div className="flex flex-wrap items-center gap-2">
      <span>invited, no password yet</span>
      <Button variant="secondary" disabled={invite.isPending} onClick={() => invite.mutate({ email: user.email, name: user.name, role: user.role })}>
        Send the invitation again
      </Button>
      {invite.isSuccess ? <span role="status" className="text-sm text-safe-700">New link sent.</span> : null}
      {invite.error ? <span role="alert" className="text-sm text-danger-700">{invite.error.message}</span> : null}
    </div>
  );
}

function ActiveCell({ user }: { user: User }) {
  const update = useUpdateUser();
  if (user.invited && !user.active) return <InvitedCell user={user} />;
  return (
    <div className="flex items-center gap-2">
      <span>{user.active ? 'active' : 'deactivated'}</span>
      <Button variant={user.active ? 'danger' : 'secondary'} disabled={update.isPending} onClick={() => update.mutate({ id: user.id, patch: { active: !user.active } })}>
        {user.active ? 'Deactivate' : 'Reactivate'}
      </Button>
      {update.error ? <span role="alert" className="text-sm text-danger-700">{update.error.message}</span> : null}
    </div>
  );
}

const col = columnHelperFor<User>();
const columns = col.columns([
  col.accessor('email', { header: 'E-mail' }),
  col.accessor('name', { header: 'Name' }),
  col.accessor('role', { header: 'Role', cell: (c) => <RoleCell user={c.row.original} /> }),
  col.accessor('active', { header: 'Status', cell: (c) => <ActiveCell user={c.row.original} /> }),
]);

export function UsersAdmin() {
  const users = useUsers();
  const [filter, setFilter] = useState('');
  return (
    <div className="flex flex-col gap-6">
      <div className="max-w-sm"><TextField label="Filter users" value={filter} onChange={(e) => setFilter(e.target.value)} /></div>
      <ErrorText error={users.error} />
      <DataTable caption="Users" columns={columns} data={users.data?.items ?? NO_USERS} filter={filter} getRowId={(u) => String(u.id)} />
      <div className="grid grid-cols-1 items-start gap-6 xl:grid-cols-2">
        <InviteUserForm />
        <AddUserForm />
      </div>
    </div>
  );
}
const NO_USERS: User[] = [];

function AddUserForm() {
  const create = useCreateUser();
  const form = useForm<CreateUserInput>({ resolver: zodResolver(CreateUserInputSchema), defaultValues: { email: '', name: '', role: 'operator', password: '' } });
  const e = form.formState.errors;
  const submit = form.handleSubmit((v) => create.mutate(v, { onSuccess: () => form.reset(), onError: (err) => applyServerIssues(err, form.setError) }));
  return (
    <form onSubmit={submit} noValidate className="flex max-w-3xl flex-col gap-3 rounded border border-slate-300 bg-white p-4">
      <h2 className="text-lg font-semibold">Add a user</h2>
      <div className="grid grid-cols-1 gap-3 sm:grid-cols-2">
        <TextField label="E-mail address" type="email" error={e.email?.message} {...form.register('email')} />
        <TextField label="Name" error={e.name?.message} {...form.register('name')} />
        <SelectField label="Role" options={ROLE_OPTIONS} error={e.role?.message} {...form.register('role')} />
        <TextField label="First password" type="password" autoComplete="new-password" hint="At least 10 characters; tell the user to change it." error={e.password?.message} {...form.register('password')} />
      </div>
      <ErrorText error={create.error} />
      <div><Button type="submit" disabled={create.isPending}>Add user</Button></div>
    </form>
  );
}
