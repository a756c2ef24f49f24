// Bundles the compiled CLI (dist/cli/main.js and every module it imports, at once or when a command
// runs) into dist/bundle/, for the launcher to start `quantbid plan` and `quantbid backtest` from: Node
// 20 spends about half a millisecond on each ES module it loads, and a plan loads a hundred of ours.
// The code is the compiled code, unchanged and unminified. Run by `npm run build` after tsc.
//
// Files, so that a plan loads five: main.js (the CLI's entry), start.js (every module main.js imports
// at once, commander included), planStart.js (what the plan's fast path imports at once:
// app/plan/planFastPath.ts checks the settings and the scenario and starts reading the forecast ahead
// before it loads the rest), planRunning.js (what planRun and the spec checks import, the zone
// library included, loaded while the forecast is read ahead), and the bundler's helpers; the other
// commands' modules in chunks of their own. commander and luxon are joined in (a package costs a
// lookup of its package.json and, for commander, the CommonJS loader, file by file); the other
// packages, and Node's own modules, are imported as they are. commander loads Node's child_process
// module at once, for commands that are programs of their own (quantbid has none): joined in, it
// loads it when it first starts one (about 2 ms of every start).
import { rmSync } from 'node:fs';
import { dirname, isAbsolute, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { rolldown } from 'rolldown';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const dist = join(root, 'dist');
const out = join(dist, 'bundle');
const entry = join(dist, 'cli', 'main.js');
const JOINED_PACKAGES = new Set(['commander', 'luxon']);

/** The modules `from` import at once, directly or through others, leaving out `known` (module ids). */
function staticClosure(context, from, known) {
  const found = new Set();
  const stack = [...from];
  while (stack.length > 0) {
    const id = stack.pop();
    if (found.has(id) || known.has(id)) continue;
    found.add(id);
    for (const next of context.getModuleInfo(id)?.importedIds ?? []) stack.push(next);
  }
  return found;
}

const groups = { start: new Set(), planStart: new Set(), planRunning: new Set() };
rmSync(out, { recursive: true, force: true });
const bundle = await rolldown({
  input: entry,
  platform: 'node',
  external: (id) => !id.startsWith('.') && !isAbsolute(id) && !JOINED_PACKAGES.has(id),
  logLevel: 'warn',
  // planUseCase imports planRun at once, the fast path when it runs: both are meant.
  onLog: (level, log, handler) => (log.code === 'INEFFECTIVE_DYNAMIC_IMPORT' ? undefined : handler(level, log)),
  plugins: [
    {
      name: 'commander-child-process-when-used',
      transform(code, id) {
        if (!/node_modules[\\/]commander[\\/]lib[\\/]command\.js$/.test(id)) return null;
        const atOnce = "const childProcess = require('node:child_process');";
        if (!code.includes(atOnce)) throw new Error(`bundlePlanCli: ${id} no longer holds ${atOnce}: look at how it loads child_process now`);
        return code.replace(atOnce, "const childProcess = { spawn: (...args) => require('node:child_process').spawn(...args) };");
      },
    },
    {
      name: 'plan-groups',
      buildEnd() {
        // The entry itself stays in main.js.
        groups.start = staticClosure(this, [entry], new Set());
        groups.start.delete(entry);
        groups.planStart = staticClosure(this, [join(dist, 'app', 'plan', 'planFastPath.js')], groups.start);
        const running = [join(dist, 'app', 'plan', 'planRun.js'), join(dist, 'app', 'checkedSpecFiles.js')];
        groups.planRunning = staticClosure(this, running, new Set([...groups.start, ...groups.planStart]));
        for (const [name, modules] of Object.entries(groups)) if (modules.size === 0) throw new Error(`bundlePlanCli: the group ${name} holds no module`);
      },
    },
  ],
});
await bundle.write({
  dir: out,
  format: 'esm',
  entryFileNames: 'main.js',
  chunkFileNames: '[name].js',
  // The groups are filled when the modules are known (buildEnd, which write() runs): looked up by name.
  codeSplitting: { groups: Object.keys(groups).map((name, i) => ({ name, test: (id) => groups[name].has(id), priority: 3 - i })) },
});
await bundle.close();
