"""pandas, numpy and matplotlib through their public functions.  Skipped
when the library is missing, unless HEADWATER_REQUIRE_EXTERNAL=true."""

import os
import textwrap
import unittest
import xml.etree.ElementTree as ET

from tests import support
from tests.support import io_table

CSV = "a,b,c\n1,x,0.5\n2,y,1.5\n3,z,2.5\n"


class Pandas(support.TempDirTest):
    def setUp(self):
        super().setUp()
        support.require("pandas")

    def test_read_and_write_with_frames(self):
        pd = support.require("pandas")
        src = self.write("in.csv", CSV)
        # What pandas itself reports (DataFrame.dtypes), in this process.
        text = "str" if str(pd.read_csv(src).dtypes["b"]) == "str" else "object"  # pandas >= 3: "str"
        self.assertEqual([str(d) for d in pd.read_csv(src).dtypes], ["int64", text, "float64"])
        script = self.write("p.py", textwrap.dedent("""
            import sys
            import pandas as pd
            df = pd.read_csv("in.csv")
            df["d"] = df["a"] * 2
            df.to_csv("out.csv", index=False)
            df[["a", "d"]].to_json("out.json")
            df["b"].to_csv("series.csv")
            print(len(df), list(df.columns))
        """))
        server = self.server()
        done = self.run_captured(server, script)
        self.assertEqual(done.returncode, 0, done.stderr)
        self.assertEqual(done.stdout, b"3 ['a', 'b', 'c', 'd']\n")
        self.assertEqual(done.stderr, b"")
        table = io_table(self.only_record(server))
        self.assertEqual(set(table), {(src, "read"), (self.path("out.csv"), "write"),
                                      (self.path("out.json"), "write"), (self.path("series.csv"), "write")})
        read = table[(src, "read")]
        self.assertEqual(read["via"], "pandas.read_csv")
        self.assertEqual(read["frame"], {"columns": ["a", "b", "c"], "dtypes": ["int64", text, "float64"],
                                         "rows": 3})
        self.assertEqual(read["sha256"], support.sha256(CSV.encode()))
        self.assertEqual(read["bytes"], len(CSV))
        out = table[(self.path("out.csv"), "write")]
        self.assertEqual(out["via"], "pandas.DataFrame.to_csv")
        self.assertEqual(out["frame"], {"columns": ["a", "b", "c", "d"],
                                        "dtypes": ["int64", text, "float64", "int64"], "rows": 3})
        self.assertEqual(out["sha256"], support.file_sha256(self.path("out.csv")))
        self.assertEqual(table[(self.path("out.json"), "write")]["frame"],
                         {"columns": ["a", "d"], "dtypes": ["int64", "int64"], "rows": 3})
        self.assertEqual(table[(self.path("series.csv"), "write")]["frame"],
                         {"columns": ["b"], "dtypes": [text], "rows": 3})
        self.assertEqual(table[(self.path("series.csv"), "write")]["via"], "pandas.Series.to_csv")

    def test_same_output_and_warnings_as_without_capture(self):
        self.write("in.csv", CSV)
        script = self.write("w.py", textwrap.dedent("""
            import warnings
            warnings.simplefilter("always")
            import pandas as pd
            df = pd.read_csv("in.csv")
            warnings.warn("from the script")
            try:
                df.to_csv("o.csv", line_terminator="\\n")   # deprecated or refused, by version
            except TypeError as e:
                print("TypeError", e)
            print(df.describe())
            pd.read_csv("missing.csv")
        """))
        plain = self.run_plain(script)
        server = self.server()
        captured = self.run_captured(server, script)
        self.assertEqual(captured.stdout, plain.stdout)
        self.assertEqual(captured.stderr, plain.stderr)
        self.assertEqual(captured.returncode, plain.returncode)
        self.assertEqual(self.only_record(server)["exception"], "FileNotFoundError")

    def test_same_file_read_twice_keeps_via_and_frame_together(self):
        src = self.write("in.csv", CSV)
        script = self.write("t.py", textwrap.dedent("""
            import pandas as pd
            pd.read_csv("in.csv", usecols=["a"])
            pd.read_csv("in.csv")
            open("in.csv").read()
        """))
        server = self.server()
        self.run_captured(server, script)
        entry = io_table(self.only_record(server))[(src, "read")]
        self.assertEqual(entry["via"], "pandas.read_csv")
        self.assertEqual(entry["frame"]["columns"], ["a", "b", "c"])

    def test_reads_a_file_object_once(self):
        src = self.write("in.csv", CSV)
        script = self.write("f.py", "import pandas as pd\nwith open('in.csv') as f:\n    pd.read_csv(f)\n")
        server = self.server()
        self.run_captured(server, script)
        table = io_table(self.only_record(server))
        self.assertEqual(list(table), [(src, "read")])
        self.assertEqual(table[(src, "read")]["via"], "builtins.open")


class Numpy(support.TempDirTest):
    def setUp(self):
        super().setUp()
        support.require("numpy")

    def test_save_load_text(self):
        script = self.write("n.py", textwrap.dedent("""
            import numpy as np
            a = np.arange(6).reshape(2, 3)
            np.save("arr", a)                 # numpy adds .npy
            b = np.load("arr.npy")
            np.savetxt("arr.txt", b)
            c = np.loadtxt("arr.txt")
            np.savez("bundle", a=a)           # numpy adds .npz
            print(int(c.sum()))
        """))
        server = self.server()
        done = self.run_captured(server, script)
        self.assertEqual(done.returncode, 0, done.stderr)
        self.assertEqual(done.stdout, b"15\n")
        table = io_table(self.only_record(server))
        p = self.path
        self.assertEqual(dict((k, v["via"]) for k, v in table.items()), {
            (p("arr.npy"), "write"): "numpy.save",
            (p("arr.npy"), "read"): "numpy.load",
            (p("arr.txt"), "write"): "numpy.savetxt",
            (p("arr.txt"), "read"): "numpy.loadtxt",
            (p("bundle.npz"), "write"): "numpy.savez",
        })
        for (path, _), entry in table.items():
            self.assertEqual(entry["sha256"], support.file_sha256(path))


class Matplotlib(support.TempDirTest):
    def setUp(self):
        super().setUp()
        support.require("matplotlib")

    SCRIPT = textwrap.dedent("""
        import matplotlib
        matplotlib.use("Agg")
        import matplotlib.pyplot as plt
        fig, ax = plt.subplots(figsize=(2, 2), dpi=50)
        ax.plot([0, 1, 2], [2, 0, 1])
        plt.savefig("plot.png")
        fig.savefig("plot.svg")
        fig.savefig("plot.pdf")
        fig.savefig("noext")            # matplotlib adds .png
        fig.savefig("other", format="svg")
        print("saved")
    """)

    def test_savefig_recorded_and_stamped(self):
        script = self.write("m.py", self.SCRIPT)
        server = self.server()
        done = self.run_captured(server, script)
        self.assertEqual(done.returncode, 0, done.stderr)
        self.assertEqual(done.stdout, b"saved\n")
        record = self.only_record(server)
        table = io_table(record)
        p = self.path
        self.assertEqual(dict((k, v["via"]) for k, v in table.items()), {
            (p("plot.png"), "write"): "matplotlib.pyplot.savefig",
            (p("plot.svg"), "write"): "matplotlib.figure.Figure.savefig",
            (p("plot.pdf"), "write"): "matplotlib.figure.Figure.savefig",
            (p("noext.png"), "write"): "matplotlib.figure.Figure.savefig",
            (p("other"), "write"): "matplotlib.figure.Figure.savefig",
        })
        for (path, _), entry in table.items():
            self.assertEqual(entry["sha256"], support.file_sha256(path), path)
            self.assertIs(entry["stamped"], path.endswith((".png", ".svg", ".pdf")), path)
        run_id = record["run_id"]
        with open(p("plot.png"), "rb") as handle:
            png = handle.read()
        self.assertTrue(all(ok for _, _, _, ok in support.png_chunks(png)))
        self.assertIn(("headwater:run", run_id), support.png_text(png))
        with open(p("plot.svg"), "rb") as handle:
            root = ET.fromstring(handle.read())
        self.assertEqual(root[0][0].text, run_id)
        with open(p("plot.pdf"), "rb") as handle:
            info, _ = support.pdf_info(handle.read())
        self.assertIn(b"/HeadwaterRun (%s)" % run_id.encode(), info)
        self.assertIn(b"/Producer (Matplotlib pdf backend", info)

        # Same pixels as the same figure saved without capture.
        plain_dir = self.path("plain")
        os.makedirs(plain_dir)
        plain = support.run([support.PY, script], support.base_env(), cwd=plain_dir)
        self.assertEqual(plain.returncode, 0, plain.stderr)
        with open(os.path.join(plain_dir, "plot.png"), "rb") as handle:
            self.assertEqual(support.decode_png(handle.read()), support.decode_png(png))
        for name in ("plot.pdf",):
            if support.tool("qpdf"):
                import subprocess

                checked = subprocess.run([support.tool("qpdf"), "--check", p(name)], stdout=subprocess.PIPE)
                self.assertEqual(checked.returncode, 0, checked.stdout)


class ArrowAndPolars(support.TempDirTest):
    """Optional libraries: run only where they are installed."""

    def test_pyarrow_parquet_and_csv(self):
        support.optional("pyarrow")
        src = self.write("in.csv", CSV)
        script = self.write("a.py", textwrap.dedent("""
            import pyarrow.csv as pcsv, pyarrow.parquet as pq
            t = pcsv.read_csv("in.csv")
            pq.write_table(t, "t.parquet")
            back = pq.read_table("t.parquet")
            print(back.num_rows)
        """))
        server = self.server()
        done = self.run_captured(server, script)
        self.assertEqual(done.stdout, b"3\n", done.stderr)
        table = io_table(self.only_record(server))
        p = self.path
        self.assertEqual(dict((k, v["via"]) for k, v in table.items()), {
            (src, "read"): "pyarrow.csv.read_csv",
            (p("t.parquet"), "write"): "pyarrow.parquet.write_table",
            (p("t.parquet"), "read"): "pyarrow.parquet.read_table",
        })
        self.assertEqual(table[(src, "read")]["frame"], {"columns": ["a", "b", "c"],
                                                         "dtypes": ["int64", "string", "double"], "rows": 3})
        self.assertEqual(table[(p("t.parquet"), "write")]["sha256"], support.file_sha256(p("t.parquet")))

    def test_polars(self):
        pl = support.optional("polars")
        src = self.write("in.csv", CSV)
        script = self.write("l.py", textwrap.dedent("""
            import polars as pl
            df = pl.read_csv("in.csv")
            df.write_parquet("o.parquet")
            print(pl.read_parquet("o.parquet").height)
        """))
        server = self.server()
        done = self.run_captured(server, script)
        self.assertEqual(done.stdout, b"3\n", done.stderr)
        table = io_table(self.only_record(server))
        expected = [str(d) for d in pl.read_csv(src).dtypes]
        self.assertEqual(table[(src, "read")]["frame"], {"columns": ["a", "b", "c"], "dtypes": expected, "rows": 3})
        self.assertEqual(table[(self.path("o.parquet"), "write")]["via"], "polars.DataFrame.write_parquet")
        self.assertEqual(table[(self.path("o.parquet"), "read")]["via"], "polars.read_parquet")


class LazyPatching(support.TempDirTest):
    def test_connector_import_does_not_import_pandas(self):
        support.require("pandas")
        script = self.write("l.py", textwrap.dedent("""
            import sys
            before = "pandas" in sys.modules
            import pandas
            print(before, pandas.read_csv.__wrapped__ is not None, pandas.read_csv.__name__)
        """))
        server = self.server()
        done = self.run_captured(server, script)
        self.assertEqual(done.stdout, b"False True read_csv\n", done.stderr)


if __name__ == "__main__":
    unittest.main()
