/**
 * Reads the imports of TypeScript sources and checks them against the house rule (layers.ts).
 *
 * An import is every module a file names: `import ... from`, `export ... from`, `import(...)`,
 * `import type`, a type `import('...')`, and `new URL('./x.js', import.meta.url)` (a module loaded by
 * URL, e.g. a worker's task module; a URL of a data file such as package.json is not an import). The sources are parsed with the TypeScript compiler, so text in
 * comments and strings is never taken for an import.
 */
import { builtinModules } from 'node:module';
import { dirname, join, normalize, relative } from 'node:path';
import ts from 'typescript';
import { DOMAIN, DOMAIN_PACKAGES, LAZY_PACKAGES, MAY_IMPORT, type Layer } from './layers.js';

/** One import of a source file. */
export interface ImportUse {
  /** The file, relative to the repository root, e.g. `src/plan/planDay.ts`. */
  readonly file: string;
  readonly line: number;
  /** The specifier as written, e.g. `../types.js` or `node:fs`. */
  readonly specifier: string;
  /** `dynamic` for `import(...)` called at run time, `type` for an import of types alone (erased), `static` otherwise. */
  readonly kind: 'static' | 'dynamic' | 'type';
}

/** What a file uses that the rule looks at: its imports and where it names the global `process`. */
export interface FileUses {
  readonly imports: readonly ImportUse[];
  /** Lines on which the global `process` is read (`process.x`). */
  readonly processLines: readonly number[];
}

/** Every import and every use of the global `process` in one source text. */
export function fileUses(file: string, text: string): FileUses {
  const source = ts.createSourceFile(file, text, ts.ScriptTarget.ES2022, true, ts.ScriptKind.TS);
  const imports: ImportUse[] = [];
  const processLines: number[] = [];
  const lineOf = (node: ts.Node): number => source.getLineAndCharacterOfPosition(node.getStart(source)).line + 1;
  const add = (node: ts.Node, literal: ts.Node | undefined, kind: ImportUse['kind'] = 'static'): void => {
    if (literal !== undefined && ts.isStringLiteralLike(literal)) imports.push({ file, line: lineOf(node), specifier: literal.text, kind });
  };
  const visit = (node: ts.Node): void => {
    if (ts.isImportDeclaration(node)) add(node, node.moduleSpecifier, node.importClause?.isTypeOnly === true ? 'type' : 'static');
    else if (ts.isExportDeclaration(node)) add(node, node.moduleSpecifier, node.isTypeOnly ? 'type' : 'static');
    else if (ts.isImportEqualsDeclaration(node) && ts.isExternalModuleReference(node.moduleReference)) add(node, node.moduleReference.expression);
    else if (ts.isCallExpression(node) && node.expression.kind === ts.SyntaxKind.ImportKeyword) add(node, node.arguments[0], 'dynamic');
    else if (ts.isImportTypeNode(node) && ts.isLiteralTypeNode(node.argument)) add(node, node.argument.literal, 'type');
    else if (ts.isNewExpression(node) && isModuleUrl(node)) add(node, node.arguments?.[0]);
    else if (ts.isIdentifier(node) && node.text === 'process' && isGlobalUse(node)) processLines.push(lineOf(node));
    ts.forEachChild(node, visit);
  };
  visit(source);
  return { imports, processLines };
}

/** `new URL('<path>.js', import.meta.url)`: a module named by URL (a data file such as package.json is not a module). */
function isModuleUrl(node: ts.NewExpression): boolean {
  const [path, base] = node.arguments ?? [];
  const named = path !== undefined && ts.isStringLiteralLike(path) && /\.m?js$/.test(path.text);
  return ts.isIdentifier(node.expression) && node.expression.text === 'URL' && named && base !== undefined && base.getText() === 'import.meta.url';
}

/**
 * `process.x` or `process[x]`: the global process object read (a name `process` used otherwise, e.g. a
 * local variable or a property key, is not the global; a local variable named process and read with
 * a dot would be taken for it, which no code here does).
 */
function isGlobalUse(node: ts.Identifier): boolean {
  const parent = node.parent;
  return (ts.isPropertyAccessExpression(parent) || ts.isElementAccessExpression(parent)) && parent.expression === node;
}

/** The layer of a file under src/ (`src/plan/warehouse/pwl.ts` -> `plan`, `src/types.ts` -> `types`), or null. */
export function layerOf(file: string): Layer | null {
  const parts = normalize(file).split(/[\\/]/);
  if (parts[0] !== 'src' || parts.length < 2) return null;
  const name = parts.length === 2 ? (parts[1] as string).replace(/\.ts$/, '') : (parts[1] as string);
  return name in MAY_IMPORT ? (name as Layer) : null;
}

/** A source path for a relative specifier (`../types.js` from src/plan/x.ts -> src/types.ts). */
export function resolveSpecifier(file: string, specifier: string): string {
  return join(dirname(file), specifier).replace(/\.js$/, '.ts');
}

/** A broken rule, as one line of the test's message. */
export interface Violation {
  readonly file: string;
  readonly line: number;
  readonly message: string;
}

const NODE_BUILTINS = new Set(builtinModules);

function isNodeBuiltin(specifier: string): boolean {
  return specifier.startsWith('node:') || NODE_BUILTINS.has(specifier.split('/')[0] as string);
}

/**
 * Every violation of the rule in a set of sources (path relative to the repository root -> text):
 * a file outside the table's folders, an import between folders the table does not allow, a
 * relative import that leaves src/, and in a domain folder a Node built-in other than the allowed
 * packages, a package not in DOMAIN_PACKAGES, or the global `process`; a package of LAZY_PACKAGES
 * loaded from another folder, or loaded by a static import. Folder cycles: folderCycles.
 */
export function checkImports(sources: ReadonlyMap<string, string>): { readonly violations: Violation[]; readonly edges: Map<Layer, Set<Layer>> } {
  const violations: Violation[] = [];
  const edges = new Map<Layer, Set<Layer>>();
  for (const [file, text] of sources) {
    const from = layerOf(file);
    if (from === null) {
      violations.push({ file, line: 1, message: 'is in no folder of the import rule (test/architecture/layers.ts): add the folder to the table' });
      continue;
    }
    const domain = DOMAIN.includes(from);
    const uses = fileUses(file, text);
    for (const use of uses.imports) {
      const { specifier } = use;
      if (specifier.startsWith('.')) {
        const target = resolveSpecifier(file, specifier);
        const to = layerOf(target);
        if (to === null) {
          violations.push({ file, line: use.line, message: `imports ${specifier}, outside the folders of src/` });
          continue;
        }
        if (to === from) continue;
        if (!edges.has(from)) edges.set(from, new Set());
        edges.get(from)?.add(to);
        if (!MAY_IMPORT[from].includes(to)) violations.push({ file, line: use.line, message: `${from} may not import ${to} (${specifier}); ${from} may import ${MAY_IMPORT[from].join(', ') || 'nothing'}` });
      } else if (specifier in LAZY_PACKAGES) {
        const allowed = LAZY_PACKAGES[specifier] as readonly Layer[];
        if (!allowed.includes(from)) violations.push({ file, line: use.line, message: `${from} may not load the package ${specifier}; only ${allowed.join(', ')} may, by import() when it is needed` });
        else if (use.kind === 'static') violations.push({ file, line: use.line, message: `${specifier} is loaded only when it is needed: use await import('${specifier}'), not a static import` });
      } else if (domain && !DOMAIN_PACKAGES.includes(specifier)) {
        const what = isNodeBuiltin(specifier) ? 'the Node built-in' : 'the package';
        violations.push({ file, line: use.line, message: `${from} is domain code and may not import ${what} ${specifier}; the domain may use ${DOMAIN_PACKAGES.join(', ')}` });
      }
    }
    if (domain) {
      for (const line of uses.processLines) violations.push({ file, line, message: `${from} is domain code and may not use the global process (environment, clock, exit, signals): take it as a parameter` });
    }
  }
  return { violations, edges };
}

/** The cycles of a folder graph: each strongly connected set of two or more folders, or a folder that imports itself. */
export function folderCycles(edges: ReadonlyMap<Layer, ReadonlySet<Layer>>): Layer[][] {
  // Tarjan's strongly connected components (Tarjan 1972, SIAM J. Computing 1(2), 146-160).
  let counter = 0;
  const index = new Map<Layer, number>();
  const low = new Map<Layer, number>();
  const stack: Layer[] = [];
  const onStack = new Set<Layer>();
  const cycles: Layer[][] = [];
  const nodes = new Set<Layer>([...edges.keys(), ...[...edges.values()].flatMap((s) => [...s])]);
  const connect = (v: Layer): void => {
    index.set(v, counter);
    low.set(v, counter++);
    stack.push(v);
    onStack.add(v);
    for (const w of edges.get(v) ?? []) {
      if (!index.has(w)) {
        connect(w);
        low.set(v, Math.min(low.get(v) as number, low.get(w) as number));
      } else if (onStack.has(w)) low.set(v, Math.min(low.get(v) as number, index.get(w) as number));
    }
    if (low.get(v) === index.get(v)) {
      const component: Layer[] = [];
      let w: Layer;
      do {
        w = stack.pop() as Layer;
        onStack.delete(w);
        component.push(w);
      } while (w !== v);
      if (component.length > 1 || edges.get(v)?.has(v)) cycles.push(component.sort());
    }
  };
  for (const v of [...nodes].sort()) if (!index.has(v)) connect(v);
  return cycles;
}

/** The table itself as a graph, for the check that it allows no cycle. */
export function tableEdges(): Map<Layer, Set<Layer>> {
  return new Map(Object.entries(MAY_IMPORT).map(([from, to]) => [from as Layer, new Set(to)]));
}

/** A source map from files on disk: path relative to `root` -> text. */
export function relativeTo(root: string, path: string): string {
  return relative(root, path).split('\\').join('/');
}
