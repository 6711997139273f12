"""Trays where fewer than a quarter of the seeds sprouted."""
import pandas as pd

trays = pd.read_csv("work/trays_enriched.csv")
low = trays[trays["seeds_sprouted"] < 6]
low = low[["tray_id", "variety_name"]]
low.to_csv("work/low_trays.csv", index=False)
