"""Monthly per-station summary of the continuous station readings.

Reads   stations/readings/year=2025/month=MM/readings.csv (one partition per month)
        stations/station_register.csv
Writes  derived/station_monthly_summary.csv
"""
import argparse
import os

import pandas as pd

from config import DERIVED_DIR, STATION_REGISTER


def main():
    parser = argparse.ArgumentParser(description="monthly station summary")
    parser.add_argument("--months", nargs="+", type=int, default=[1, 2, 3, 4, 5, 6])
    parser.add_argument("--out", default=os.path.join(DERIVED_DIR, "station_monthly_summary.csv"))
    args = parser.parse_args()

    frames = []
    for m in args.months:
        part = pd.read_csv(f"stations/readings/year=2025/month={m:02d}/readings.csv")
        part["month"] = m
        frames.append(part)
    readings = pd.concat(frames, ignore_index=True)

    register = pd.read_csv(STATION_REGISTER)

    summary = (
        readings.groupby(["station_code", "month"])
        .agg(mean_temp_c=("water_temp_c", "mean"),
             mean_ph=("ph", "mean"),
             mean_do_mg_l=("dissolved_oxygen_mg_l", "mean"),
             mean_nitrate_mg_l=("nitrate_mg_l", "mean"),
             n_readings=("reading_date", "size"))
        .round(2)
        .reset_index()
        .merge(register[["station_code", "station_name", "river_km"]], on="station_code", how="left")
    )
    summary = summary[["station_code", "station_name", "river_km", "month", "mean_temp_c", "mean_ph",
                       "mean_do_mg_l", "mean_nitrate_mg_l", "n_readings"]]

    os.makedirs(os.path.dirname(args.out), exist_ok=True)
    summary.to_csv(args.out, index=False)
    print(f"wrote {len(summary)} station-months to {args.out}")


if __name__ == "__main__":
    main()
