// The floor of any run that reads a history and a quantile forecast: a bare Node script, no
// validation beyond what parsing needs, that reads each CSV file given on the command line whole,
// splits every line into cells, parses every number (Number) and every timestamp (Date.parse), and
// prints a checksum so that no work can be skipped. bench/wholeRun.js times it as the reference.
//
//   node bench/lib/plainRead.js history.csv quantiles.csv
import { readFileSync } from 'node:fs';

let rows = 0;
let sum = 0;
for (const path of process.argv.slice(2)) {
  const lines = readFileSync(path, 'utf8').split('\n');
  for (let i = 1; i < lines.length; i++) {
    const line = lines[i];
    if (line === '') continue;
    const cells = line.split(',');
    const ms = Date.parse(cells[0]);
    if (Number.isNaN(ms)) throw new Error(`${path}:${i + 1}: not a timestamp`);
    sum += ms / 1e12;
    for (let k = 1; k < cells.length; k++) {
      const value = Number(cells[k]);
      if (!Number.isFinite(value)) throw new Error(`${path}:${i + 1}: not a number`);
      sum += value;
    }
    rows++;
  }
}
process.stdout.write(`${rows} rows, checksum ${sum}\n`);
