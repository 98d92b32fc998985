#!/usr/bin/env bash
# Peak memory and time of reducing a 10-million-row CSV (two numeric columns)
# through `priorwright check --data`. Needs /usr/bin/time (Debian: apt-get install time).
set -euo pipefail
cd "$(dirname "$0")/.."
rows=${1:-10000000}
dir=$(mktemp -d)
trap 'rm -rf "$dir"' EXIT
awk -v n="$rows" 'BEGIN { print "nests,km_walked"; for (i = 0; i < n; i++) printf "%d,%d.%02d\n", i % 17, 1 + i % 3, i % 100 }' > "$dir/big.csv"
cargo build --release --no-default-features --quiet
size=$(stat -c %s "$dir/big.csv")
/usr/bin/time -v target/release/priorwright check sample-projects/nest-transects.ron --data "$dir/big.csv" --json \
  > "$dir/out.json" 2> "$dir/time.txt"
peak_kb=$(awk -F: '/Maximum resident set size/ { gsub(/ /, "", $2); print $2 }' "$dir/time.txt")
secs=$(awk -F': ' '/Elapsed \(wall clock\)/ { print $2 }' "$dir/time.txt")
echo "rows: $rows  file: $((size / 1000000)) MB  peak memory: $((peak_kb / 1024)) MiB  elapsed: $secs"
grep -o '"rows": [0-9]*' "$dir/out.json" | head -1
