#!/usr/bin/env bash
# Rebuild every derived table and bulletin figure of the Quillwater lab workspace.
# All steps run with the workspace root as working directory.
set -euo pipefail
cd "$(dirname "$0")"

mkdir -p derived bulletin/figures

python3 scripts/clean_field_visits.py --field-dir field --months 2025-03 2025-04 --out derived/visits_clean.csv
python3 scripts/merge_lab_results.py --out derived/lab_merged.csv
python3 scripts/build_station_summary.py --months 1 2 3 4 5 6 --out derived/station_monthly_summary.csv

Rscript models/trend_model.R derived/station_monthly_summary.csv

# nbconvert executes the notebook with notebooks/ as its working directory.
jupyter nbconvert --to notebook --execute --inplace notebooks/explore_oxygen.ipynb

# Optional: create the reporting schema when a database is configured.
if [ -n "${QW_DATABASE_URL:-}" ]; then
    psql "$QW_DATABASE_URL" -v ON_ERROR_STOP=1 -f sql/views.sql
fi
