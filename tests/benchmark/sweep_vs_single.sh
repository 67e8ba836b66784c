#!/usr/bin/env bash
# Cost of a wavelength sweep against the same wavelengths solved one by one (docs/performance.md,
# "Wavelength sweeps"). Runs `cladwise solve` on a sweep case, then on one single-wavelength copy
# of the case per sweep point (what a user without sweeps would run), and prints wall and CPU
# seconds of both and their ratio. The single cases are the sweep case with its [sweep] table
# replaced by one `wavelength_um`; nothing else changes (same mesh controls, modes and outputs).
#
#   tests/benchmark/sweep_vs_single.sh BUILD_DIR [CASE] [REPEATS]
#   e.g. tests/benchmark/sweep_vs_single.sh build cases/dispersion_smf_41.toml 3
set -euo pipefail
build=${1:?usage: sweep_vs_single.sh BUILD_DIR [CASE] [REPEATS]}
case_file=${2:-cases/dispersion_smf_41.toml}
repeats=${3:-1}
exe="$build/cladwise"
[[ -x "$exe" ]] || { echo "no $exe: build first" >&2; exit 2; }
work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT

# Sweep wavelengths from the case's [sweep] table (from_um, to_um, points).
read -r from to points < <(awk '
  /^\[/ { in_sweep = ($0 ~ /^\[sweep\]/) }
  in_sweep && /^from_um/ { f = $3 } in_sweep && /^to_um/ { t = $3 } in_sweep && /^points/ { p = $3 }
  END { print f, t, p }' "$case_file")
[[ -n "$points" ]] || { echo "$case_file has no [sweep] table with from_um, to_um, points" >&2; exit 2; }
mapfile -t wavelengths < <(awk -v f="$from" -v t="$to" -v p="$points" \
  'BEGIN { for (i = 0; i < p; ++i) printf "%.10g\n", f + (t - f) * i / (p - 1) }')
dir=$(cd "$(dirname "$case_file")" && pwd)
for i in "${!wavelengths[@]}"; do
  # Same directory as the case, so that relative paths (tables, imported geometry) still resolve.
  single="$dir/.sweep_vs_single_$$_$i.toml"
  awk -v w="${wavelengths[$i]}" '
    /^\[/ { skip = ($0 ~ /^\[sweep\]/) }
    skip { next }
    /^title/ && !done { print; print "wavelength_um = " w; done = 1; next }
    { print }' "$case_file" > "$single"
done
trap 'rm -rf "$work"; rm -f "$dir"/.sweep_vs_single_$$_*.toml' EXIT

timed() {  # prints "wall cpu" in seconds of the command (CPU = user + system of its children)
  local TIMEFORMAT='%R %U %S'
  { time "$@" > /dev/null 2> "$work/err" || { cat "$work/err" >&2; exit 1; }; } 2> "$work/time"
  awk '{ printf "%.2f %.2f\n", $1, $2 + $3 }' "$work/time"
}

echo "case $case_file: ${#wavelengths[@]} wavelengths ${from}-${to} um; load $(cut -d' ' -f1-3 /proc/loadavg)"
for r in $(seq 1 "$repeats"); do
  read -r sw sc < <(timed "$exe" solve "$case_file" --out "$work/sweep")
  singles() {
    for i in "${!wavelengths[@]}"; do
      "$exe" solve "$dir/.sweep_vs_single_$$_$i.toml" --out "$work/single_$i" || return 1
    done
  }
  read -r gw gc < <(timed singles)
  awk -v sw="$sw" -v sc="$sc" -v gw="$gw" -v gc="$gc" -v r="$r" 'BEGIN {
    printf "run %d: sweep %.2f s wall / %.2f s CPU; singles %.2f s wall / %.2f s CPU; ratio %.2f wall / %.2f CPU\n",
           r, sw, sc, gw, gc, sw / gw, sc / gc }'
done
