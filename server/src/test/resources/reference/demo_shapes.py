"""Reference reading of a workspace with Python's standard csv and json modules.

Prints one JSON object: for every file that is not a script, its workspace-relative name, its column
names and its row or record count. Tests compare Headwater's harvest with this, so the expected
numbers come from the files through an independent reader, not from Headwater's own code.

Decisions (kept deliberately simple, and different in kind from Headwater's detector):
- Text files ending in .csv, .tsv or .txt are tables when some delimiter among , ; TAB | makes
  csv.reader give every non-empty record the same number of fields, more than one. If several do,
  the one giving the most fields wins.
- Text is UTF-8 (a BOM is dropped), else Latin-1.
- JSON: a list of objects, or an object holding a list of objects, or one object per line (.ndjson).
  Field paths use dots for nesting and [] for lists, as the union over all records.
"""
import csv
import io
import json
import os
import sys

SCRIPT_ENDINGS = {".py", ".r", ".rmd", ".qmd", ".sql", ".ipynb", ".sh"}
TABLE_ENDINGS = {".csv", ".tsv", ".txt"}


def read_text(path):
    raw = open(path, "rb").read()
    try:
        return raw.decode("utf-8-sig")
    except UnicodeDecodeError:
        return raw.decode("latin-1")


def table_shape(text):
    best = None
    for delimiter in [",", ";", "\t", "|"]:
        rows = [r for r in csv.reader(io.StringIO(text, newline=""), delimiter=delimiter) if r]
        if len(rows) < 2:
            continue
        widths = {len(r) for r in rows}
        if len(widths) == 1 and rows[0] and len(rows[0]) > 1:
            if best is None or len(rows[0]) > len(best[0]):
                best = (rows[0], len(rows) - 1)
    return best


def paths(value, prefix, out):
    if isinstance(value, dict):
        for key, inner in value.items():
            paths(inner, prefix + "." + key if prefix else key, out)
    elif isinstance(value, list):
        if not value:
            out.append(prefix + "[]")
        for inner in value:
            paths(inner, prefix + "[]", out)
    else:
        out.append(prefix if prefix else "value")


def json_shape(text, lines):
    if lines:
        records = [json.loads(line) for line in text.splitlines() if line.strip()]
    else:
        data = json.loads(text)
        if isinstance(data, dict):
            data = next((v for v in data.values() if isinstance(v, list) and v and isinstance(v[0], dict)), [])
        records = data
    names = []
    for record in records:
        found = []
        paths(record, "", found)
        for name in found:
            if name not in names:
                names.append(name)
    return names, len(records)


def main(root):
    result = {}
    for folder, subfolders, files in os.walk(root):
        subfolders[:] = sorted(d for d in subfolders if not d.startswith("."))
        for name in sorted(files):
            if name.startswith("."):
                continue
            path = os.path.join(folder, name)
            rel = os.path.relpath(path, root).replace(os.sep, "/")
            ending = os.path.splitext(name)[1].lower()
            if ending in SCRIPT_ENDINGS:
                continue
            entry = {"columns": [], "rows": None}
            if ending in TABLE_ENDINGS:
                shape = table_shape(read_text(path))
                if shape:
                    entry = {"columns": [c.strip() for c in shape[0]], "rows": shape[1]}
            elif ending in (".json", ".ndjson", ".jsonl"):
                names, count = json_shape(read_text(path), ending != ".json")
                entry = {"columns": names, "rows": count}
            result[rel] = entry
    json.dump(result, sys.stdout, indent=1, sort_keys=True)


if __name__ == "__main__":
    main(sys.argv[1])
