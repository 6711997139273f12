"""The season table: rate per variety with its count of poor trays."""
import pandas as pd

rates = pd.read_csv("work/rates.csv")
low = pd.read_csv("work/low_trays.csv")
poor = low.groupby("variety_name").agg(poor_trays=("tray_id", "count")).reset_index()
season = rates.merge(poor, on="variety_name", how="left")
season = season[["variety_name", "mean_rate", "poor_trays"]]
season.to_csv("work/season.csv", index=False)
