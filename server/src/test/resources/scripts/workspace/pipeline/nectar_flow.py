"""Daily nectar flow per hive from the long weight table."""
import sqlite3
import sys

import matplotlib.pyplot as plt
import polars as pl
import pyarrow.parquet as pq
import seaborn as sns
import pandas as pd

source = sys.argv[1] if len(sys.argv) > 1 else "work/weights.parquet"
daily = pl.read_parquet(source)
daily.write_csv("work/nectar_daily.csv")

con = sqlite3.connect("work/coop.db")
inspections = pd.read_sql("SELECT hive_id, brood_frames FROM hive_inspections WHERE season = 2024", con)
inspections.to_sql("inspections_copy", con)

table = pq.read_table("work/weights_long.parquet")
pq.write_table(table, "work/weights_copy.parquet")

fig, ax = plt.subplots()
fig.savefig("reports/nectar_flow.png")
plt.savefig("reports/nectar_flow_current.pdf")
grid = sns.catplot(data=inspections, x="hive_id", y="brood_frames")
grid.savefig("reports/brood_frames.svg")

summary = make_summary(daily)
summary.to_csv("work/nectar_summary.csv")
