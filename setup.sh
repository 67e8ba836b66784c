#!/usr/bin/env bash
# cladwise set-up: installs the Debian 12 packages that are missing, configures, builds, and then
#   ./setup.sh          runs the demo case
#   ./setup.sh test     runs the whole test suite through ctest
#   ./setup.sh build    only builds; ./setup.sh configure only installs and configures
# Nothing is downloaded except Debian packages; nothing is vendored.
set -euo pipefail
cd "$(dirname "$0")"

mode="${1:-demo}"
case "$mode" in demo|test|build|configure) ;; *)
  echo "usage: ./setup.sh [demo|test|build|configure]" >&2; exit 2 ;;
esac

# libopenblas0-openmp: an optimised BLAS behind UMFPACK's dense kernels (Debian's alternatives
# select it over the reference BLAS): the sparse LU of 265k unknowns takes 2.8 s instead of 7.5 s
# (docs/performance.md). The OpenMP build shares the threads of our own OpenMP assembly.
packages=(build-essential cmake pkg-config git
          libeigen3-dev libspectra-dev libgmsh-dev libvtk9-dev libsuitesparse-dev
          libarpack2-dev libgtest-dev libtomlplusplus-dev libboost-dev libopenblas0-openmp chromium)

missing=()
for p in "${packages[@]}"; do
  if ! dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed"; then
    missing+=("$p")
  fi
done
if ((${#missing[@]})); then
  if [[ $(id -u) -eq 0 ]]; then
    echo "setup: installing ${missing[*]}" >&2
    export DEBIAN_FRONTEND=noninteractive
    apt-get update -qq
    apt-get install -y -qq "${missing[@]}" >&2
  else
    echo "setup: these Debian packages are missing; install them as root and run again:" >&2
    echo "  sudo apt-get install -y ${missing[*]}" >&2
    exit 2
  fi
fi

jobs="$(nproc 2>/dev/null || echo 2)"
cmake -S . -B build -DCMAKE_BUILD_TYPE=Release >&2
[[ "$mode" == configure ]] && exit 0
cmake --build build --parallel "$jobs" >&2

case "$mode" in
  demo)
    # Demo scenario of our own: an elliptical-core polarisation-maintaining fibre, solved end to
    # end (mesh, full-vector FEM, eigensolve, results and fields in cases/elliptical_core.out/).
    ./build/cladwise solve cases/elliptical_core.toml
    ;;
  test)
    ctest --test-dir build --output-on-failure --parallel "$jobs" --timeout 600
    ;;
  build) ;;
esac
