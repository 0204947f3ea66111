import { lazy, Suspense, type ReactNode } from 'react';
import { Navigate, type RouteObject } from 'react-router-dom';
import { ProgressBar } from '../../../components/ui/misc';

const LibraryLayout = lazy(() => import('./layout'));
const PackagesRoute = lazy(() => import('./packages'));
const NewPackageRoute = lazy(() => import('./package-edit').then((m) => ({ default: m.NewPackageRoute })));
const EditPackageRoute = lazy(() => import('./package-edit').then((m) => ({ default: m.EditPackageRoute })));
const AliasesRoute = lazy(() => import('./catalog').then((m) => ({ default: m.AliasesRoute })));
const NozzlesRoute = lazy(() => import('./catalog').then((m) => ({ default: m.NozzlesRoute })));
const VisionPresetsRoute = lazy(() => import('./catalog').then((m) => ({ default: m.VisionPresetsRoute })));
const MachinesRoute = lazy(() => import('./catalog').then((m) => ({ default: m.MachinesRoute })));
const ProposalsRoute = lazy(() => import('./proposals'));
const UnmatchedRoute = lazy(() => import('./unmatched'));
const TransferRoute = lazy(() => import('./transfer'));

const page = (node: ReactNode) => <Suspense fallback={<div className="w-64"><ProgressBar label="Loading" /></div>}>{node}</Suspense>;

/** The Library section (engineers and librarians: the app's router guards it; what each may do is decided inside). */
export const libraryRoute: RouteObject = {
  path: 'library',
  element: page(<LibraryLayout />),
  children: [
    { index: true, element: <Navigate to="packages" replace /> },
    { path: 'packages', element: page(<PackagesRoute />) },
    { path: 'packages/new', element: page(<NewPackageRoute />) },
    { path: 'packages/:id', element: page(<EditPackageRoute />) },
    { path: 'aliases', element: page(<AliasesRoute />) },
    { path: 'nozzles', element: page(<NozzlesRoute />) },
    { path: 'vision-presets', element: page(<VisionPresetsRoute />) },
    { path: 'machines', element: page(<MachinesRoute />) },
    { path: 'proposals', element: page(<ProposalsRoute />) },
    { path: 'unmatched', element: page(<UnmatchedRoute />) },
    { path: 'transfer', element: page(<TransferRoute />) },
  ],
};
