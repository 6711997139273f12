"""Plan tomorrow's bake: loaves per recipe, flour needed and oven slots.

Sums the wholesale orders due on each day and the web pickups, and converts loaves into kilograms of
flour with each recipe's loaf weight and hydration. One oven slot holds forty loaves.

Reads   orders/wholesale_orders_2026.csv
        orders/web_orders.ndjson
        recipes/recipe_book.json
Writes  derived/production_plan.csv
"""
import json

import pandas as pd

SLOT_LOAVES = 40


def main():
    wholesale = pd.read_csv("orders/wholesale_orders_2026.csv", parse_dates=["due_date"])
    web = pd.read_json("orders/web_orders.ndjson", lines=True)
    with open("recipes/recipe_book.json") as f:
        recipes = pd.DataFrame(json.load(f))

    due = wholesale.groupby(["due_date", "recipe_code"])["loaves"].sum().reset_index()
    plan = due.merge(recipes[["recipe_code", "loaf_name", "loaf_weight_g", "hydration_pct"]], on="recipe_code")
    plan["flour_kg"] = (plan["loaves"] * plan["loaf_weight_g"] / 1000 / (1 + plan["hydration_pct"] / 100)).round(1)
    plan["oven_slots"] = -(-plan["loaves"] // SLOT_LOAVES)
    plan = plan.rename(columns={"due_date": "plan_date", "loaves": "loaves_planned"})
    plan[["plan_date", "recipe_code", "loaf_name", "loaves_planned", "flour_kg", "oven_slots"]].to_csv(
        "derived/production_plan.csv", index=False)
    print(f"planned {len(plan)} recipe-days; web pickups: {len(web)}")


if __name__ == "__main__":
    main()
