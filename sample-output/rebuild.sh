#!/bin/sh
# Rebuild every committed sample output from the repository root.
set -eu
cd "$(dirname "$0")/.."
cargo build --release --quiet
bin=target/release/hueproof
ramp='oklch(93% 0.04 95)|oklch(80% 0.08 135)|oklch(66% 0.1 175)|oklch(52% 0.08 215)|oklch(38% 0.09 255)'
IFS='|'
# shellcheck disable=SC2086
"$bin" inspect $ramp --background '#fbfaf7' > sample-output/inspect-wetland-ramp.txt
# shellcheck disable=SC2086
"$bin" inspect $ramp --background '#fbfaf7' --json > sample-output/inspect-wetland-ramp.json
unset IFS
"$bin" palette make --scheme sequential --classes 5 --hues 200 --background '#fbfaf7' --ramp 11 --json > sample-output/palette-sequential-5.json
"$bin" palette make --scheme diverging --classes 7 --background '#fbfaf7' --json > sample-output/palette-diverging-7.json
"$bin" palette make --scheme qualitative --classes 6 --background '#fbfaf7' --json > sample-output/palette-qualitative-6.json
# The demo figures: data, templates, SVG and PNG (tests/sample_output.rs
# checks that these files are what the current code renders).
"$bin" demo --out sample-output > /dev/null
# A figure that fails the audit on purpose, in every report form
# (tests/sample_output.rs checks these too). check exits 1 on it.
a=sample-output/audit/clashing-colours
"$bin" check "$a.toml" > "$a.check.txt" || true
"$bin" check "$a.toml" --json="$a.check.json" --sarif="$a.sarif" --junit="$a.junit.xml" --html="$a.html" > /dev/null || true
# The HTML report of a demo figure that passes.
"$bin" check sample-output/choropleth.toml --html=sample-output/audit/choropleth.html > /dev/null
"$bin" render "$a.toml" -o "$a-repaired.svg" --repair > "$a-repaired.txt"
# The contact sheets of the demo figures and of the failing figure.
HUEPROOF_BIN="$bin" sh sample-output/sheets/rebuild.sh
echo "sample-output rebuilt"
