#!/usr/bin/env bash
# Draws the README's charts from the invented Larkvane demo data
# (tables/demo/). Run from anywhere: `bash docs/charts/make.sh`.
set -euo pipefail
cd "$(dirname "$0")/../.."
run() { cargo run --quiet --release -- "$@"; }

# Alder pond at dawn on 2 June (the first row of larkvane_ponds.csv), with
# its ammonia, on the carbonate curves; the pH band is a standard
# uncertainty of 0.02 for a field glass electrode (common practice).
run chart speciation --temperature 24.3 --conductivity "415 uS/cm@25C" \
    --ph 7.52 --alkalinity "117 mg/L CaCO3" --calcium "83 mg/L CaCO3" \
    --ammonia "0.41 mg/L N" --include ammonia --uncertainty ph=0.02 \
    -o docs/charts/alder_speciation.svg

# The reservoir profile, 0.5 to 20 m.
run chart depth tables/demo/larkvane_reservoir_profile.csv \
    -o docs/charts/reservoir_profile.svg

# The four ponds at dawn and mid-afternoon over two weeks, with the limits
# of the default profile.
run chart overview tables/demo/larkvane_ponds.csv -o docs/charts/ponds_overview.svg
