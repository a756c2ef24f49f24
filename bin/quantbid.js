#!/usr/bin/env node
// Launcher: runs the compiled CLI (npm install builds dist/ through the `prepare` script).

// A closed pipe (e.g. `quantbid --help | head`) ends the output, not the program with a stack trace.
process.stdout.on('error', (err) => {
  if (err.code === 'EPIPE') process.exit(process.exitCode ?? 0);
  throw err;
});

// `quantbid plan` and `quantbid backtest` start from the bundled CLI (dist/bundle/, scripts/bundlePlanCli.mjs):
// the same compiled code in a few files instead of a hundred modules, which Node 20 loads one by one. The
// other commands start from dist/cli/ (sweep and size start worker threads from files beside their modules there).
const { main } = await import(process.argv[2] === 'plan' || process.argv[2] === 'backtest' ? '../dist/bundle/main.js' : '../dist/cli/main.js');

main(process.argv).then(
  (code) => {
    process.exitCode = code;
  },
  (err) => {
    process.stderr.write(`quantbid: internal fault: ${err instanceof Error ? err.stack ?? err.message : String(err)}\n`);
    process.exitCode = 1;
  },
);
