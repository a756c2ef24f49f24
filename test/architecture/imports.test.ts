import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { checkImports, fileUses, folderCycles, layerOf, relativeTo, tableEdges } from './importGraph.js';

// The house rule (layers.ts) on the real sources, and the checker on small made-up sources that
// break it, so that a check which could not fail would show here.

const ROOT = fileURLToPath(new URL('../../', import.meta.url));

function sourcesUnder(dir: string): Map<string, string> {
  const files = new Map<string, string>();
  for (const entry of readdirSync(dir, { withFileTypes: true, recursive: true })) {
    if (entry.isFile() && entry.name.endsWith('.ts')) {
      const path = join(entry.parentPath, entry.name);
      files.set(relativeTo(ROOT, path), readFileSync(path, 'utf8'));
    }
  }
  return files;
}

describe('the import rule of src/', () => {
  const { violations, edges } = checkImports(sourcesUnder(join(ROOT, 'src')));

  it('holds for every import of every file', () => {
    expect(violations.map((v) => `${v.file}:${v.line}: ${v.message}`)).toEqual([]);
  });

  it('leaves no cycle between folders', () => {
    expect(folderCycles(edges)).toEqual([]);
  });

  it('allows no cycle in the table itself', () => {
    expect(folderCycles(tableEdges())).toEqual([]);
  });
});

describe('the checker', () => {
  it('finds every kind of import: static, re-export, type, dynamic, type import and a module loaded by URL', () => {
    const text = [
      "import { a } from './a.js';",
      "import type { B } from '../b.js';",
      "export { c } from './c.js';",
      "const d = await import('./d.js');",
      "type E = typeof import('./e.js');",
      "const task = new URL('../f.js', import.meta.url);",
      "const data = new URL('../../package.json', import.meta.url);",
      "// import { g } from './g.js';",
      "const text = \"from './h.js'\";",
    ].join('\n');
    expect(fileUses('src/plan/x.ts', text).imports.map((u) => [u.line, u.specifier])).toEqual([
      [1, './a.js'], [2, '../b.js'], [3, './c.js'], [4, './d.js'], [5, './e.js'], [6, '../f.js'],
    ]);
  });

  it('names the folder of a file, with src/types.ts and src/index.ts on their own', () => {
    expect([layerOf('src/plan/warehouse/pwl.ts'), layerOf('src/types.ts'), layerOf('src/index.ts'), layerOf('src/cli/main.ts'), layerOf('test/x.ts')]).toEqual(['plan', 'types', 'index', 'cli', null]);
  });

  it('fails on a deliberately bad import: the domain reaching into io, the cli and node:fs, and using process', () => {
    const bad = new Map([
      ['src/plan/badPlan.ts', "import { readFileSync } from 'node:fs';\nimport { main } from '../cli/main.js';\nimport { jsonText } from '../io/planOutputs.js';\nexport const cwd = process.cwd();\n"],
      ['src/io/badReader.ts', "import { runBacktestCommand } from '../app/backtest/backtest.js';\n"],
      ['src/cli/badCommand.ts', "import { planDay } from '../plan/planDay.js';\nimport { z } from 'zod';\n"],
    ]);
    const messages = checkImports(bad).violations.map((v) => `${v.file}:${v.line}: ${v.message.split(';')[0]}`);
    expect(messages).toEqual([
      'src/plan/badPlan.ts:1: plan is domain code and may not import the Node built-in node:fs',
      'src/plan/badPlan.ts:2: plan may not import cli (../cli/main.js)',
      'src/plan/badPlan.ts:3: plan may not import io (../io/planOutputs.js)',
      'src/plan/badPlan.ts:4: plan is domain code and may not use the global process (environment, clock, exit, signals): take it as a parameter',
      'src/io/badReader.ts:1: io may not import app (../app/backtest/backtest.js)',
      'src/cli/badCommand.ts:1: cli may not import plan (../plan/planDay.js)',
    ]);
  });

  it('allows what the table allows: the domain with zod and its own folders, process outside the domain', () => {
    const good = new Map([
      ['src/plan/goodPlan.ts', "import { z } from 'zod';\nimport type { DayProblem } from '../types.js';\nimport { priceAtLevel } from '../forecast/quantileSet.js';\nconst process = 1;\nexport const x = { process };\n"],
      ['src/app/goodUse.ts', "import { readFileSync } from 'node:fs';\nexport const cwd = process.cwd();\n"],
    ]);
    expect(checkImports(good).violations).toEqual([]);
  });

  it('lets only the app layer load HiGHS, and only by import() when it is needed', () => {
    const sources = new Map([
      ['src/curves/solverHere.ts', "const { default: load } = await import('highs');\nexport { load };\n"],
      ['src/app/solver/eager.ts', "import loadHighs from 'highs';\nexport { loadHighs };\n"],
      ['src/app/solver/lazy.ts', "import type { Highs } from 'highs';\nexport const load = async (): Promise<unknown> => (await import('highs')).default;\nexport type H = Highs;\n"],
    ]);
    const messages = checkImports(sources).violations.map((v) => `${v.file}:${v.line}: ${v.message.split(';')[0]}`);
    expect(messages).toEqual(['src/curves/solverHere.ts:1: curves may not load the package highs', 'src/app/solver/eager.ts:1: highs is loaded only when it is needed: use await import(\'highs\'), not a static import']);
  });

  it('finds a cycle between folders, such as io importing backtest while backtest imports io', () => {
    const cycle = new Map([
      ['src/io/summary.ts', "import { bestResult } from '../backtest/bestResult.js';\n"],
      ['src/backtest/task.ts', "import { readSpecs } from '../io/readSpecs.js';\n"],
    ]);
    expect(folderCycles(checkImports(cycle).edges)).toEqual([['backtest', 'io']]);
  });
});
