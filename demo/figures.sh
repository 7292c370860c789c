#!/usr/bin/env bash
# Figures of the demo district (demo/README.md), one SQL file per figure kind
# under demo/figures/ (psql variables site or event), each printing one SVG
# document. Runs inside scripts/with-cluster.sh after demo/run.sh has loaded the
# data (PGDATABASE=striae_demo). Writes demo-out/figures/<SITE>/*.svg.
set -euo pipefail
cd "$(dirname "$0")/.."
OUT="$PWD/demo-out/figures"
mkdir -p "$OUT"
# figure FILE.sql OUTPUT.svg VAR=VALUE...: run one figure query into a file.
figure() {
  local sql=$1 out=$2
  shift 2
  local vars=()
  for v in "$@"; do vars+=(-v "$v"); done
  psql -X -q -At -v ON_ERROR_STOP=1 "${vars[@]}" -f "$sql" -o "$out"
}
for site in $(psql -X -At -c "SELECT DISTINCT site FROM fault_slip_obs ORDER BY site"); do
  mkdir -p "$OUT/$site"
  figure demo/figures/fault_net.sql "$OUT/$site/fault_net.svg" site="$site"
  figure demo/figures/dihedra.sql "$OUT/$site/dihedra.svg" site="$site"
  figure demo/figures/dihedra_filled.sql "$OUT/$site/dihedra_filled.svg" site="$site"
  figure demo/figures/focal_axes.sql "$OUT/$site/focal_axes.svg" site="$site"
  figure demo/figures/hoeppener.sql "$OUT/$site/hoeppener.svg" site="$site"
  figure demo/figures/bedding.sql "$OUT/$site/bedding.svg" site="$site"
  mkdir -p "$OUT/$site/mechanisms"
  for ev in $(psql -X -At -c "SELECT event_id FROM focal_event WHERE site = '$site' ORDER BY event_id"); do
    figure demo/figures/mechanism.sql "$OUT/$site/mechanisms/$ev.svg" event="$ev"
  done
  echo "figures of $site: $OUT/$site/ (fault_net, dihedra, dihedra_filled, focal_axes, hoeppener, bedding .svg; mechanisms/*.svg)"
done
