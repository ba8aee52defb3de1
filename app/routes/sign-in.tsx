import { Link, Navigate, useLocation, useNavigate } from 'react-router-dom';
import { SignInForm } from '../features/auth/components/sign-in-form';
import { useMe } from '../features/auth/api';

export function SignInRoute() {
  const me = useMe();
  const navigate = useNavigate();
  const from = (useLocation().state as { from?: string } | null)?.from ?? '/';
  if (me.data) return <Navigate to={from} replace />;
  return (
    <main className="flex min-h-screen items-center justify-center bg-slate-100 p-4">
      <div className="w-full max-w-md rounded border border-slate-300 bg-white p-6">
        <div className="mb-6 flex items-center gap-3">
          <img src="/favicon.svg" alt="" className="h-10 w-10" />
          <div>
            <h1 className="text-2xl font-semibold">Sign in to Gridset</h1>
            <p className="text-slate-600">Fixture templates, station offsets and stock checks.</p>
          </div>
        </div>
        <SignInForm onSignedIn={() => navigate(from, { replace: true })} />
        <p className="mt-4"><Link to="/forgot-password" className="text-accent-700 underline">Forgot your password?</Link></p>
      </div>
    </main>
  );
}
