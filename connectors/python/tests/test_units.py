"""Small pieces: the hook and exclusion tables, argument helpers,
deduplication."""

import os
import sys
import textwrap
import unittest

from tests import support
from tests.support import io_table
from headwater import capture, hooks

DIRECTIONS = {"read", "write", "delete", "rename_from", "rename_to", "by_mode"}
OPTIONS = {"mode", "frame", "suffix", "skip_if_kw"}


class HookTable(unittest.TestCase):
    def test_rows_are_well_formed(self):
        for row in hooks.HOOKS:
            self.assertEqual(len(row), 6, row)
            module, attribute, position, keyword, direction, options = row
            self.assertIsInstance(module, str)
            self.assertIsInstance(attribute, str)
            self.assertTrue(position == hooks.RETURN or isinstance(position, int), row)
            self.assertTrue(keyword is None or isinstance(keyword, str), row)
            self.assertIn(direction, DIRECTIONS, row)
            self.assertLessEqual(set(options), OPTIONS, row)
            if direction == "by_mode":
                self.assertIn("mode", options)
            if "frame" in options:
                self.assertIn(options["frame"], ("return", "arg0"))

    def test_required_hooks_present(self):
        names = set((m, a) for m, a, _, _, _, _ in hooks.HOOKS)
        for needed in [("builtins", "open"), ("pathlib", "Path.read_text"), ("pathlib", "Path.read_bytes"),
                       ("pathlib", "Path.write_text"), ("pathlib", "Path.write_bytes"), ("pathlib", "Path.open"),
                       ("os", "rename"), ("os", "replace"), ("os", "remove"), ("os", "unlink"),
                       ("shutil", "copy"), ("shutil", "copy2"), ("shutil", "copyfile"), ("shutil", "move"),
                       ("pandas", "read_csv"), ("pandas", "DataFrame.to_csv"), ("numpy", "load"),
                       ("numpy", "save"), ("numpy", "loadtxt"), ("numpy", "savetxt"),
                       ("pyarrow.parquet", "read_table"), ("pyarrow.parquet", "write_table"),
                       ("polars", "read_csv"), ("polars", "DataFrame.write_parquet"),
                       ("matplotlib.pyplot", "savefig"), ("matplotlib.figure", "Figure.savefig")]:
            self.assertIn(needed, names)

    def test_groups_fold_rows(self):
        groups = hooks.groups()
        copy = [g for g in groups["shutil"] if g.attribute == "copy"][0]
        self.assertEqual(copy.paths, [(0, "src", "read"), (hooks.RETURN, None, "write")])
        self.assertEqual(copy.via, "shutil.copy")

    def test_stdlib_signatures_match_the_table(self):
        # The keyword names in the table are the functions' own parameter
        # names (Python docs / inspect.signature of the stdlib).
        import inspect
        import pathlib
        import shutil

        modules = {"os": os, "shutil": shutil, "pathlib": pathlib, "builtins": __builtins__}
        for module, attribute, position, keyword, _, _ in hooks.HOOKS:
            if module not in modules or keyword in (None, "self"):
                continue
            owner = modules[module]
            if isinstance(owner, dict):
                owner = sys.modules["builtins"]
            obj = owner
            for part in attribute.split("."):
                obj = getattr(obj, part)
            try:
                params = list(inspect.signature(obj).parameters)
            except (TypeError, ValueError):
                continue
            self.assertEqual(params[position], keyword, (module, attribute))


class Exclusion(unittest.TestCase):
    def setUp(self):
        self.ex = hooks.Excluder(hooks.EXCLUDE, "/opt/hw/headwater", "/home/u/.headwater/spool.ndjson")

    def test_interpreter_files(self):
        ex = self.ex
        self.assertTrue(ex.excluded("/home/u/proj/mod.py", "read"))
        self.assertFalse(ex.excluded("/home/u/proj/generated.py", "write"))
        self.assertTrue(ex.excluded("/home/u/proj/__pycache__/mod.cpython-311.pyc", "read"))
        self.assertTrue(ex.excluded("/home/u/venv/lib/python3.11/site-packages/x/data.csv", "read"))
        self.assertTrue(ex.excluded("/usr/lib/python3/dist-packages/matplotlib/mpl-data/matplotlibrc", "read"))
        self.assertTrue(ex.excluded("/proc/self/status", "read"))
        self.assertTrue(ex.excluded("/dev/null", "write"))
        self.assertTrue(ex.excluded(os.path.join(sys.prefix, "lib", "x.txt"), "read"))
        self.assertTrue(ex.excluded("/opt/hw/headwater/capture.py", "read"))
        self.assertTrue(ex.excluded("/home/u/.headwater/spool.ndjson", "write"))
        self.assertTrue(ex.excluded("/home/u/.headwater/spool.ndjson.lock", "write"))

    def test_data_files(self):
        ex = self.ex
        for path in ("/home/u/proj/data.csv", "/tmp/run/out.png", "/home/u/.headwater-data/x.csv",
                     "/procdata/x.csv", "/etc2/x.csv", "/home/u/proj/site-packages.csv", "/data/sys.csv"):
            self.assertFalse(ex.excluded(path, "read"), path)

    def test_extra_dirs(self):
        ex = hooks.Excluder(hooks.EXCLUDE, "/p", "/home/u/.headwater/spool.ndjson", ["/scratch/cache"])
        self.assertTrue(ex.excluded("/scratch/cache/a.bin", "write"))
        self.assertFalse(ex.excluded("/scratch/cache2/a.bin", "write"))


class Helpers(unittest.TestCase):
    def test_mode_directions(self):
        # Python docs, built-in open(): mode characters.
        cases = {"r": ("read",), "rb": ("read",), "rt": ("read",), "w": ("write",), "wb": ("write",),
                 "x": ("write",), "a": ("write",), "ab": ("write",), "r+": ("read", "write"),
                 "rb+": ("read", "write"), "w+": ("write",), "a+": ("read", "write"), "x+": ("write",)}
        for mode, expected in cases.items():
            self.assertEqual(capture.mode_directions(mode), expected, mode)

    def test_exit_status_like_the_interpreter(self):
        # Python docs, sys.exit(); and the status a child really ends with.
        for value in (None, 0, 3, 255, "message", True):
            done = support.run([support.PY, "-c", "import sys; sys.exit(%r)" % (value,)], support.base_env())
            self.assertEqual(capture.exit_status(value), done.returncode, value)

    def test_as_path(self):
        import pathlib

        self.assertEqual(capture.as_path("a.csv"), "a.csv")
        self.assertEqual(capture.as_path(b"a.csv"), "a.csv")
        self.assertEqual(capture.as_path(pathlib.Path("d") / "a.csv"), os.path.join("d", "a.csv"))
        self.assertEqual(capture.as_path("file:///tmp/a%20b.csv"), "/tmp/a b.csv")
        for not_a_path in (3, None, "", "https://example.invalid/x.csv", "s3://bucket/key",
                           "a,b\n1,2\n", object()):
            self.assertIsNone(capture.as_path(not_a_path), not_a_path)

    def test_timestamps(self):
        self.assertRegex(capture.utc_now(), r"^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$")


class Dedup(support.TempDirTest):
    def test_last_hash_first_time(self):
        self.write("f.txt", "one")
        script = self.write("d.py", textwrap.dedent("""
            import time
            open("f.txt").read()
            time.sleep(0.01)
            open("f.txt", "w").write("two!")
            open("f.txt").read()
            open("f.txt", "w").write("three")
        """))
        server = self.server()
        self.run_captured(server, script)
        record = self.only_record(server)
        table = io_table(record)
        path = self.path("f.txt")
        self.assertEqual(len(record["io"]), 2)
        self.assertEqual(table[(path, "read")]["sha256"], support.sha256(b"two!"))
        self.assertEqual(table[(path, "read")]["bytes"], 4)
        self.assertEqual(table[(path, "write")]["sha256"], support.sha256(b"three"))
        self.assertLess(table[(path, "read")]["at"], table[(path, "write")]["at"])

    def test_hash_cap(self):
        self.write("big.bin", b"x" * 5000)
        script = self.write("c.py", "open('big.bin', 'rb').read()\nopen('copy.bin', 'wb').write(b'y' * 5000)\n")
        server = self.server()
        self.run_captured(server, script, HEADWATER_HASH_CAP="4096")
        table = io_table(self.only_record(server))
        self.assertEqual(table[(self.path("big.bin"), "read")]["bytes"], 5000)
        self.assertIsNone(table[(self.path("big.bin"), "read")]["sha256"])
        # Outputs are always hashed.
        self.assertEqual(table[(self.path("copy.bin"), "write")]["sha256"], support.sha256(b"y" * 5000))

    def test_directory_copy_and_removal(self):
        self.write("tree/a.txt", "a")
        self.write("tree/sub/b.txt", "bb")
        script = self.write("t.py", "import shutil\nshutil.copytree('tree', 'tree2')\nshutil.rmtree('tree')\n")
        server = self.server()
        self.run_captured(server, script)
        table = io_table(self.only_record(server))
        p = self.path
        self.assertEqual(set(table), {
            (p("tree/a.txt"), "read"), (p("tree/sub/b.txt"), "read"),
            (p("tree2/a.txt"), "write"), (p("tree2/sub/b.txt"), "write"),
            (p("tree/a.txt"), "delete"), (p("tree/sub/b.txt"), "delete"),
        })
        self.assertEqual(table[(p("tree2/sub/b.txt"), "write")]["sha256"], support.sha256(b"bb"))


if __name__ == "__main__":
    unittest.main()


class ImportWatching(support.TempDirTest):
    def test_modules_from_one_zip_loader(self):
        # zipimport serves every module of an archive with one loader
        # object; only the watched module gets wrapped, once.
        import zipfile

        archive = self.path("libs.zip")
        with zipfile.ZipFile(archive, "w") as z:
            z.writestr("polars/__init__.py", "import helperlib\ndef read_csv(source):\n    return open(source).read()\n")
            z.writestr("helperlib.py", "def read_csv(source):\n    return open(source).read()\n")
        data = self.write("z.csv", "a\n")
        script = self.write("z.py", textwrap.dedent("""
            import sys
            sys.path.insert(0, sys.argv[1])
            import polars, helperlib
            print(hasattr(polars.read_csv, "__wrapped__"), hasattr(helperlib.read_csv, "__wrapped__"))
            polars.read_csv("z.csv")
        """))
        server = self.server()
        done = self.run_captured(server, script, archive)
        self.assertEqual(done.stdout, b"True False\n", done.stderr)
        table = io_table(self.only_record(server))
        self.assertEqual(table[(data, "read")]["via"], "polars.read_csv")

    def test_undecodable_argument_still_delivered(self):
        script = self.write("u.py", "pass\n")
        server = self.server()
        env = support.with_connector_path(support.capture_env(server.url, self.spool))
        done = support.run([support.PY.encode(), b"-m", b"headwater", b"run", script.encode(), b"caf\xe9"],
                           env, cwd=self.dir)
        self.assertEqual(done.returncode, 0, done.stderr)
        self.assertEqual(self.only_record(server)["args"], ["caf\udce9"])


class Faults(support.TempDirTest):
    def test_connector_fault_logged_once_script_goes_on(self):
        self.write("f.txt", "x")
        script = self.write("fault.py", textwrap.dedent("""
            import headwater.capture as c
            def broken(self, *args):
                raise RuntimeError("simulated connector bug")
            c.Session._after_read = broken
            for _ in range(5):
                print(open("f.txt").read())
        """))
        server = self.server()
        done = self.run_captured(server, script)
        self.assertEqual(done.returncode, 0)
        self.assertEqual(done.stdout, b"x\n" * 5)
        lines = done.stderr.decode().splitlines()
        self.assertEqual(len(lines), 1, lines)
        self.assertIn("internal error in recording builtins.open", lines[0])
        self.assertIn("simulated connector bug", lines[0])
        self.assertEqual(len(server.records), 1)

    def test_exclude_variable(self):
        self.write("scratch/a.txt", "a")
        kept = self.write("data/b.txt", "b")
        script = self.write("x.py", "open('scratch/a.txt').read()\nopen('data/b.txt').read()\n")
        server = self.server()
        self.run_captured(server, script, HEADWATER_EXCLUDE=self.path("scratch"))
        self.assertEqual(list(io_table(self.only_record(server))), [(kept, "read")])
