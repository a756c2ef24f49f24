/**
 * The house rule of quantbid's source: which folder of src/ may import which, written once. The
 * checker (importGraph.ts) reads every import of src/**\/*.ts and test/architecture/imports.test.ts
 * fails `npm test` on any import this table does not allow, on a cycle between folders, and on file,
 * path, process or thread access in a domain folder. DEVELOPERS.md shows the same table.
 *
 * A folder is a top-level folder of src/ (src/plan/warehouse belongs to `plan`); `types` is src/types.ts and
 * `index` is src/index.ts, the library entry. A folder may always import its own files.
 */
export type Layer =
  | 'errors'
  | 'types'
  | 'market'
  | 'battery'
  | 'stats'
  | 'economics'
  | 'forecast'
  | 'plan'
  | 'settle'
  | 'scenarios'
  | 'curves'
  | 'backtest'
  | 'sizing'
  | 'io'
  | 'grid'
  | 'report'
  | 'app'
  | 'cli'
  | 'index';

/** The domain: pure and synchronous; no files, no paths, no process, no threads, no clock. */
export const DOMAIN: readonly Layer[] = ['market', 'battery', 'stats', 'economics', 'forecast', 'plan', 'settle', 'scenarios', 'curves', 'backtest', 'sizing'];

const domainAnd = (...more: Layer[]): Layer[] => ['types', ...DOMAIN, 'errors', ...more];

/** Layer -> the layers it may import. */
export const MAY_IMPORT: Readonly<Record<Layer, readonly Layer[]>> = {
  errors: [],
  types: ['market', 'battery'],
  market: ['errors'],
  battery: ['errors'],
  stats: ['errors'],
  economics: ['stats', 'errors'],
  forecast: ['types', 'market', 'stats', 'errors'],
  plan: ['types', 'market', 'battery', 'forecast', 'errors'],
  settle: ['types', 'market', 'battery', 'errors'],
  scenarios: ['types', 'market', 'battery', 'forecast', 'settle', 'stats', 'errors'],
  curves: ['types', 'market', 'battery', 'plan', 'settle', 'scenarios', 'stats', 'errors'],
  backtest: ['types', 'market', 'battery', 'forecast', 'plan', 'settle', 'scenarios', 'curves', 'stats', 'errors'],
  sizing: ['types', 'market', 'battery', 'plan', 'settle', 'scenarios', 'curves', 'backtest', 'economics', 'stats', 'errors'],
  io: domainAnd(),
  grid: ['io', 'errors'],
  report: domainAnd('io'),
  app: domainAnd('io', 'grid', 'report'),
  cli: ['app', 'errors'],
  index: domainAnd('io', 'grid', 'report', 'app'),
};

/**
 * Packages the domain may use besides its own folders: validation, time zones, the LP solver, hashing,
 * and node:module's createRequire, with which plan/lpSolver.ts loads the LP solver (its CommonJS build,
 * synchronously) on the first LP instead of at start-up: a plan seldom needs it.
 */
export const DOMAIN_PACKAGES: readonly string[] = ['zod', 'luxon', 'javascript-lp-solver', 'node:crypto', 'node:module'];

/**
 * Packages loaded only when a run needs them, by `await import(...)`, and only from these folders:
 * HiGHS, the LP solver of the curve program, is loaded by app/solver/highsSolver.ts for the curve
 * and auto policies alone (README: the solver dependency and why); every other command never pays
 * its start-up.
 */
export const LAZY_PACKAGES: Readonly<Record<string, readonly Layer[]>> = { highs: ['app'] };
