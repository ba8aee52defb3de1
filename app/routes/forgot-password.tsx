import { Link } from 'react-router-dom';
import { CardPage } from '../components/ui/card-page';
import { ForgotPasswordForm } from '../features/auth/components/forgot-password-form';

export function ForgotPasswordRoute() {
  return (
    <CardPage title="Forgot your password?" subtitle="Enter your address; Gridset mails you a link to choose a new password.">
      <ForgotPasswordForm />
      <p className="mt-4"><Link to="/sign-in" className="text-accent-700 underline">Back to sign-in</Link></p>
    </CardPage>
  );
}
