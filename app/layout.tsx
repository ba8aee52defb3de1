import { NavLink, Outlet, useNavigate } from 'react-router-dom';
import { useState } from 'react';
import { LogOut, Menu, X } from 'lucide-react';
import { may } from '../shared/schemas/auth';
import { Button } from './components/ui/button';
import { useMe, useSetDisplayUnit, useSignOut } from './features/auth/api';
import { useShopSettings } from './features/settings/api';

const navClass = ({ isActive }: { isActive: boolean }) =>
  `inline-flex min-h-10 items-center rounded px-3 font-semibold max-md:min-h-11 ${isActive ? 'bg-accent-700 text-white' : 'text-slate-800 hover:bg-slate-200'}`;

export function Layout() {
  const me = useMe();
  const settings = useShopSettings();
  const signOut = useSignOut();
  const setUnit = useSetDisplayUnit();
  const navigate = useNavigate();
  const [menuOpen, setMenuOpen] = useState(false);
  const user = me.data;
  if (!user) return null;
  const unit = user.displayUnit ?? settings.data?.defaultUnit ?? 'in';
  return (
    <div className="flex min-h-screen flex-col">
      <a href="#main" className="sr-only focus:not-sr-only">Skip to content</a>
      <header className="border-b border-slate-300 bg-white">
        {/* On a phone the header is one row (name, who is signed in, a menu button) and the rest opens
            under the menu button, so a page's own content starts near the top of the screen. */}
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-3 px-4 pt-2 max-md:pb-2">
          <NavLink to="/" className="flex items-center gap-2 text-xl font-semibold text-accent-800 md:mr-3">
            <img src="/favicon.svg" alt="" className="h-7 w-7" /> Gridset
          </NavLink>
          <span className="text-slate-600 max-md:hidden">{settings.data?.shopName ?? ''}</span>
          <span className="ml-auto min-w-0 text-slate-700 max-md:max-w-[7.5rem] max-md:truncate max-md:text-sm" data-testid="signed-in-user" title={`${user.name} · ${user.role}`}>
            <span className="font-semibold">{user.name}</span><span className="max-md:sr-only"> · {user.role}</span>
          </span>
          <button type="button" aria-expanded={menuOpen} aria-controls="site-menu" onClick={() => setMenuOpen((o) => !o)}
            className="inline-flex min-h-11 items-center gap-2 rounded border border-slate-400 px-3 font-semibold text-slate-800 md:hidden">
            {menuOpen ? <X aria-hidden className="h-5 w-5" /> : <Menu aria-hidden className="h-5 w-5" />} Menu
          </button>
          <div className={`${menuOpen ? 'flex' : 'hidden'} w-full flex-wrap items-center gap-3 md:flex md:w-auto`}>
            <div role="group" aria-label="Display unit" className="flex overflow-hidden rounded border border-slate-400">
              {(['in', 'mm'] as const).map((u) => (
                <button key={u} type="button" aria-pressed={unit === u} onClick={() => setUnit.mutate(u)}
                  className={`min-h-10 px-3 font-mono font-semibold max-md:min-h-11 ${unit === u ? 'bg-accent-700 text-white' : 'bg-white text-slate-800 hover:bg-slate-100'}`}>
                  {u}
                </button>
              ))}
            </div>
            <Button variant="secondary" onClick={() => signOut.mutate(undefined, { onSuccess: () => navigate('/sign-in') })}>
              <LogOut aria-hidden className="h-4 w-4" /> Sign out
            </Button>
          </div>
        </div>
        {/* A followed link closes the phone menu (the click bubbles here from the link). */}
        <nav id="site-menu" aria-label="Main" onClick={(e) => { if ((e.target as HTMLElement).closest('a')) setMenuOpen(false); }}
          className={`${menuOpen ? 'flex' : 'hidden'} mx-auto max-w-7xl flex-wrap items-center gap-1 px-4 py-2 max-md:flex-col max-md:items-stretch md:flex`}>
          <NavLink to="/templates" className={navClass}>Templates</NavLink>
          <NavLink to="/jobs" className={navClass}>Jobs</NavLink>
          <NavLink to="/reviews" className={navClass}>Reviews</NavLink>
          <NavLink to="/stock-check" className={navClass}>Stock check</NavLink>
          <NavLink to="/catalog/components" className={navClass}>Components</NavLink>
          <NavLink to="/catalog/plates" className={navClass}>Plates</NavLink>
          <NavLink to="/naming" className={navClass}>Naming</NavLink>
          {may(user.role, 'editSettings') || may(user.role, 'manageUsers') ? <span aria-hidden className="mx-2 h-6 w-px bg-slate-300 max-md:mx-0 max-md:my-1 max-md:h-px max-md:w-full" /> : null}
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
