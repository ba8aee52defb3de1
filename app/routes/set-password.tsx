import { Link, useSearchParams } from 'react-router-dom';
import { CardPage } from '../components/ui/card-page';
import { Notice } from '../components/ui/notice';
import { SetPasswordForm } from '../features/auth/components/set-password-form';

export function SetPasswordRoute() {
  const token = useSearchParams()[0].get('token') ?? '';
  return (
    <CardPage title="Set your password" subtitle="Choose the password you will sign in to Gridset with.">
      {token ? (
        <SetPasswordForm token={token} />
      ) : (
        <Notice tone="warning" title="This page needs the link from your mail.">
          Open the link in the invitation or reset mail again, or <Link to="/forgot-password" className="text-accent-700 underline">ask for a new one</Link>.
        </Notice>
      )}
    </CardPage>
  );
}
