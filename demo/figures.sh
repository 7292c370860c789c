#!/usr/bin/env bash
# Figures of the demo district (demo/README.md), one SQL file per figure kind
# under demo/figures/ (psql variables site or event), each printing one SVG
# document. Runs inside scripts/with-cluster.sh after demo/run.sh has loaded the
# data (PGDATABASE set). Writes OUT/figures/<SITE>/*.svg (OUT: the first
# argument, default demo-out). All figures are drawn in one psql session (a script
# of \set, \o and \i lines), not one process per figure.
set -euo pipefail
cd "$(dirname "$0")/.."
OUT="$(cd "${1:-demo-out}" && pwd)/figures"
mkdir -p "$OUT"
script="$(mktemp)"
trap 'rm -f "$script"' EXIT
# figure FILE.sql OUTPUT.svg VAR VALUE: one figure query into a file.
figure() { printf "\\\\set %s '%s'\n\\\\o '%s'\n\\\\i %s\n\\\\o\n" "$3" "$4" "$2" "$1" >>"$script"; }
sites=$(psql -X -At -c "SELECT DISTINCT site FROM fault_slip_obs ORDER BY site")
for site in $sites; do
  mkdir -p "$OUT/$site/mechanisms"
  for kind in fault_net dihedra dihedra_filled focal_axes hoeppener bedding; do
    figure "demo/figures/$kind.sql" "$OUT/$site/$kind.svg" site "$site"
  done
  for ev in $(psql -X -At -c "SELECT event_id FROM focal_event WHERE site = '$site' ORDER BY event_id"); do
    figure demo/figures/mechanism.sql "$OUT/$site/mechanisms/$ev.svg" event "$ev"
  done
done
psql -X -q -At -v ON_ERROR_STOP=1 -f "$script"
for site in $sites; do
  echo "figures of $site: $OUT/$site/ (fault_net, dihedra, dihedra_filled, focal_axes, hoeppener, bedding .svg; mechanisms/*.svg)"
done
