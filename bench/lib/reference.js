// Loads the reference helpers of test/reference/ (TypeScript) for the plain-JS benches: each file is
// transpiled with the project's own TypeScript compiler (types stripped, no type check) into
// bench/.cache/reference/ and imported from there, so the benches and the tests share one source.
import { mkdirSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import ts from 'typescript';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const source = join(root, 'test', 'reference');
const target = join(root, 'bench', '.cache', 'reference');

export async function loadReference() {
  mkdirSync(target, { recursive: true });
  for (const file of readdirSync(source).filter((f) => f.endsWith('.ts'))) {
    const { outputText } = ts.transpileModule(readFileSync(join(source, file), 'utf8'), {
      compilerOptions: { module: ts.ModuleKind.ESNext, target: ts.ScriptTarget.ES2022, verbatimModuleSyntax: false },
      fileName: file,
    });
    writeFileSync(join(target, file.replace(/\.ts$/, '.js')), outputText);
  }
  const load = (name) => import(pathToFileURL(join(target, `${name}.js`)).href);
  const [randomDays, highsDayModel, checkSchedule] = await Promise.all([load('randomDays'), load('highsDayModel'), load('checkSchedule')]);
  return { ...randomDays, ...highsDayModel, ...checkSchedule };
}

/** The compiled project (npm run build writes dist/ from src/). */
export async function loadDist(path) {
  return import(pathToFileURL(join(root, 'dist', path)).href);
}
