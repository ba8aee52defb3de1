import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { LoginInputSchema, type LoginInput } from '../../../../shared/schemas/auth';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { ErrorText } from '../../../components/ui/notice';
import { useSignIn } from '../api';

export function SignInForm({ onSignedIn }: { onSignedIn: () => void }) {
  const signIn = useSignIn();
  const form = useForm<LoginInput>({ resolver: zodResolver(LoginInputSchema), defaultValues: { email: '', password: '' } });
  const submit = form.handleSubmit((values) => signIn.mutate(values, { onSuccess: onSignedIn }));
  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      <TextField label="E-mail address" type="email" autoComplete="username" autoFocus error={form.formState.errors.email?.message} {...form.register('email')} />
      <TextField label="Password" type="password" autoComplete="current-password" error={form.formState.errors.password?.message} {...form.register('password')} />
      <ErrorText error={signIn.error} />
      <Button type="submit" disabled={signIn.isPending}>{signIn.isPending ? 'Signing in…' : 'Sign in'}</Button>
    </form>
  );
}
