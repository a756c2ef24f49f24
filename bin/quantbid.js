#!/usr/bin/env node
// Launcher: runs the compiled CLI (npm install builds dist/ through the `prepare` script).
import { main } from '../dist/cli/main.js';

main(process.argv).then(
  (code) => {
    process.exitCode = code;
  },
  (err) => {
    process.stderr.write(`quantbid: internal fault: ${err instanceof Error ? err.stack ?? err.message : String(err)}\n`);
    process.exitCode = 1;
  },
);
