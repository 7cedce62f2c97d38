#!/usr/bin/env bash
# Regenerates the README's figure: runs `hull demo` (in-process server, the invented data-demo/ scenario), which
# writes its phase diagrams as SVG, and renders the Li-Co-O ternary to docs/ternary-Li-Co-O.png with rsvg-convert
# (Debian librsvg2-bin).
set -euo pipefail
cd "$(dirname "$0")/.."
command -v rsvg-convert >/dev/null 2>&1 || { echo "rsvg-convert is missing: apt-get install librsvg2-bin" >&2; exit 1; }
figures=$(mktemp -d)
trap 'rm -rf "$figures"' EXIT
dotnet run -c Release --project src/Hull.Cli -- demo --figures "$figures" >/dev/null
mkdir -p docs
rsvg-convert --output docs/ternary-Li-Co-O.png "$figures/ternary-Li-Co-O.svg"
echo "wrote docs/ternary-Li-Co-O.png"
