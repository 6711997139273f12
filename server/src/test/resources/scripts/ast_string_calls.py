"""Reference lister for Headwater's tests: every call whose first argument is a string literal.

Uses only Python's own ast module. For each .py file (and each code cell of an .ipynb, with IPython
magic and shell lines blanked as Jupyter would not pass them to Python) it prints one JSON object per
call: file, cell (or null), line, the function as written, the qualified name when the function is an
imported name (import aliases followed), and the called name's last part. Calls under a constant-false
test (`if False:`, `if 0:`, `while False:`) are left out: that code never runs.
"""
import ast
import builtins
import json
import sys

PYTHON_CELL_MAGICS = {"time", "timeit", "capture", "prun", "memit"}


def aliases(tree):
    out = {}
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            for a in node.names:
                if a.asname:
                    out[a.asname] = a.name
                else:
                    out[a.name.split(".")[0]] = a.name.split(".")[0]
        elif isinstance(node, ast.ImportFrom) and node.module and node.level == 0:
            for a in node.names:
                out[a.asname or a.name] = node.module + "." + a.name
    return out


def dotted(expr):
    parts = []
    while isinstance(expr, ast.Attribute):
        parts.append(expr.attr)
        expr = expr.value
    if isinstance(expr, ast.Name):
        parts.append(expr.id)
        return list(reversed(parts))
    return None


def false_constant(test):
    return isinstance(test, ast.Constant) and not test.value


class Lister(ast.NodeVisitor):
    def __init__(self, names, file, cell):
        self.names, self.file, self.cell, self.out = names, file, cell, []

    def visit_If(self, node):
        self.visit(node.test)
        if not false_constant(node.test):
            for s in node.body:
                self.visit(s)
        for s in node.orelse:
            self.visit(s)

    def visit_While(self, node):
        if not false_constant(node.test):
            self.generic_visit(node)

    def visit_Call(self, node):
        first = node.args[0] if node.args else None
        if isinstance(first, ast.Constant) and isinstance(first.value, str):
            parts = dotted(node.func)
            qualified = None
            if parts and parts[0] in self.names:
                qualified = ".".join([self.names[parts[0]]] + parts[1:])
            elif parts and len(parts) == 1 and hasattr(builtins, parts[0]):
                qualified = "builtins." + parts[0]
            method = node.func.attr if isinstance(node.func, ast.Attribute) else parts[-1] if parts else None
            self.out.append({"file": self.file, "cell": self.cell, "line": node.lineno,
                             "written": ast.unparse(node.func), "qualified": qualified, "method": method})
        self.generic_visit(node)


def blank_magics(source):
    lines = source.split("\n")
    if lines and lines[0].strip().startswith("%%"):
        if lines[0].strip()[2:].split()[0] not in PYTHON_CELL_MAGICS:
            return None
        lines[0] = ""
    return "\n".join("" if l.lstrip().startswith(("%", "!")) else l for l in lines)


def units(path):
    if path.endswith(".ipynb"):
        nb = json.load(open(path, encoding="utf-8"))
        for i, cell in enumerate(nb["cells"]):
            if cell["cell_type"] == "code":
                src = cell["source"] if isinstance(cell["source"], str) else "".join(cell["source"])
                code = blank_magics(src)
                if code is not None:
                    yield i, code
    else:
        yield None, open(path, encoding="utf-8").read()


def main(paths):
    for path in paths:
        pieces = list(units(path))
        names = {}
        for _, code in pieces:
            names.update(aliases(ast.parse(code)))
        for cell, code in pieces:
            lister = Lister(names, path, cell)
            lister.visit(ast.parse(code))
            for row in lister.out:
                print(json.dumps(row))


if __name__ == "__main__":
    main(sys.argv[1:])
