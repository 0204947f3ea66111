import { lazy, Suspense, type ReactNode } from 'react';
import { createBrowserRouter, Navigate, RouterProvider, useLocation, type LoaderFunctionArgs } from 'react-router-dom';
import type { Role } from '../../shared/schemas/auth.schema';
import { ErrorPanel, ProgressBar } from '../components/ui/misc';
import { meQueryOptions, useMe } from '../features/auth/api/get-me';
import { appQueryClient } from '../lib/query-client';
import { hasSessionHint } from '../lib/session-hint';
import { AppShell } from './layouts/app-shell';
import { SignInRoute } from './routes/sign-in';
import { libraryRoute } from './routes/library/routes';

// Each page's chunk, as a function: the route's loader starts it together with the data the page
// needs, so a page does not wait for its parent's chunk, then its data, then its own chunk.
const chunks = {
  home: () => import('./routes/home'),
  account: () => import('./routes/account'),
  users: () => import('./routes/admin/users'),
  audit: () => import('./routes/admin/audit'),
  outbox: () => import('./routes/admin/outbox'),
  canvasPreview: () => import('./routes/canvas-preview'),
  notFound: () => import('./routes/not-found'),
  runFiles: () => import('./routes/run-files/index'),
  setupSheet: () => import('./routes/run-files/setup-sheet'),
  tokens: () => import('./routes/tokens'),
  programs: () => import('./routes/programs/list'),
  program: () => import('./routes/programs/program'),
  workspace: () => import('./routes/programs/workspace'),
  import: () => import('./routes/programs/stages/import'),
  panelize: () => import('./routes/programs/stages/panelize'),
  align: () => import('./routes/programs/stages/align'),
  assign: () => import('./routes/programs/stages/assign'),
  verify: () => import('./routes/programs/stages/verify'),
  release: () => import('./routes/programs/stages/release'),
};
type Chunk = keyof typeof chunks;

const HomeRoute = lazy(chunks.home);
const AccountRoute = lazy(chunks.account);
const UsersRoute = lazy(chunks.users);
const AuditRoute = lazy(chunks.audit);
const OutboxRoute = lazy(chunks.outbox);
const CanvasPreviewRoute = lazy(chunks.canvasPreview);
const NotFoundRoute = lazy(chunks.notFound);
const RunFilesRoute = lazy(chunks.runFiles);
const SetupSheetRoute = lazy(chunks.setupSheet);
const TokensRoute = lazy(chunks.tokens);
const ProgramsRoute = lazy(chunks.programs);
const ProgramRoute = lazy(chunks.program);
const WorkspaceRoute = lazy(chunks.workspace);
const ImportStage = lazy(chunks.import);
const PanelizeStage = lazy(chunks.panelize);
const AlignStage = lazy(chunks.align);
const AssignStage = lazy(chunks.assign);
const VerifyStage = lazy(chunks.verify);
const ReleaseStage = lazy(chunks.release);

/**
 * A loader that only starts the page's chunk (a failed start shows when the page renders). A
 * browser not signed in when last seen is on its way to the sign-in form: its pages' chunks would
 * only compete with that form for the network and the main thread, so they load after sign-in.
 */
const preload = (...names: Chunk[]) => () => {
  if (!hasSessionHint()) return null;
  for (const n of names) void chunks[n]().catch(() => {});
  return null;
};

/**
 * The workspace's loader: its chunk and the stage's, the revision, and (once the revision is
 * known) the engine run of each side the stage draws — all at once instead of one after another.
 */
function workspaceLoader({ params, request }: LoaderFunctionArgs) {
  const stage = new URL(request.url).pathname.split('/').pop() as Chunk;
  preload('workspace', ...(STAGE_CHUNKS.includes(stage) ? [stage] : []))();
  const id = params.revisionId;
  if (!id || !hasSessionHint()) return null;
  // the programs API comes in with the workspace's chunk (kept out of the first page's bundle)
  void import('../features/programs/api/programs')
    .then(async ({ revisionQueryOptions, runQueryOptions }) => {
      const r = await appQueryClient.fetchQuery(revisionQueryOptions(id));
      if (!['align', 'assign', 'verify'].includes(stage) || !r.imported || !r.settings.board || !r.settings.panel) return;
      const sides = r.imported.bottom > 0 && stage !== 'assign' ? (['top', 'bottom'] as const) : (['top'] as const);
      for (const side of sides) void appQueryClient.prefetchQuery(runQueryOptions(id, side, r.version));
    })
    .catch(() => {});
  return null;
}
const STAGE_CHUNKS: Chunk[] = ['import', 'panelize', 'align', 'assign', 'verify', 'release'];

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
  // Not signed in when last seen here: the sign-in form at once (it moves on if /api/me says otherwise).
  if (me.isPending && !hasSessionHint()) return <Navigate to={`/sign-in?next=${encodeURIComponent(location.pathname + location.search)}`} replace />;
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
    loader: () => {
      if (hasSessionHint()) void appQueryClient.prefetchQuery(meQueryOptions());
      return null;
    },
    children: [
      { index: true, loader: preload('home'), element: page(<HomeRoute />) },
      { path: 'account', loader: preload('account'), element: page(<AccountRoute />) },
      { path: 'admin/users', loader: preload('users'), element: page(<RequireRole roles={['admin']}><UsersRoute /></RequireRole>) },
      { path: 'admin/audit', loader: preload('audit'), element: page(<RequireRole roles={['admin']}><AuditRoute /></RequireRole>) },
      { path: 'admin/outbox', loader: preload('outbox'), element: page(<RequireRole roles={['admin']}><OutboxRoute /></RequireRole>) },
      { path: 'panel-preview', loader: preload('canvasPreview'), element: page(<RequireRole roles={['engineer']}><CanvasPreviewRoute /></RequireRole>) },
      { path: 'run-files', loader: preload('runFiles'), element: page(<RequireRole roles={['operator', 'engineer']}><RunFilesRoute /></RequireRole>) },
      { path: 'run-files/:revisionId/setup-sheet', loader: preload('setupSheet'), element: page(<RequireRole roles={['operator', 'engineer']}><SetupSheetRoute /></RequireRole>) },
      { path: 'tokens', loader: preload('tokens'), element: page(<RequireRole roles={['engineer']}><TokensRoute /></RequireRole>) },
      { path: 'programs', loader: preload('programs'), element: page(<RequireRole roles={['engineer']}><ProgramsRoute /></RequireRole>) },
      { path: 'programs/:programId', loader: preload('program'), element: page(<RequireRole roles={['engineer']}><ProgramRoute /></RequireRole>) },
      {
        path: 'programs/revisions/:revisionId',
        loader: workspaceLoader,
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
      { path: '*', loader: preload('notFound'), element: page(<NotFoundRoute />) },
    ],
  },
];

const router = createBrowserRouter(routes);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
