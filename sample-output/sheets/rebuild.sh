#!/bin/sh
# Rebuild the committed contact sheets (tests/sheet.rs checks that they are
# what the current code draws): one sheet per demo figure and for the
# figure that fails the audit on purpose, plus the index, at 100 dpi to
# keep the files small. `sheet` exits 1 because that figure fails.
# HUEPROOF_BIN names a binary to use instead of a fresh release build.
set -eu
cd "$(dirname "$0")/../.."
if [ -z "${HUEPROOF_BIN:-}" ]; then
    cargo build --release --quiet
fi
bin=${HUEPROOF_BIN:-target/release/hueproof}
status=0
"$bin" sheet sample-output/*.toml sample-output/audit/clashing-colours.toml \
    -o sample-output/sheets --dpi 100 > sample-output/sheets/sheets.txt || status=$?
if [ "$status" -ne 0 ] && [ "$status" -ne 1 ]; then
    exit "$status"
fi
echo "sample-output/sheets rebuilt"
