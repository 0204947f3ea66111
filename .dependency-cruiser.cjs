// Import rules of Placewright, checked by `npm test` (scripts/test.sh):
//   npx depcruise --validate .dependency-cruiser.cjs shared server src
// The layers are described in shared/README.md.

/** The engine's modules: folders of shared/ with an index.ts that is their only door. */
const ENGINE_MODULES = '(core|geometry|centroid|panel|fiducials|library|placement-list|verify|pipeline|engine|canvas|review|csv-safety|password-strength)';

module.exports = {
  forbidden: [
    {
      name: 'no-import-loop',
      comment: 'No file imports itself through others. TypeORM entity relations (server/db/entities) are the one allowed exception.',
      severity: 'error',
      from: { pathNot: '^server/db/entities/' },
      to: { circular: true },
    },
    {
      name: 'shared-no-framework',
      comment: 'shared/ also runs in the browser and in worker threads: no React, Konva, Express, TypeORM or node: modules.',
      severity: 'error',
      from: { path: '^shared/' },
      to: {
        dependencyTypes: ['core'],
      },
    },
    {
      name: 'shared-no-framework-packages',
      comment: 'shared/ imports no UI, HTTP or database framework.',
      severity: 'error',
      from: { path: '^shared/' },
      to: { path: 'node_modules/(@types/)?(react|react-dom|konva|react-konva|express|express-session|typeorm|pg|@tanstack/[^/]+)/' },
    },
    {
      name: 'shared-not-server-or-client',
      comment: 'The engine does not know the server or the client.',
      severity: 'error',
      from: { path: '^shared/' },
      to: { path: '^(server|src)/' },
    },
    {
      name: 'client-not-server',
      comment: 'The client talks to the server over HTTP only.',
      severity: 'error',
      from: { path: '^src/' },
      to: { path: '^server/' },
    },
    {
      name: 'engine-barrel-only-inside-shared',
      comment: 'One engine module uses another through its index.ts, never a file inside it.',
      severity: 'error',
      from: { path: '^shared/([^/]+)/' },
      to: { path: `^shared/${ENGINE_MODULES}/`, pathNot: ['^shared/$1/', '^shared/[^/]+/index\\.ts$'] },
    },
    {
      name: 'engine-barrel-only-outside-shared',
      comment: 'The server and the client use an engine module through its index.ts, never a file inside it.',
      severity: 'error',
      from: { pathNot: '^shared/' },
      to: { path: `^shared/${ENGINE_MODULES}/`, pathNot: '^shared/[^/]+/index\\.ts$' },
    },
  ],
  options: {
    doNotFollow: { path: 'node_modules' },
    exclude: { path: '(^|/)dist/' },
    tsPreCompilationDeps: true,
    tsConfig: { fileName: 'tsconfig.json' },
    enhancedResolveOptions: { extensions: ['.ts', '.tsx', '.js', '.mjs', '.cjs', '.json'] },
  },
};
