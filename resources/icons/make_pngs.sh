#!/usr/bin/env bash
# Renders earmark.svg into the PNG sizes the desktop's icon theme looks for
# (hicolor NxN/apps). Run after changing the SVG; the PNGs are committed so the
# build needs no SVG renderer. Needs rsvg-convert (Debian: librsvg2-bin).
set -euo pipefail
cd "$(dirname "${BASH_SOURCE[0]}")"
for size in 16 24 32 48 64 128 256; do
  rsvg-convert --width "$size" --height "$size" earmark.svg --output "earmark-$size.png"
done
