"""Bar chart of the season's germination rates for the newsletter."""
import matplotlib.pyplot as plt
import pandas as pd

season = pd.read_csv("work/season.csv")
fig, ax = plt.subplots()
ax.bar(season["variety_name"], season["mean_rate"])
fig.savefig("figures/season_rates.png")
