"""Stack the weekly tray sheets into one table."""
import pandas as pd

WEEKS = [1, 2]

frames = []
for week in WEEKS:
    frames.append(pd.read_csv(f"raw/trays/week={week:02d}/trays.csv"))
trays = pd.concat(frames, ignore_index=True)
trays = trays[["tray_id", "variety_id", "sown_on", "seeds_sown", "seeds_sprouted"]]
trays.to_csv("work/trays_all.csv", index=False)
