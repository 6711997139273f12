"""Clean the tablet sampling-visit exports and attach the dissolved-oxygen probe log.

Reads   field/sampling_visits_<month>.json (one JSON array per month)
        field/probe_log.ndjson             (one JSON object per line)
Writes  derived/visits_clean.csv

Run from the workspace root:
    python3 scripts/clean_field_visits.py --months 2025-03 2025-04
"""
import argparse
import os
from pathlib import Path

import pandas as pd

OUTPUT_COLUMNS = [
    "visit_id", "station_code", "sampled_at", "sampler", "water_temp_c", "ph",
    "dissolved_oxygen_mg_l", "lat", "lon", "probe_do_mean_mg_l", "probe_readings",
]


def parse_args():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--field-dir", default="field")
    parser.add_argument("--months", nargs="+", default=["2025-03", "2025-04"])
    parser.add_argument("--out", default="derived/visits_clean.csv")
    return parser.parse_args()


def load_visits(field_dir, months):
    frames = []
    for month in months:
        frames.append(pd.read_json(os.path.join(field_dir, f"sampling_visits_{month}.json")))
    # visits_feb = pd.read_json("field/sampling_visits_2025-02.json")  # February tablets were not synced
    return pd.concat(frames, ignore_index=True)


def main():
    args = parse_args()
    visits = load_visits(args.field_dir, args.months)

    if False:  # old tablet app exported semicolon CSV; kept for reference only
        legacy = pd.read_csv("field/tablet_export_legacy.csv", sep=";")
        visits = pd.concat([visits, legacy], ignore_index=True)

    visits["sampled_at"] = pd.to_datetime(visits["sampled_at"], utc=True).dt.strftime("%Y-%m-%dT%H:%M:%SZ")
    visits["lat"] = visits["gps"].apply(lambda g: g["lat"])
    visits["lon"] = visits["gps"].apply(lambda g: g["lon"])
    visits = visits.dropna(subset=["ph"])  # pH probe failures are re-sampled, not imputed

    probe = pd.read_json(Path(args.field_dir) / "probe_log.ndjson", lines=True)
    per_visit = (
        probe.groupby("visit_id")
        .agg(probe_do_mean_mg_l=("dissolved_oxygen_mg_l", "mean"),
             probe_readings=("dissolved_oxygen_mg_l", "size"))
        .round(2)
        .reset_index()
    )

    clean = visits.merge(per_visit, on="visit_id", how="left")
    clean["probe_readings"] = clean["probe_readings"].fillna(0).astype(int)
    clean = clean.sort_values(["station_code", "sampled_at"])[OUTPUT_COLUMNS]

    os.makedirs(os.path.dirname(args.out), exist_ok=True)
    clean.to_csv(args.out, index=False)
    print(f"wrote {len(clean)} visits to {args.out}")


if __name__ == "__main__":
    main()
