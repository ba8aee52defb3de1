import { NavLink, Outlet, useNavigate } from 'react-router-dom';
import { LogOut } from 'lucide-react';
import { may } from '../shared/schemas/auth';
import { Button } from './components/ui/button';
import { useMe, useSetDisplayUnit, useSignOut } from './features/auth/api';
import { useShopSettings } from './features/settings/api';

const navClass = ({ isActive }: { isActive: boolean }) =>
  `inline-flex min-h-10 items-center rounded px-3 font-semibold ${isActive ? 'bg-accent-700 text-white' : 'text-slate-800 hover:bg-slate-200'}`;

export function Layout() {
  const me = useMe();
  const settings = useShopSettings();
  const signOut = useSignOut();
  const setUnit = useSetDisplayUnit();
  const navigate = useNavigate();
  const user = me.data;
  if (!user) return null;
  const unit = user.displayUnit ?? settings.data?.defaultUnit ?? 'in';
  return (
    <div className="flex min-h-screen flex-col">
      <a href="#main" className="sr-only focus:not-sr-only">Skip to content</a>
      <header className="border-b border-slate-300 bg-white">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-3 px-4 pt-2">
          <NavLink to="/" className="mr-3 flex items-center gap-2 text-xl font-semibold text-accent-800">
            <img src="/favicon.svg" alt="" className="h-7 w-7" /> Gridset
          </NavLink>
          <span className="text-slate-600">{settings.data?.shopName ?? ''}</span>
          <div className="ml-auto flex flex-wrap items-center gap-3">
            <div role="group" aria-label="Display unit" className="flex overflow-hidden rounded border border-slate-400">
              {(['in', 'mm'] as const).map((u) => (
                <button key={u} type="button" aria-pressed={unit === u} onClick={() => setUnit.mutate(u)}
                  className={`min-h-10 px-3 font-mono font-semibold ${unit === u ? 'bg-accent-700 text-white' : 'bg-white text-slate-800 hover:bg-slate-100'}`}>
                  {u}
                </button>
              ))}
            </div>
            <span className="text-slate-700" data-testid="signed-in-user">
              <span className="font-semibold">{user.name}</span> · <span>{user.role}</span>
            </span>
            <Button variant="secondary" onClick={() => signOut.mutate(undefined, { onSuccess: () => navigate('/sign-in') })}>
              <LogOut aria-hidden className="h-4 w-4" /> Sign out
            </Button>
          </div>
        </div>
        <nav aria-label="Main" className="mx-auto flex max-w-7xl flex-wrap items-center gap-1 px-4 py-2">
          <NavLink to="/templates" className={navClass}>Templates</NavLink>
          <NavLink to="/jobs" className={navClass}>Jobs</NavLink>
          <NavLink to="/reviews" className={navClass}>Reviews</NavLink>
          <NavLink to="/stock-check" className={navClass}>Stock check</NavLink>
          <NavLink to="/catalog/components" className={navClass}>Components</NavLink>
          <NavLink to="/catalog/plates" className={navClass}>Plates</NavLink>
          <NavLink to="/naming" className={navClass}>Naming</NavLink>
          {may(user.role, 'editSettings') || may(user.role, 'manageUsers') ? <span aria-hidden className="mx-2 h-6 w-px bg-slate-300" /> : null}
          {may(user.role, 'editSettings') ? <NavLink to="/settings" className={navClass}>Shop settings</NavLink> : null}
          {may(user.role, 'editSettings') ? <NavLink to="/audit" className={navClass}>Audit</NavLink> : null}
          {may(user.role, 'manageUsers') ? <NavLink to="/admin/users" className={navClass}>Users</NavLink> : null}
          {may(user.role, 'readOutbox') ? <NavLink to="/admin/outbox" className={navClass}>Outbox</NavLink> : null}
        </nav>
      </header>
      <div id="main" className="flex-1">
        <Outlet />
      </div>
      <footer className="border-t border-slate-300 bg-white px-4 py-2 text-sm text-slate-600 no-print">
        {settings.data?.shopName ?? ''} · Gridset gives fixturing advice; the operator checks every clamp before cycle start and follows the machine builder's instructions.
      </footer>
    </div>
  );
}
