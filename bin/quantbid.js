#!/usr/bin/env node
// Launcher: runs the compiled CLI (npm install builds dist/ through the `prepare` script).
import { main } from '../dist/cli/main.js';

// A closed pipe (e.g. `quantbid --help | head`) ends the output, not the program with a stack trace.
process.stdout.on('error', (err) => {
  if (err.code === 'EPIPE') process.exit(process.exitCode ?? 0);
  throw err;
});

main(process.argv).then(
  (code) => {
    process.exitCode = code;
  },
  (err) => {
    process.stderr.write(`quantbid: internal fault: ${err instanceof Error ? err.stack ?? err.message : String(err)}\n`);
    process.exitCode = 1;
  },
);
