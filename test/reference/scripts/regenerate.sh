#!/bin/sh
# Regenerate every reference fixture in test/reference/fixtures/ from base R and statsmodels.
# Needs Debian's r-base-core (Rscript) and python3-statsmodels (/usr/bin/python3). CI never runs this.
# Usage: sh test/reference/scripts/regenerate.sh [arma|selection|diagnostics ...]   (default: all)
set -eu
here=$(cd "$(dirname "$0")" && pwd)
fixtures="$here/../fixtures"
tmp=${TMPDIR:-/tmp}/provision-reference
mkdir -p "$tmp" "$fixtures"
py=/usr/bin/python3
parts=${*:-arma selection diagnostics}
for part in $parts; do
  case "$part" in
    arma)
      Rscript "$here/r-arma-grid.R" "$tmp/r-arma-grid.json"
      "$py" "$here/sm-arma-grid.py" "$tmp/r-arma-grid.json" "$fixtures/arma-grid.json"
      ;;
    selection)
      Rscript "$here/r-selection-grid.R" "$fixtures/selection-grid.json"
      ;;
    diagnostics)
      Rscript "$here/r-diagnostics.R" "$tmp/r-diagnostics.json"
      "$py" "$here/sm-diagnostics.py" "$tmp/r-diagnostics.json" "$fixtures/diagnostics.json"
      ;;
    *) echo "unknown part: $part" >&2; exit 2 ;;
  esac
done
