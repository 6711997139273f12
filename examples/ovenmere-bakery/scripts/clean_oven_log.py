"""Clean the weekly oven temperature logs: drop logger glitches (-999) and unknown ovens.

The chamber temperature logger writes -999 when its probe disconnects; those rows are kept but marked
valid = false so that energy figures can leave them out.

Reads   ovens/readings/week=YYYY-Www/oven_readings.csv (one partition per ISO week)
        ovens/oven_register.csv
Writes  derived/oven_readings_clean.csv
"""
import pandas as pd

WEEKS = ["2026-W10", "2026-W11", "2026-W12"]


def main():
    frames = [pd.read_csv(f"ovens/readings/week={week}/oven_readings.csv") for week in WEEKS]
    readings = pd.concat(frames, ignore_index=True)
    register = pd.read_csv("ovens/oven_register.csv")
    readings = readings[readings["oven_id"].isin(register["oven_id"])]
    readings["valid"] = readings["chamber_temp_c"] > 0
    readings.drop(columns=["door_open_s"]).to_csv("derived/oven_readings_clean.csv", index=False)


if __name__ == "__main__":
    main()
