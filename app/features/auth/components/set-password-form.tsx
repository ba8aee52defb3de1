import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'react-router-dom';
import { z } from 'zod';
import { PasswordSchema } from '../../../../shared/schemas/auth';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { ErrorText, Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { applyServerIssues } from '../../../lib/form-errors';
import { useSetPassword } from '../api';

// The route's schema checks the password; the form adds the second typing.
const SetPasswordFormSchema = z
  .object({ password: PasswordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords differ; type the same one twice.' });
type SetPasswordForm = z.infer<typeof SetPasswordFormSchema>;

export function SetPasswordForm({ token }: { token: string }) {
  const setPassword = useSetPassword();
  const form = useForm<SetPasswordForm>({ resolver: zodResolver(SetPasswordFormSchema), defaultValues: { password: '', confirm: '' } });
  const e = form.formState.errors;
  const submit = form.handleSubmit((v) => setPassword.mutate({ token, password: v.password }, { onError: (err) => applyServerIssues(err, form.setError) }));

  if (setPassword.data) {
    return (
      <div className="flex flex-col gap-4">
        <Notice tone="safe" title="Your password is set.">Sign in with {setPassword.data.email} and the password you just chose.</Notice>
        <Link to="/sign-in" className="font-semibold text-accent-700 underline">Go to sign-in</Link>
      </div>
    );
  }
  const spent = setPassword.error instanceof ApiError && setPassword.error.code === 'link-spent';
  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      <TextField label="New password" type="password" autoComplete="new-password" autoFocus hint="At least 10 characters." error={e.password?.message} {...form.register('password')} />
      <TextField label="Type it again" type="password" autoComplete="new-password" error={e.confirm?.message} {...form.register('confirm')} />
      <ErrorText error={setPassword.error} />
      {spent ? <p><Link to="/forgot-password" className="text-accent-700 underline">Ask for a new link</Link>, or ask an admin to invite you again.</p> : null}
      <Button type="submit" disabled={setPassword.isPending}>{setPassword.isPending ? 'Saving…' : 'Set password'}</Button>
    </form>
  );
}
