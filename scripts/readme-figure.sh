#!/usr/bin/env bash
# Regenerates the README's figures: runs `hull demo` (in-process server, the invented data-demo/ scenario), which
# writes its figures as SVG, and renders the Li-Co-O ternary and the voltage profile of Li into CoO2 to docs/ with
# rsvg-convert (Debian librsvg2-bin).
set -euo pipefail
cd "$(dirname "$0")/.."
command -v rsvg-convert >/dev/null 2>&1 || { echo "rsvg-convert is missing: apt-get install librsvg2-bin" >&2; exit 1; }
figures=$(mktemp -d)
trap 'rm -rf "$figures"' EXIT
dotnet run -c Release --project src/Hull.Cli -- demo --figures "$figures" >/dev/null
mkdir -p docs
for name in ternary-Li-Co-O voltage-Li-into-CoO2; do
  rsvg-convert --output "docs/$name.png" "$figures/$name.svg"
  echo "wrote docs/$name.png"
done
