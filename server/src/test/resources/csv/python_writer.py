"""Writes one CSV per dialect with Python's csv module, and the cells Python reads back.

Usage: python3 python_writer.py OUT_DIR
For each dialect NAME it writes OUT_DIR/NAME.csv with csv.writer and OUT_DIR/NAME.json with
{"delimiter", "quotechar", "escapechar", "doublequote", "lineterminator", "rows"}, where rows
is what csv.reader gives back with the same dialect: the reference the Java parser must match.
The rows are invented; they carry the characters that make each dialect observable.
"""
import csv
import json
import os
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


def main(out_dir):
    for name, options in DIALECTS.items():
        path = os.path.join(out_dir, name + ".csv")
        with open(path, "w", newline="", encoding="utf-8") as f:
            csv.writer(f, **options).writerows(ROWS)
        reader_options = {k: v for k, v in options.items() if k != "lineterminator"}
        with open(path, newline="", encoding="utf-8") as f:
            rows = list(csv.reader(f, **reader_options))
        dialect = csv.writer(open(os.devnull, "w"), **options).dialect
        with open(os.path.join(out_dir, name + ".json"), "w", encoding="utf-8") as f:
            json.dump({
                "delimiter": dialect.delimiter,
                "quotechar": dialect.quotechar,
                "escapechar": dialect.escapechar,
                "doublequote": dialect.doublequote,
                "lineterminator": dialect.lineterminator,
                "rows": rows,
            }, f)


if __name__ == "__main__":
    main(sys.argv[1])
