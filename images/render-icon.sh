#!/usr/bin/env bash
# Renders images/icon.svg to the 128×128 images/icon.png the extension manifest names, with
# headless Chromium (Debian package `chromium`). Run it again after editing the SVG.
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
printf '<!doctype html><html><body style="margin:0;background:transparent">%s</body></html>' \
  "$(cat "$here/icon.svg")" >"$work/icon.html"
chromium --headless --no-sandbox --disable-gpu --hide-scrollbars --default-background-color=00000000 \
  --window-size=128,128 --screenshot="$work/icon.png" "file://$work/icon.html" >/dev/null 2>&1
cp "$work/icon.png" "$here/icon.png"
echo "wrote images/icon.png ($(wc -c <"$here/icon.png") bytes)"
