#!/usr/bin/env bash
# Rebuild every derived table and report figure of the Ovenmere bakery workspace.
# All steps run with the workspace root as working directory.
set -euo pipefail
cd "$(dirname "$0")"

mkdir -p derived reports/figures

python3 scripts/clean_oven_log.py
python3 scripts/plan_production.py
python3 scripts/aggregate_orders.py
python3 scripts/score_routes.py
python3 scripts/waste_report.py

Rscript models/oven_energy.R

jupyter nbconvert --to notebook --execute --inplace notebooks/hydration_trials.ipynb

if [ -n "${OVENMERE_DATABASE_URL:-}" ]; then
    psql "$OVENMERE_DATABASE_URL" -v ON_ERROR_STOP=1 -f sql/ledger.sql
fi
