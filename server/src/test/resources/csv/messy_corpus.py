"""Writes a corpus of messy delimited files with their ground truth, and what Python's csv.Sniffer makes of each.

Usage: python3 messy_corpus.py OUT_DIR COUNT SEED
Writes OUT_DIR/f_NNN.<ext> (the file), OUT_DIR/truth.json (what the generator wrote into each file) and
OUT_DIR/sniffer.json (csv.Sniffer's answers, the baseline). The tables are invented; the mess is the kind
found in team folders: preambles, no header, semicolons with decimal commas, Windows-1252 and UTF-16,
quoting styles, backslash escapes, missing-value tokens, misleading extensions.
"""
import csv
import io
import json
import os
import random
import sys

from sniffer_baseline import sniffer_answer

FIRST = ["Aru", "Bexa", "Corin", "Dalmo", "Esk", "Fenna", "Gorm", "Hild", "Ivo", "Juno"]
ACCENTED = ["Zoë", "Ãngel", "Brûlé", "Çelik", "Dømi", "Émile", "Fjóla", "Göran", "Hélo", "Iñaki"]
WORDS = ["upper reach", "weir", "north bank", "culvert", "spring", "pool 3", "side arm", "ford", "delta flat",
         "say \"yes\"", "comma, inside", "semi;colon", "pipe|bar", "tab\there", "O'Dowd", "back\\slash"]
PREAMBLES = [["# exported by the field logger"], ["Survey sheet", "Prepared for the spring round"],
             ["# site: grey hollow", "# units: metric", ""], ["Generated 2025-04-01"]]
MISSING = ["", "NA", "N/A", "NULL", "null"]


def cell(rng, kind, decimal_comma, i):
    if kind == "integer":
        return str(rng.randint(-400, 90000))
    if kind == "decimal":
        text = "%.*f" % (rng.randint(1, 3), rng.uniform(-500, 5000))
        return text.replace(".", ",") if decimal_comma else text
    if kind == "date":
        return "20%02d-%02d-%02d" % (rng.randint(0, 29), rng.randint(1, 12), rng.randint(1, 28))
    if kind == "timestamp":
        return "20%02d-%02d-%02d %02d:%02d:%02d" % (rng.randint(0, 29), rng.randint(1, 12), rng.randint(1, 28),
                                                     rng.randint(0, 23), rng.randint(0, 59), rng.randint(0, 59))
    if kind == "boolean":
        return rng.choice(["true", "false"])
    if kind == "name":
        return rng.choice(FIRST + ACCENTED)
    return rng.choice(WORDS + FIRST)


def one(rng, n, out_dir):
    delimiter = rng.choice([",", ",", ",", ";", ";", "\t", "\t", "|", ":"])
    quotechar = rng.choice(['"', '"', '"', "'"])
    quoting = rng.choice([csv.QUOTE_MINIMAL, csv.QUOTE_MINIMAL, csv.QUOTE_ALL])
    backslash = rng.random() < 0.15
    terminator = rng.choice(["\r\n", "\n"])
    encoding = rng.choice(["utf-8", "utf-8", "utf-8", "utf-8-sig", "cp1252", "cp1252", "utf-16"])
    header = rng.random() < 0.85
    preamble = rng.choice(PREAMBLES) if header and rng.random() < 0.2 else []
    decimal_comma = delimiter == ";" and rng.random() < 0.6
    kinds = ["name"] + [rng.choice(["integer", "decimal", "date", "timestamp", "boolean", "text", "text"])
                        for _ in range(rng.randint(2, 7))]
    names = ["station_name"] + ["%s_%d" % (k if k != "text" else "remark", i + 1) for i, k in enumerate(kinds[1:])]
    rows_n = rng.randint(12, 150)
    with_missing = {i for i in range(1, len(kinds)) if rng.random() < 0.25}
    rows = []
    for r in range(rows_n):
        row = [cell(rng, k, decimal_comma, r) for k in kinds]
        if encoding in ("cp1252", "utf-16") and r == 0:
            row[0] = rng.choice(ACCENTED)  # something that tells the encoding apart from ASCII
        for i in with_missing:
            if rng.random() < 0.1:
                row[i] = rng.choice(MISSING)
        rows.append(row)
    options = dict(delimiter=delimiter, quotechar=quotechar, quoting=quoting, lineterminator=terminator)
    if backslash:
        options.update(escapechar="\\", doublequote=False)
    buf = io.StringIO(newline="")
    for line in preamble:
        buf.write(line + terminator)
    writer = csv.writer(buf, **options)
    if header:
        writer.writerow(names)
    writer.writerows(rows)
    text = buf.getvalue()
    ext = rng.choice(["csv", "csv", "csv", "txt", "tsv" if delimiter == "\t" else "dat"])
    name = "f_%03d.%s" % (n, ext)
    data = text.encode(encoding)
    with open(os.path.join(out_dir, name), "wb") as f:
        f.write(data)
    # A key counts only where the file lets a careful reader tell it: a quote character that never appears,
    # or an escape that never had to be used, is not observable.
    body = "".join(text.splitlines(True)[len(preamble):])
    return name, {
        "delimiter": delimiter,
        "quote": quotechar if quotechar in body else None,
        "escape": ("backslash" if backslash else "double") if ("\\" in body or quotechar + quotechar in body) else None,
        "header": header,
        "skip_lines": len(preamble),
        "encoding": {"utf-8": "utf-8", "utf-8-sig": "utf-8", "cp1252": "windows-1252", "utf-16": "utf-16"}[encoding],
        "bom": encoding in ("utf-8-sig", "utf-16"),
        "columns": [{"name": names[i] if header else None, "type": kinds[i] if kinds[i] != "name" else "text"}
                    for i in range(len(kinds))],
        "row_count": rows_n,
    }, text


def main(out_dir, count, seed):
    rng = random.Random(seed)
    os.makedirs(out_dir, exist_ok=True)
    truth, sniffer = {}, {}
    for n in range(count):
        name, facts, text = one(rng, n, out_dir)
        truth[name] = facts
        # The baseline gets the file already decoded with the right encoding: Sniffer has no detector of its own.
        sniffer[name] = sniffer_answer(text)
    with open(os.path.join(out_dir, "truth.json"), "w", encoding="utf-8") as f:
        json.dump(truth, f, indent=1, ensure_ascii=False)
    with open(os.path.join(out_dir, "sniffer.json"), "w", encoding="utf-8") as f:
        json.dump(sniffer, f, indent=1, ensure_ascii=False)


if __name__ == "__main__":
    main(sys.argv[1], int(sys.argv[2]), int(sys.argv[3]))
