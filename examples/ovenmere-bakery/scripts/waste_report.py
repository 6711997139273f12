"""Waste report: loaves returned unsold by the shops, as a percentage of loaves sold, per recipe and month.

Reads   orders/wholesale_orders_2026.csv
        waste/unsold_returns.csv
Writes  derived/waste_rate.csv
        reports/figures/waste_by_loaf.png
"""
import pandas as pd
import matplotlib

matplotlib.use("Agg")
import matplotlib.pyplot as plt


def main():
    orders = pd.read_csv("orders/wholesale_orders_2026.csv")
    returns = pd.read_csv("waste/unsold_returns.csv")
    orders["month"] = orders["order_date"].str[:7]
    returns["month"] = returns["return_date"].str[:7]
    sold = orders.groupby(["recipe_code", "month"])["loaves"].sum().rename("loaves_sold")
    back = returns.groupby(["recipe_code", "month"])["loaves_returned"].sum()
    rate = pd.concat([sold, back], axis=1).fillna(0).reset_index()
    rate["waste_pct"] = (100 * rate["loaves_returned"] / rate["loaves_sold"]).round(1)
    rate.to_csv("derived/waste_rate.csv", index=False)

    fig, ax = plt.subplots(figsize=(6, 4))
    rate.groupby("recipe_code")["waste_pct"].mean().plot.bar(ax=ax)
    ax.set_title("Returned loaves as percent of sold, by recipe")
    fig.savefig("reports/figures/waste_by_loaf.png")


if __name__ == "__main__":
    main()
