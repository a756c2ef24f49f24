// Small helpers shared by the bench scripts.

/** The value after `--name` on the command line, or `fallback`. */
export function option(name, fallback) {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? process.argv[i + 1] : fallback;
}

/** The median of a list of numbers (the upper one of an even count). */
export function median(xs) {
  return [...xs].sort((a, b) => a - b)[xs.length >> 1];
}
