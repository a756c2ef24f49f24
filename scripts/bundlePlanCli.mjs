// Bundles the compiled CLI (dist/cli/main.js and every module it imports, at once or when a command
// runs) into dist/bundle/, for the launcher to start `quantbid plan` from: Node 20 spends about half a
// millisecond on each ES module it loads, and a plan loads a hundred of ours. Packages stay outside the
// bundle (imported from node_modules as before); the code is the compiled code, unchanged and
// unminified. Run by `npm run build` after tsc.
import { rmSync } from 'node:fs';
import { dirname, isAbsolute, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { rolldown } from 'rolldown';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const out = join(root, 'dist', 'bundle');
rmSync(out, { recursive: true, force: true });
const bundle = await rolldown({
  input: join(root, 'dist', 'cli', 'main.js'),
  platform: 'node',
  // Packages and Node's own modules are imported as they are; only our compiled files are joined.
  external: (id) => !id.startsWith('.') && !isAbsolute(id),
  logLevel: 'warn',
});
await bundle.write({ dir: out, format: 'esm', entryFileNames: 'main.js', chunkFileNames: '[name].js' });
await bundle.close();
