"""The baseline both detection scoreboards score Headwater against: Python's csv.Sniffer, handed the text
already decoded (it has no encoding detector of its own), and csv.reader in the dialect it found."""
import csv
import io


def sniffer_answer(text):
    sample = text[:65536]
    try:
        dialect = csv.Sniffer().sniff(sample)
    except csv.Error as e:
        return {"error": str(e)}
    try:
        has_header = csv.Sniffer().has_header(sample)
    except csv.Error:
        has_header = None
    rows = list(csv.reader(io.StringIO(text, newline=""), dialect))
    rows = [r for r in rows if r]
    return {
        "delimiter": dialect.delimiter,
        "quote": dialect.quotechar,
        "escape": "backslash" if dialect.escapechar == "\\" else "double" if dialect.doublequote else "none",
        "header": has_header,
        "columns": len(rows[0]) if rows else 0,
        "names": rows[0] if rows and has_header else None,
        "row_count": len(rows) - (1 if has_header else 0),
    }
