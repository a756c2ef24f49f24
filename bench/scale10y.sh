#!/usr/bin/env bash
# Peak memory and wall time of a 10-year backtest at 15 minutes: 2017-01-01 to 2026-12-31, 350,592
# delivery periods (clock-change days included), a 19-level quantile forecast, the five policies, on
# seeded fictional inputs made by bench/scale10yData.js.
#
#   npm run build && bash bench/scale10y.sh [DIR]
#
# DIR receives the inputs (65 MB) and the outputs (190 MB, mostly ledger.csv); without DIR a temporary
# folder is used and removed at the end. The peak resident set size and the wall time come from GNU
# time (/usr/bin/time -v); where it is missing, from process.resourceUsage().maxRSS (bench/lib/maxRss.js)
# and the shell's clock. The goal is a peak under 400 MiB (409,600 kB).
set -euo pipefail
root=$(cd "$(dirname "$0")/.." && pwd)
if [ $# -ge 1 ]; then
  dir=$1
  mkdir -p "$dir"
else
  dir=$(mktemp -d "${TMPDIR:-/tmp}/quantbid-scale10y-XXXXXX")
  trap 'rm -rf "$dir"' EXIT
fi

node "$root/bench/scale10yData.js" "$dir/data"
args=(backtest --scenario "$dir/data/scenario.json" --from 2017-01-01 --to 2026-12-31 --out "$dir/out" --force)
started=$(date +%s.%N)
if [ -x /usr/bin/time ]; then
  how='/usr/bin/time -v'
  /usr/bin/time -v node "$root/bin/quantbid.js" "${args[@]}" > "$dir/stdout.txt" 2> "$dir/stderr.txt"
else
  how='process.resourceUsage().maxRSS (/usr/bin/time is missing)'
  node --import "$root/bench/lib/maxRss.js" "$root/bin/quantbid.js" "${args[@]}" > "$dir/stdout.txt" 2> "$dir/stderr.txt"
fi
ended=$(date +%s.%N)

peak_kb=$(sed -n 's/.*Maximum resident set size (kbytes): *//p' "$dir/stderr.txt" | tail -n 1)
wall_s=$(awk -v a="$started" -v b="$ended" 'BEGIN { printf "%.1f", b - a }')
head -n 1 "$dir/stdout.txt"
echo "ledger.csv: $(wc -c < "$dir/out/ledger.csv") bytes, $(($(wc -l < "$dir/out/ledger.csv") - 1)) rows"
echo "peak resident set size: ${peak_kb} kB ($(awk -v k="$peak_kb" 'BEGIN { printf "%.0f", k / 1024 }') MiB), measured with ${how}"
if [ -x /usr/bin/time ]; then
  sed -n 's/^\t\(User time (seconds)\|System time (seconds)\|Elapsed (wall clock) time (h:mm:ss or m:ss)\): */\1: /p' "$dir/stderr.txt"
fi
echo "wall time: ${wall_s} s; load average at the end: $(cut -d ' ' -f 1-3 /proc/loadavg 2>/dev/null || echo unknown)"
if [ "$peak_kb" -ge 409600 ]; then
  echo "over the 400 MiB goal" >&2
  exit 1
fi
