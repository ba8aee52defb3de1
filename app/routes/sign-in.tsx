import { Link, Navigate, useLocation, useNavigate } from 'react-router-dom';
import { CardPage } from '../components/ui/card-page';
import { SignInForm } from '../features/auth/components/sign-in-form';
import { useMe } from '../features/auth/api';

export function SignInRoute() {
  const me = useMe();
  const navigate = useNavigate();
  const from = (useLocation().state as { from?: string } | null)?.from ?? '/';
  if (me.data) return <Navigate to={from} replace />;
  return (
    <CardPage title="Sign in to Gridset" subtitle="Fixture templates, station offsets and stock checks.">
      <SignInForm onSignedIn={() => navigate(from, { replace: true })} />
      <p className="mt-4"><Link to="/forgot-password" className="text-accent-700 underline">Forgot your password?</Link></p>
    </CardPage>
  );
}
