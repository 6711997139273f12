"""Merge the 2025 lab instrument exports into one table per sample.

Reads   lab/nitrate_results_2025.csv       (comma CSV, the master sample list)
        lab/ion_chromatograph_2025.csv     (semicolon CSV, decimal commas)
        lab/turbidity_bench_2025.txt       (tab-separated)
        lab/conductivity_legacy_2025.csv   (Latin-1 encoded legacy meter export)
Writes  derived/lab_merged.csv
"""
import argparse
import os
from pathlib import Path

import pandas as pd

from config import DERIVED_DIR, LAB_DIR, NITRATE_RESULTS

LAB = Path(LAB_DIR)


def main():
    parser = argparse.ArgumentParser(description="merge lab exports")
    parser.add_argument("--out", default=os.path.join(DERIVED_DIR, "lab_merged.csv"))
    args = parser.parse_args()

    nitrate = pd.read_csv(NITRATE_RESULTS)
    ions = pd.read_csv(os.path.join(LAB_DIR, "ion_chromatograph_2025.csv"), sep=";", decimal=",")
    turbidity = pd.read_csv(LAB / "turbidity_bench_2025.txt", sep="\t")
    conductivity = pd.read_csv(LAB / "conductivity_legacy_2025.csv", encoding="latin-1")
    conductivity = conductivity.rename(columns={"conductivity_µS/cm": "conductivity_us_cm"})

    merged = (
        nitrate[["sample_id", "station_code", "sampled_on", "nitrate_mg_l", "nitrite_mg_l"]]
        .merge(ions[["sample_id", "chloride_mg_l", "sulfate_mg_l", "phosphate_mg_l"]],
               on="sample_id", how="left")
        .merge(turbidity[["sample_id", "turbidity_ntu"]], on="sample_id", how="left")
        .merge(conductivity[["sample_id", "conductivity_us_cm"]], on="sample_id", how="left")
    )

    os.makedirs(os.path.dirname(args.out), exist_ok=True)
    merged.to_csv(args.out, index=False)
    print(f"wrote {len(merged)} samples to {args.out}")


if __name__ == "__main__":
    main()
