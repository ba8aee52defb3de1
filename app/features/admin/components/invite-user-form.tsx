import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { InviteUserInputSchema, ROLES, type InviteUserInput, type User } from '../../../../shared/schemas/auth';
import { Button } from '../../../components/ui/button';
import { SelectField, TextField } from '../../../components/ui/field';
import { ErrorText, Notice } from '../../../components/ui/notice';
import { applyServerIssues } from '../../../lib/form-errors';
import { useInviteUser } from '../api';

const ROLE_OPTIONS = ROLES.map((r) => ({ value: r, label: r }));

/** The user gets a mail with a link to choose a password; until then the account cannot sign in. */
export function InviteUserForm() {
  const invite = useInviteUser();
  const form = useForm<InviteUserInput>({ resolver: zodResolver(InviteUserInputSchema), defaultValues: { email: '', name: '', role: 'operator' } });
  const e = form.formState.errors;
  const submit = form.handleSubmit((v) => invite.mutate(v, { onSuccess: () => form.reset(), onError: (err) => applyServerIssues(err, form.setError) }));
  return (
    <form onSubmit={submit} noValidate className="flex max-w-3xl flex-col gap-3 rounded border border-slate-300 bg-white p-4">
      <h2 className="text-lg font-semibold">Invite a user</h2>
      <p className="text-slate-700">Gridset mails a link to choose a password; it works once, within 7 days. The account signs in once the password is set.</p>
      <div className="grid grid-cols-1 gap-3 sm:grid-cols-2">
        <TextField label="E-mail address" type="email" error={e.email?.message} {...form.register('email')} />
        <TextField label="Name" error={e.name?.message} {...form.register('name')} />
        <SelectField label="Role" options={ROLE_OPTIONS} error={e.role?.message} {...form.register('role')} />
      </div>
      {invite.data ? <InviteSent user={invite.data} /> : null}
      <ErrorText error={invite.error} />
      <div><Button type="submit" disabled={invite.isPending}>{invite.isPending ? 'Sending…' : 'Send invitation'}</Button></div>
    </form>
  );
}

function InviteSent({ user }: { user: User }) {
  return <Notice tone="safe" title={`Invitation sent to ${user.email}.`}>Without a mail server set up, the mail is under Outbox; pass the link on.</Notice>;
}
