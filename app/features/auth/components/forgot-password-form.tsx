import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { ForgotPasswordInputSchema, type ForgotPasswordInput } from '../../../../shared/schemas/auth';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { ErrorText, Notice } from '../../../components/ui/notice';
import { useForgotPassword } from '../api';

/** The same sentence after every request: the page never tells whether an address has an account. */
export const FORGOT_PASSWORD_SENT = 'If that address has an account, a link is on its way.';

export function ForgotPasswordForm() {
  const forgot = useForgotPassword();
  const form = useForm<ForgotPasswordInput>({ resolver: zodResolver(ForgotPasswordInputSchema), defaultValues: { email: '' } });
  const submit = form.handleSubmit((v) => forgot.mutate(v));
  const asked = forgot.isSuccess || forgot.isError;
  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      <TextField label="E-mail address" type="email" autoComplete="username" autoFocus error={form.formState.errors.email?.message} {...form.register('email')} />
      {asked ? (
        <Notice tone="info" title={FORGOT_PASSWORD_SENT}>
          The link works once, within an hour. No mail? Check the address, or ask an admin.
        </Notice>
      ) : null}
      {/* Only a refused request (too many, or the server unreachable) shows more; it says nothing about the account. */}
      <ErrorText error={forgot.error} />
      <Button type="submit" disabled={forgot.isPending}>{forgot.isPending ? 'Sending…' : 'Send me a link'}</Button>
    </form>
  );
}
