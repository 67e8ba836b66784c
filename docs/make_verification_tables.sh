#!/bin/sh
# Regenerates the convergence tables of docs/verification.md from the fibre_tables generator
# (tests/benchmark/fibre_tables.cpp): everything between the BEGIN/END GENERATED markers is
# replaced by its output. Takes a few minutes on 2 cores.
#   docs/make_verification_tables.sh [BUILD_DIR]      (default: build)
set -eu
root=$(cd "$(dirname "$0")/.." && pwd)
build=${1:-build}
case $build in /*) ;; *) build="$root/$build" ;; esac
cmake --build "$build" --target fibre_tables -j2 >/dev/null
doc="$root/docs/verification.md"
tables=$(mktemp)
trap 'rm -f "$tables" "$tables.new"' EXIT
"$build/tests/fibre_tables" >"$tables"
awk -v tables="$tables" '
  /<!-- BEGIN GENERATED TABLES/ { print; while ((getline line < tables) > 0) print line; skip = 1; next }
  /<!-- END GENERATED TABLES/ { skip = 0 }
  !skip { print }
' "$doc" >"$tables.new"
grep -q 'END GENERATED TABLES' "$tables.new" || { echo "markers missing in $doc" >&2; exit 1; }
mv "$tables.new" "$doc"
echo "updated $doc"
