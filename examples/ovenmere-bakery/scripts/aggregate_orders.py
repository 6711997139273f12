"""Monthly order totals per shop account: number of orders, loaves and revenue in cents.

Reads   orders/wholesale_orders_2026.csv
        orders/shop_accounts.csv
Writes  derived/orders_by_shop_monthly.csv
"""
import pandas as pd


def main():
    orders = pd.read_csv("orders/wholesale_orders_2026.csv", parse_dates=["order_date"])
    shops = pd.read_csv("orders/shop_accounts.csv")
    orders = orders[orders["shop_code"].isin(shops["shop_code"])]
    orders["month"] = orders["order_date"].dt.strftime("%Y-%m")
    orders["revenue_cents"] = orders["loaves"] * orders["unit_price_cents"]
    monthly = (orders.groupby(["shop_code", "month"])
               .agg(orders=("order_id", "count"), loaves=("loaves", "sum"), revenue_cents=("revenue_cents", "sum"))
               .reset_index())
    monthly.to_csv("derived/orders_by_shop_monthly.csv", index=False)


if __name__ == "__main__":
    main()
