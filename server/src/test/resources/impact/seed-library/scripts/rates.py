"""Germination rate per variety."""
import pandas as pd

trays = pd.read_csv("work/trays_enriched.csv")
trays["germination_rate"] = trays["seeds_sprouted"] / trays["seeds_sown"]
rates = trays.groupby("variety_name").agg(mean_rate=("germination_rate", "mean")).reset_index()
rates.to_csv("work/rates.csv", index=False)
