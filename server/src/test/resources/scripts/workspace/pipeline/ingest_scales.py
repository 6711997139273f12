"""Collect the hive-scale exports of each apiary into one long table."""
import argparse
import json
import os
import pickle
from pathlib import Path

import numpy as np
import pandas as pd
from pandas import read_csv as rc

from settings import RAW, SCALES_DIR, SEASON

parser = argparse.ArgumentParser()
parser.add_argument("--apiaries", nargs="+", default=["north", "south", "east"])
parser.add_argument("--out", default="work/weights.parquet")
args = parser.parse_args()

frames = []
for apiary in args.apiaries:
    frames.append(pd.read_csv(os.path.join(SCALES_DIR, f"apiary={apiary}", "readings.csv")))
weights = pd.concat(frames, ignore_index=True)

with open(Path(__file__).parent / "hive_registry.json") as fh:
    registry_rows = json.load(fh)

for quarter in range(1, 5):
    rc(f"raw/weather/q{quarter}_{SEASON}.csv")

calibration = np.loadtxt(os.path.join(os.path.dirname(__file__), "..", RAW, "calibration.txt"))
sensor = pd.read_json("{}/sensor_{:03d}.json".format(RAW, 7))
# old = pd.read_csv("raw/old_scales.csv")
if False:
    legacy = pd.read_excel("raw/legacy_scales.xlsx")
if 0:
    pd.read_csv("raw/never_used.csv")
extra = pd.read_csv(os.environ["BRAMBLECOMBE_EXTRA"])

hives = rc(RAW + "/hives.csv")
weights = weights.rename(columns={"w_kg": "weight_kg"})
weights["weight_lb"] = weights["weight_kg"] * 2.20462
weights = weights.merge(hives[["hive_id", "queen_year"]], on="hive_id", how="left")
weights = weights[["hive_id", "ts", "weight_kg", "weight_lb", "queen_year"]]
weights.to_parquet(args.out)

pickle.dump(calibration, open("work/calibration.pkl", "wb"))
Path("work/ingest_note.txt").write_text("done\n")
