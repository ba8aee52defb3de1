import { createBrowserRouter, Navigate, Outlet, useLocation } from 'react-router-dom';
import type { Role } from '../shared/schemas/auth';
import { CAN } from '../shared/schemas/auth';
import { useMe } from './features/auth/api';
import { Layout } from './layout';
import { SignInRoute } from './routes/sign-in';
import { HomeRoute } from './routes/home';
import { PlatesRoute } from './routes/plates';
import { PlateEditRoute } from './routes/plate-edit';
import { ComponentsRoute } from './routes/components';
import { ComponentEditRoute } from './routes/component-edit';
import { UsersRoute } from './routes/users';
import { SettingsRoute } from './routes/settings';
import { NotFoundRoute } from './routes/not-found';
import { TemplatesRoute } from './routes/templates';
import { NamingRoute } from './routes/naming';
import { AuditRoute } from './routes/audit';
import { ReviewsRoute } from './routes/reviews';
import { TemplateCompareRoute } from './routes/template-compare';
import { TemplateVersionRoute } from './routes/template-version';
import { JobsRoute } from './routes/jobs';
import { JobRoute } from './routes/job';
import { StockCheckRoute } from './routes/stock-check';
import { OutboxRoute } from './routes/outbox';
import { SetPasswordRoute } from './routes/set-password';
import { ForgotPasswordRoute } from './routes/forgot-password';

function RequireSignIn() {
  const me = useMe();
  const location = useLocation();
  if (me.isPending) return <p className="p-6">Loading…</p>;
  if (!me.data) return <Navigate to="/sign-in" replace state={{ from: location.pathname + location.search }} />;
  return <Outlet />;
}

function RequireRole({ roles }: { roles: readonly Role[] }) {
  const me = useMe();
  if (!me.data || !roles.includes(me.data.role)) return <main className="p-6"><h1 className="text-2xl font-semibold">Not for your role</h1><p>This page is for {roles.join(' or ')}.</p></main>;
  return <Outlet />;
}

export const router = createBrowserRouter([
  { path: '/sign-in', element: <SignInRoute /> },
  // Reached from a mailed link or the sign-in page, so outside the signed-in layout.
  { path: '/set-password', element: <SetPasswordRoute /> },
  { path: '/forgot-password', element: <ForgotPasswordRoute /> },
  {
    element: <RequireSignIn />,
    children: [
      {
        element: <Layout />,
        children: [
          { index: true, element: <HomeRoute /> },
          { path: 'templates', element: <TemplatesRoute /> },
          { path: 'jobs', element: <JobsRoute /> },
          { path: 'jobs/:id', element: <JobRoute /> },
          { path: 'templates/:id/versions/:n', element: <TemplateVersionRoute /> },
          { path: 'stock-check', element: <StockCheckRoute /> },
          { path: 'templates/:id/compare', element: <TemplateCompareRoute /> },
          { path: 'naming', element: <NamingRoute /> },
          { path: 'reviews', element: <ReviewsRoute /> },
          { path: 'catalog/plates', element: <PlatesRoute /> },
          { path: 'catalog/plates/:id', element: <PlateEditRoute /> },
          { path: 'catalog/components', element: <ComponentsRoute /> },
          { path: 'catalog/components/:id', element: <ComponentEditRoute /> },
          { element: <RequireRole roles={CAN.manageUsers} />, children: [{ path: 'admin/users', element: <UsersRoute /> }] },
          { element: <RequireRole roles={CAN.readOutbox} />, children: [{ path: 'admin/outbox', element: <OutboxRoute /> }] },
          { element: <RequireRole roles={CAN.editSettings} />, children: [{ path: 'settings', element: <SettingsRoute /> }, { path: 'audit', element: <AuditRoute /> }] },
          { path: '*', element: <NotFoundRoute /> },
        ],
      },
    ],
  },
]);
