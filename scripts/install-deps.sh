#!/usr/bin/env bash
# Install the Debian packages striae needs to build, test (clang and its
# runtime for the libFuzzer harnesses; pgbench comes with postgresql-15), run the
# demo and the benchmarks; PostGIS for the companion extension striae_gis, GDAL
# (ogr2ogr) and pyproj for its checks. Idempotent; prints nothing when everything is present.
set -euo pipefail

PACKAGES=(
  g++ make
  postgresql-15 postgresql-client-15 postgresql-server-dev-15
  libeigen3-dev
  libgtest-dev
  clang-14 libclang-rt-14-dev
  python3 python3-numpy python3-psycopg
  proj-bin                          # PROJ: reference for the net projections
  chromium fonts-dejavu-core python3-pil   # figures rendered and sampled in a real browser
  python3-matplotlib                # baseline of the figure benchmark
  postgresql-15-postgis-3           # the companion extension striae_gis requires PostGIS
  gdal-bin python3-pyproj           # GIS client (ogr2ogr) and geodesic reference (pyproj.Geod)
  libopenblas0-pthread python3-threadpoolctl   # numpy references of the benchmarks run on OpenBLAS
)

missing=()
for p in "${PACKAGES[@]}"; do
  if ! dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed"; then
    missing+=("$p")
  fi
done
[ ${#missing[@]} -eq 0 ] && exit 0

if [ "$(id -u)" -ne 0 ]; then
  echo "install-deps: missing packages: ${missing[*]}; run this script as root" >&2
  exit 1
fi
echo "install-deps: installing ${missing[*]}"
export DEBIAN_FRONTEND=noninteractive
apt-get update -qq
apt-get install -y -qq --no-install-recommends "${missing[@]}" >/dev/null
