#!/bin/sh
# Run every benchmark (`cargo bench`, each [[bench]] target in turn) and
# rewrite the README's performance table, between the markers
# <!-- bench-table:start --> and <!-- bench-table:end -->, from the
# `table: ` lines the benches print (benches/common/mod.rs). The full
# output is kept in target/bench-table.log.
#
#   sh benches/table.sh            every benchmark
#   sh benches/table.sh --bench scale   one (arguments go to cargo bench)
set -eu
cd "$(dirname "$0")/.."
log=target/bench-table.log
mkdir -p target
cargo bench "$@" 2>&1 | tee "$log"
rows=$(grep '^table: ' "$log" | sed 's/^table: //')
peak=$(grep '^table-peak: ' "$log" | sed 's/^table-peak: //' || true)
[ -n "$rows" ] || { echo "no benchmark rows in $log" >&2; exit 1; }
new=$(mktemp)
{
  echo "Produced by \`sh benches/table.sh $*\` (cargo bench $*) on $(date -u +%Y-%m-%d), $(nproc) cores, rustc $(rustc --version | cut -d' ' -f2)."
  echo "Each ratio is a measurement's time over its baseline's (the first row of each bench), both from the same run."
  [ -z "$peak" ] || echo "Scale run peak memory: $peak."
  echo
  echo "| bench | measurement | median ms | ratio (median) | ratio (min) | runs |"
  echo "| --- | --- | --- | --- | --- | --- |"
  echo "$rows"
} > "$new"
awk -v table="$new" '
  /<!-- bench-table:start -->/ { print; while ((getline l < table) > 0) print l; skip = 1; next }
  /<!-- bench-table:end -->/ { skip = 0 }
  !skip { print }
' README.md > README.md.tmp
mv README.md.tmp README.md
rm -f "$new"
echo "README.md: performance table rewritten ($(echo "$rows" | wc -l) rows)"
