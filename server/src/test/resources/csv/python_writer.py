"""Writes one CSV per dialect with Python's csv module, and the cells Python reads back.

Usage: python3 python_writer.py OUT_DIR [RANDOM_COUNT SEED]
For each dialect NAME it writes OUT_DIR/NAME.csv with csv.writer and OUT_DIR/NAME.json with
{"delimiter", "quotechar", "escapechar", "doublequote", "lineterminator", "rows"}, where rows
is what csv.reader gives back with the same dialect: the reference the Java parser must match.
The rows are invented; they carry the characters that make each dialect observable.
With RANDOM_COUNT, it also writes random_N.csv/.json: random tables (seeded) in random
dialects, for an accuracy figure over many files rather than six.
"""
import csv
import json
import os
import random
import sys

ROWS = [
    ["id", "name", "amount", "joined", "note"],
    [1, "Smith, Anna", 12.5, "2023-01-02", 'said "hi"'],
    [2, "Lee", 7.25, "2023-01-03", "two\nlines"],
    [3, "O'Brien", -3.0, "2023-01-04", "semi;colon|pipe\ttab"],
    [4, "Nakamura", 0.125, "2023-01-05", "plain"],
    [5, "M\u00fcller", 1000, "2023-01-06", "back\\slash"],
    [6, "Okafor", 3.5, "2023-02-10", ""],
    [7, "Silva", 99.99, "2023-03-15", "a 'quoted' word"],
    [8, "Haddad", 42, "2023-04-20", "x"],
]

DIALECTS = {
    "comma_minimal": dict(delimiter=",", quotechar='"', quoting=csv.QUOTE_MINIMAL),
    "semicolon": dict(delimiter=";", quotechar='"', quoting=csv.QUOTE_MINIMAL),
    "tab": dict(delimiter="\t", quotechar='"', quoting=csv.QUOTE_MINIMAL, lineterminator="\n"),
    "pipe_quote_all": dict(delimiter="|", quotechar='"', quoting=csv.QUOTE_ALL),
    "backslash_escape": dict(delimiter=",", quotechar='"', escapechar="\\", doublequote=False),
    "single_quote": dict(delimiter=",", quotechar="'", quoting=csv.QUOTE_MINIMAL),
}


WORDS = ["alpha", "beta", "Gamma Ray", "delta", "x", "O'Neil", "semi;colon", "pipe|bar",
         "comma, here", 'say "yes"', "tab\there", "new\nline", "back\\slash", "colon: yes",
         "caf\u00e9", "na\u00efve", ""]


def random_cell(rng, kind):
    if kind == "int":
        return rng.randint(-5000, 5000)
    if kind == "float":
        return round(rng.uniform(-1000, 1000), rng.randint(1, 4))
    if kind == "date":
        return "20%02d-%02d-%02d" % (rng.randint(0, 30), rng.randint(1, 12), rng.randint(1, 28))
    if kind == "bool":
        return rng.choice(["true", "false"])
    return rng.choice(WORDS)


def random_tables(out_dir, count, seed):
    rng = random.Random(seed)
    for n in range(count):
        delimiter = rng.choice([",", ";", "\t", "|", ":"])
        quotechar = rng.choice(['"', '"', "'"])
        options = dict(delimiter=delimiter, quotechar=quotechar,
                       quoting=rng.choice([csv.QUOTE_MINIMAL, csv.QUOTE_MINIMAL, csv.QUOTE_ALL,
                                           csv.QUOTE_NONNUMERIC]),
                       lineterminator=rng.choice(["\r\n", "\n"]))
        if rng.random() < 0.3:
            options.update(escapechar="\\", doublequote=False)
        kinds = [rng.choice(["int", "float", "date", "bool", "text", "text"])
                 for _ in range(rng.randint(2, 8))]
        rows = [["col%d" % (i + 1) for i in range(len(kinds))]]
        for _ in range(rng.randint(5, 60)):
            rows.append([random_cell(rng, k) for k in kinds])
        write(out_dir, "random_%03d" % n, options, rows)


def write(out_dir, name, options, rows):
    path = os.path.join(out_dir, name + ".csv")
    with open(path, "w", newline="", encoding="utf-8") as f:
        csv.writer(f, **options).writerows(rows)
    reader_options = {k: v for k, v in options.items() if k not in ("lineterminator", "quoting")}
    with open(path, newline="", encoding="utf-8") as f:
        read = list(csv.reader(f, **reader_options))
    dialect = csv.writer(open(os.devnull, "w"), **options).dialect
    with open(os.path.join(out_dir, name + ".json"), "w", encoding="utf-8") as f:
        json.dump({
            "delimiter": dialect.delimiter,
            "quotechar": dialect.quotechar,
            "escapechar": dialect.escapechar,
            "doublequote": dialect.doublequote,
            "lineterminator": dialect.lineterminator,
            "rows": read,
        }, f)


def main(out_dir, count=0, seed=0):
    for name, options in DIALECTS.items():
        write(out_dir, name, options, ROWS)
    random_tables(out_dir, count, seed)


if __name__ == "__main__":
    if len(sys.argv) > 2:
        main(sys.argv[1], int(sys.argv[2]), int(sys.argv[3]))
    else:
        main(sys.argv[1])
