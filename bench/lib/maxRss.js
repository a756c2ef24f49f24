// Loaded with `node --import bench/lib/maxRss.js` where /usr/bin/time is missing: at exit, writes this
// process's peak resident set size (process.resourceUsage().maxRSS, in kilobytes) as the last line of
// stderr, in the words of GNU time -v so that bench/scale10y.sh reads both the same way.
process.on('exit', () => {
  process.stderr.write(`\tMaximum resident set size (kbytes): ${process.resourceUsage().maxRSS}\n`);
});
