"""Attach each tray's variety name and family."""
import pandas as pd

trays = pd.read_csv("work/trays_all.csv")
varieties = pd.read_csv("raw/varieties.csv")
enriched = trays.merge(varieties[["variety_id", "variety_name", "family"]], on="variety_id", how="left")
enriched = enriched[["tray_id", "variety_name", "family", "seeds_sown", "seeds_sprouted"]]
enriched.to_csv("work/trays_enriched.csv", index=False)
