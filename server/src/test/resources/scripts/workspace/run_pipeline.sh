#!/usr/bin/env bash
# Rebuild the cooperative's hive-weight tables and the season report.
set -euo pipefail
cd "$(dirname "$0")"

WORK=work
python3 pipeline/ingest_scales.py --apiaries north south --out "$WORK/weights_long.parquet"
python3 -u pipeline/nectar_flow.py $WORK/weights_long.parquet
# python3 pipeline/retired_step.py
for season in 2023 2024; do
    python3 pipeline/yearly_report.py "$season"
done
Rscript --vanilla analysis/swarm_risk.R work/weights_long.parquet
jupyter nbconvert --to notebook --execute notebooks/colony_review.ipynb
