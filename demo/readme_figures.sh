#!/usr/bin/env bash
# Refresh the pictures of the README (docs/figures/) from a demo run: copies
# chosen SVG documents from demo-out/figures/ and renders each to PNG with
# headless chromium. Run after `make demo`; the results are committed.
set -euo pipefail
cd "$(dirname "$0")/.."
SRC=demo-out/figures
DST=docs/figures
mkdir -p "$DST"
pick=(KESTREL/fault_net KESTREL/dihedra MARLOW/dihedra_filled TARN/hoeppener KESTREL/bedding TARN/focal_axes)
for p in "${pick[@]}"; do cp "$SRC/$p.svg" "$DST/$(echo "$p" | tr '[:upper:]/' '[:lower:]_').svg"; done
for site in KESTREL MARLOW TARN; do
  ev=$(ls "$SRC/$site/mechanisms" | head -1)
  cp "$SRC/$site/mechanisms/$ev" "$DST/mechanism_$(echo "$site" | tr '[:upper:]' '[:lower:]').svg"
done
for svg in "$DST"/*.svg; do
  w=$(grep -o 'width="[0-9.]*"' "$svg" | head -1 | grep -o '[0-9.]*')
  h=$(grep -o 'height="[0-9.]*"' "$svg" | head -1 | grep -o '[0-9.]*')
  profile=$(mktemp -d)
  chromium --headless --no-sandbox --disable-gpu --disable-background-networking --disable-component-update \
    --disable-sync --no-first-run --hide-scrollbars --user-data-dir="$profile" --screenshot="${svg%.svg}.png" \
    --window-size="${w%.*},${h%.*}" "file://$PWD/$svg" >/dev/null 2>&1
  rm -rf "$profile"
done
ls -la "$DST"
