#!/usr/bin/env bash
# Regenerate every reference fixture from its script (Debian python3-scipy, python3-sklearn, r-base-core, r-cran-cluster,
# r-cran-dbscan for hdbscan_dbscan.R).
set -euo pipefail
cd "$(dirname "$0")"
# R first: kmeans_optima.py completes the fixture kmeans_optima.R starts.
for f in *.R; do [ -e "$f" ] && Rscript "$f"; done
for f in *.py; do [ -e "$f" ] && /usr/bin/python3 "$f"; done
