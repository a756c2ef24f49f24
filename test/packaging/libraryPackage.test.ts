import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { beforeAll, describe, expect, it } from 'vitest';
import { batteryModel } from '../../src/battery/batterySpec.js';
import { readQuantileForecast } from '../../src/io/readQuantileForecast.js';
import { readScenario } from '../../src/io/readScenario.js';
import { readBatterySpec, readMarketSpec } from '../../src/io/readSpecs.js';
import { planDay } from '../../src/plan/planDay.js';
import { checkBuild } from '../distBuild.js';

// quantbid as another project uses it: the package packed (`npm pack`), its tarball installed into a
// fresh project (offline, from the npm cache that `npm ci` filled, the dependencies pinned as in our
// lock file), and the README's library example run there, importing `quantbid` by name. Its output is
// compared with the same plan made by the sources here; a TypeScript file importing the package is
// type-checked against the declarations the package ships.

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const npm = (args: readonly string[], cwd: string): string => execFileSync('npm', [...args], { cwd, encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] });

/** The README's library example: the first ```js block of its Library section. */
function readmeExample(readme: string): string {
  const section = readme.slice(readme.indexOf('\n## Library'));
  const block = /```js\n([\s\S]*?)```/.exec(section);
  if (block === null) throw new Error('README.md: no ```js block in the Library section');
  return block[1] as string;
}

/** A project with quantbid's dependencies at the versions of our lock file, installable offline. */
function freshProject(dir: string): void {
  const lock = JSON.parse(readFileSync(join(ROOT, 'package-lock.json'), 'utf8')) as { packages: Record<string, { version: string; integrity: string }> };
  const pkg = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as { dependencies: Record<string, string> };
  const dependencies: Record<string, string> = {};
  const packages: Record<string, unknown> = {};
  for (const name of Object.keys(pkg.dependencies)) {
    const locked = lock.packages[`node_modules/${name}`];
    if (locked === undefined) throw new Error(`package-lock.json has no ${name}`);
    dependencies[name] = locked.version;
    packages[`node_modules/${name}`] = { version: locked.version, resolved: `https://registry.npmjs.org/${name}/-/${name}-${locked.version}.tgz`, integrity: locked.integrity };
  }
  writeFileSync(join(dir, 'package.json'), JSON.stringify({ name: 'uses-quantbid', private: true, type: 'module', dependencies }, null, 2));
  writeFileSync(join(dir, 'package-lock.json'), JSON.stringify({ name: 'uses-quantbid', lockfileVersion: 3, requires: true, packages: { '': { name: 'uses-quantbid', dependencies }, ...packages } }, null, 2));
}

describe('the packed library', () => {
  let project = '';
  let installed = '';

  beforeAll(() => {
    checkBuild();
    const dir = mkdtempSync(join(tmpdir(), 'quantbid-pack-'));
    const tarball = npm(['pack', '--ignore-scripts', '--silent', '--pack-destination', dir], ROOT).trim().split('\n').pop() as string;
    project = join(dir, 'project');
    mkdirSync(project);
    freshProject(project);
    npm(['ci', '--offline', '--no-audit', '--no-fund', '--ignore-scripts'], project);
    npm(['install', '--offline', '--no-audit', '--no-fund', '--ignore-scripts', join(dir, tarball)], project);
    installed = join(project, 'node_modules', 'quantbid');
  }, 240_000);

  it('runs the README example, importing quantbid by name, with the plan the sources make', () => {
    const example = join(project, 'example.mjs');
    writeFileSync(example, readmeExample(readFileSync(join(ROOT, 'README.md'), 'utf8')));
    // The example names the shipped scenario relative to the working folder: the package's own folder.
    const output = execFileSync(process.execPath, [example], { cwd: installed, encoding: 'utf8' });

    const scenario = readScenario(join(ROOT, 'scenarios/halvorn/scenario.json'));
    const market = readMarketSpec(scenario.market as string);
    const battery = batteryModel(readBatterySpec(scenario.battery as string));
    const forecast = readQuantileForecast(scenario.forecast as string, market).days.get(scenario.demoDay as string);
    if (forecast === undefined) throw new Error('the scenario has no forecast for its demo day');
    const plan = planDay({ forecast, market, battery, policy: 'quantile', alpha: 0.1, socStartMwh: battery.socInitialMwh });
    if (plan.status !== 'optimal') throw new Error(plan.reason);
    const expected = [
      ...plan.orders.map((order) => `${order.periodStart} ${order.side} ${order.quantityMw.toFixed(3)} MW at ${order.limitPrice.toFixed(2)}`),
      `value at the policy's prices: ${plan.outcome.objective.toFixed(2)} ${market.currency}`,
    ];
    expect(plan.orders.length).toBeGreaterThan(0);
    expect(output.trimEnd().split('\n')).toEqual(expected);
  });

  it('ships the type declarations its exports name: TypeScript checks a typed use of the package', () => {
    writeFileSync(
      join(project, 'typed.ts'),
      [
        "import { planDay, readMarketSpec, type PlanResult, type MarketSpec, InputError } from 'quantbid';",
        "const market: MarketSpec = readMarketSpec('market.json');",
        'const check: (r: PlanResult) => boolean = (r) => r.status === \'optimal\';',
        'export const used = [market.currency, check, planDay, InputError];',
      ].join('\n'),
    );
    writeFileSync(join(project, 'tsconfig.json'), JSON.stringify({ compilerOptions: { module: 'nodenext', moduleResolution: 'nodenext', target: 'es2022', strict: true, noEmit: true, skipLibCheck: false, types: [] }, files: ['typed.ts'] }));
    const tsc = join(ROOT, 'node_modules', 'typescript', 'bin', 'tsc');
    expect(() => execFileSync(process.execPath, [tsc, '-p', project], { cwd: project, encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] })).not.toThrow();
  });
});
