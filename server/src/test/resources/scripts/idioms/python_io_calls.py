"""Invented demo: one read or write per idiom, each with a literal path, in many syntactic places.

The ast reference test lists every call here whose first argument is a string literal; Headwater must
find each one that is a read or write in its table.
"""
import csv
import gzip
import json
import pickle
import shutil
from pathlib import Path

import matplotlib.pyplot as plt
import numpy as np
import pandas as pd
import polars as pl
import pyarrow.csv as pacsv
import pyarrow.feather as feather
import pyarrow.parquet as pq
from matplotlib import pyplot
from numpy import savetxt as write_matrix
from pandas import read_excel

LOOKUP = pd.read_csv("raw/lookup.csv")
with open("raw/notes.txt") as notes, open("work/notes_copy.txt", mode="w") as copy:
    copy.write(notes.read())
with gzip.open("raw/archive.json.gz") as packed:
    archive = json.load(packed)
rows = list(csv.reader(open("raw/plain.csv", newline="")))
json.dump(rows, open("work/plain.json", "w"))
pickle.dump(rows, open("work/plain.pkl", "wb"))
appended = open("work/log.txt", "a")
both = open("work/state.bin", "r+b")
shutil.copy("raw/template.xlsx", "work/template.xlsx")
matrix = np.loadtxt("raw/matrix.txt")
grid = np.genfromtxt("raw/grid.csv", delimiter=",")
np.save("work/matrix.npy", matrix)
write_matrix("work/matrix.txt", matrix)
stats = np.load("work/stats.npz")


def load_tables():
    sheet = read_excel("raw/sheet.xlsx", sheet_name=0)
    parquet = pd.read_parquet("raw/events.parquet")
    feathered = pd.read_feather("raw/events.feather")
    js = pd.read_json("raw/events.json", lines=True)
    return sheet, parquet, feathered, js


class Exporter:
    TEMPLATE = pd.read_table("raw/template.tsv")

    def export(self, frame):
        frame.to_csv("work/export.csv", index=False)
        frame.to_excel("work/export.xlsx")
        frame.to_json("work/export.json")
        frame.to_parquet("work/export.parquet")
        frame.to_pickle("work/export.pkl")


def decorate(fn):
    return fn


@decorate
def polars_steps():
    lazy = pl.scan_csv("raw/big.csv")
    eager = pl.read_csv("raw/small.csv")
    eager.write_parquet("work/small.parquet")
    lazy.sink_parquet("work/big.parquet")
    pl.read_ndjson("raw/lines.ndjson").write_json("work/lines.json")


def arrow_steps():
    table = pq.read_table("raw/table.parquet")
    pq.write_table(table, "work/table.parquet")
    pacsv.write_csv(pacsv.read_csv("raw/table.csv"), "work/table_copy.csv")
    feather.write_feather(table.to_pandas(), "work/table.feather")


def figures():
    plt.plot([1, 2, 3])
    plt.savefig("figures/line.png")
    fig = plt.figure()
    fig.savefig("figures/figure.svg", dpi=200)
    pyplot.savefig("figures/alias.pdf")


reader = lambda: pd.read_csv("raw/lazy_lambda.csv")
paths = [pd.read_csv("raw/in_comprehension.csv") for _ in range(2)]
text = Path("raw/readme.md").read_text()
Path("work/readme_copy.md").write_text(text)
label = f"rows: {len(pd.read_csv('raw/in_fstring.csv'))}"
try:
    backup = pd.read_csv("raw/primary.csv")
except FileNotFoundError:
    backup = pd.read_csv("raw/fallback.csv")
finally:
    print("done")
while pd.read_csv("raw/in_condition.csv").empty:
    break
if False:
    pd.read_csv("raw/unreachable.csv")
elif 0:
    pd.read_csv("raw/unreachable_too.csv")
else:
    pd.read_csv("raw/else_branch.csv")
pd.DataFrame({"a": [1]}).to_sql("demo_table", None)
pd.read_sql_table("warehouse_table", None)
