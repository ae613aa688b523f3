// The layering of Cellwright, checked on every `npm test` (scripts/check-layers.mjs):
// shared/ is pure and imports nothing of the server or the client; client features compose only
// through the pages in src/app; routers do HTTP and validation and leave the database to their
// services. Paths are matched without extensions (the check reads a JavaScript copy of the sources).
/** @type {import('dependency-cruiser').IConfiguration} */
module.exports = {
  forbidden: [
    {
      name: 'shared-is-pure',
      comment: 'shared/ is imported by both sides: it imports nothing of server/ or src/',
      severity: 'error',
      from: { path: '^shared/' },
      to: { path: '^(server|src)/' },
    },
    {
      name: 'shared-has-no-platform',
      comment: 'shared/ runs in the browser and on the server: no Node built-ins',
      severity: 'error',
      from: { path: '^shared/' },
      to: {
        dependencyTypes: ['core'],
      },
    },
    {
      name: 'shared-has-no-framework',
      comment: 'shared/ runs in the browser and on the server: no Express, no React, no database',
      severity: 'error',
      from: { path: '^shared/' },
      to: { path: 'node_modules/(express|react|react-dom|react-router-dom|@tanstack|better-sqlite3|drizzle-orm|multer|pino)(/|$)' },
    },
    {
      name: 'features-do-not-import-features',
      comment: 'a client feature does not import another feature; pages in src/app compose them',
      severity: 'error',
      from: { path: '^src/features/([^/]+)/' },
      to: { path: '^src/features/', pathNot: '^src/features/$1/' },
    },
    {
      name: 'client-does-not-import-pages',
      comment: 'features, components and lib do not reach up into the pages of src/app',
      severity: 'error',
      from: { path: '^src/(features|components|lib)/' },
      to: { path: '^src/app/' },
    },
    {
      name: 'client-and-server-apart',
      comment: 'the client and the server meet only in shared/',
      severity: 'error',
      from: { path: '^src/' },
      to: { path: '^server/' },
    },
    {
      name: 'server-without-client',
      comment: 'the client and the server meet only in shared/',
      severity: 'error',
      from: { path: '^server/' },
      to: { path: '^src/' },
    },
    {
      name: 'routers-do-not-touch-the-database',
      comment: 'a router does HTTP and validation; queries live in its feature service',
      severity: 'error',
      from: { path: '^server/[^/]+/router[.](ts|js)$' },
      to: { path: '^server/db/' },
    },
    {
      name: 'no-import-circles',
      comment: 'two modules that import each other cannot be read or changed one at a time',
      severity: 'error',
      from: {},
      to: { circular: true },
    },
  ],
  options: {
    doNotFollow: { path: 'node_modules' },
  },
};
