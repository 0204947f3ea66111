import { lazy, Suspense, type ReactNode } from 'react';
import { createBrowserRouter, Navigate, RouterProvider, useLocation } from 'react-router-dom';
import type { Role } from '../../shared/schemas/auth.schema';
import { ErrorPanel, ProgressBar } from '../components/ui/misc';
import { useMe } from '../features/auth/api/get-me';
import { AppShell } from './layouts/app-shell';
import { SignInRoute } from './routes/sign-in';
import { libraryRoute } from './routes/library/routes';

const HomeRoute = lazy(() => import('./routes/home'));
const AccountRoute = lazy(() => import('./routes/account'));
const UsersRoute = lazy(() => import('./routes/admin/users'));
const AuditRoute = lazy(() => import('./routes/admin/audit'));
const OutboxRoute = lazy(() => import('./routes/admin/outbox'));
const CanvasPreviewRoute = lazy(() => import('./routes/canvas-preview'));
const NotFoundRoute = lazy(() => import('./routes/not-found'));
const RunFilesRoute = lazy(() => import('./routes/run-files/index'));
const SetupSheetRoute = lazy(() => import('./routes/run-files/setup-sheet'));
const TokensRoute = lazy(() => import('./routes/tokens'));
const ProgramsRoute = lazy(() => import('./routes/programs/list'));
const ProgramRoute = lazy(() => import('./routes/programs/program'));
const WorkspaceRoute = lazy(() => import('./routes/programs/workspace'));
const ImportStage = lazy(() => import('./routes/programs/stages/import'));
const PanelizeStage = lazy(() => import('./routes/programs/stages/panelize'));
const AlignStage = lazy(() => import('./routes/programs/stages/align'));
const AssignStage = lazy(() => import('./routes/programs/stages/assign'));
const VerifyStage = lazy(() => import('./routes/programs/stages/verify'));
const ReleaseStage = lazy(() => import('./routes/programs/stages/release'));

function Loading() {
  return (
    <div className="mx-auto mt-24 w-64">
      <ProgressBar label="Loading" />
    </div>
  );
}

/** Signed-in area: the shell with navigation; anyone else goes to sign-in and comes back. */
function Protected() {
  const me = useMe();
  const location = useLocation();
  if (me.isPending) return <Loading />;
  if (me.isError) return <div className="p-8"><ErrorPanel error={me.error} /></div>;
  if (!me.data) return <Navigate to={`/sign-in?next=${encodeURIComponent(location.pathname + location.search)}`} replace />;
  return <AppShell user={me.data.user} />;
}

export function RequireRole({ roles, children }: { roles: Role[]; children: ReactNode }) {
  const me = useMe();
  const userRoles = me.data?.user.roles ?? [];
  if (!userRoles.includes('admin') && !roles.some((r) => userRoles.includes(r))) {
    return (
      <div className="max-w-lg">
        <h1 className="text-lg font-semibold">Not for your roles</h1>
        <p className="mt-2 text-sm text-ink-600">This page needs the {roles.join(' or ')} role. Ask an admin if you need it.</p>
      </div>
    );
  }
  return <>{children}</>;
}

const page = (node: ReactNode) => <Suspense fallback={<Loading />}>{node}</Suspense>;

export const routes = [
  { path: '/sign-in', element: <SignInRoute /> },
  {
    path: '/',
    element: <Protected />,
    children: [
      { index: true, element: page(<HomeRoute />) },
      { path: 'account', element: page(<AccountRoute />) },
      { path: 'admin/users', element: page(<RequireRole roles={['admin']}><UsersRoute /></RequireRole>) },
      { path: 'admin/audit', element: page(<RequireRole roles={['admin']}><AuditRoute /></RequireRole>) },
      { path: 'admin/outbox', element: page(<RequireRole roles={['admin']}><OutboxRoute /></RequireRole>) },
      { path: 'panel-preview', element: page(<RequireRole roles={['engineer']}><CanvasPreviewRoute /></RequireRole>) },
      { path: 'run-files', element: page(<RequireRole roles={['operator', 'engineer']}><RunFilesRoute /></RequireRole>) },
      { path: 'run-files/:revisionId/setup-sheet', element: page(<RequireRole roles={['operator', 'engineer']}><SetupSheetRoute /></RequireRole>) },
      { path: 'tokens', element: page(<RequireRole roles={['engineer']}><TokensRoute /></RequireRole>) },
      { path: 'programs', element: page(<RequireRole roles={['engineer']}><ProgramsRoute /></RequireRole>) },
      { path: 'programs/:programId', element: page(<RequireRole roles={['engineer']}><ProgramRoute /></RequireRole>) },
      {
        path: 'programs/revisions/:revisionId',
        element: page(<RequireRole roles={['engineer']}><WorkspaceRoute /></RequireRole>),
        children: [
          { index: true, element: <Navigate to="import" replace /> },
          { path: 'import', element: page(<ImportStage />) },
          { path: 'panelize', element: page(<PanelizeStage />) },
          { path: 'align', element: page(<AlignStage />) },
          { path: 'assign', element: page(<AssignStage />) },
          { path: 'verify', element: page(<VerifyStage />) },
          { path: 'release', element: page(<ReleaseStage />) },
        ],
      },
      // Operators are not offered the library: their run files and set-up sheets carry what they need.
      { ...libraryRoute, element: <RequireRole roles={['engineer', 'librarian']}>{libraryRoute.element}</RequireRole> },
      { path: '*', element: page(<NotFoundRoute />) },
    ],
  },
];

const router = createBrowserRouter(routes);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
