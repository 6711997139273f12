"""Append this season to the running log, which the script reads back and rewrites."""
import pandas as pd

log = pd.read_csv("work/running_log.csv")
season = pd.read_csv("work/season.csv")
log = pd.concat([log, season[["variety_name", "mean_rate"]]], ignore_index=True)
log.to_csv("work/running_log.csv", index=False)
