"""HEADWATER_CAPTURE=1: the start-up hooks (sitecustomize.py on PYTHONPATH,
headwater_capture.pth when installed), chain-loading another sitecustomize,
and every Python process of a shell driver being captured."""

import os
import subprocess
import textwrap
import unittest
import zipfile

from tests import support
from tests.support import io_table, sha256


class EnvSwitch(support.TempDirTest):
    def env(self, server, *more_path, **extra):
        env = support.capture_env(server.url, self.spool, HEADWATER_CAPTURE="1", **extra)
        return support.with_connector_path(env, *more_path)

    def test_pythonpath_only(self):
        data = self.write("in.txt", "hello")
        script = self.write("s.py", "print(open('in.txt').read())\nopen('out.txt', 'w').write('x')\n")
        server = self.server()
        done = support.run([support.PY, script, "arg1"], self.env(server), cwd=self.dir)
        self.assertEqual(done.returncode, 0, done.stderr)
        self.assertEqual(done.stdout, b"hello\n")
        self.assertEqual(done.stderr, b"")
        record = self.only_record(server)
        self.assertEqual(record["script"]["path"], script)
        self.assertEqual(record["script"]["sha256"], support.file_sha256(script))
        self.assertEqual(record["args"], ["arg1"])
        table = io_table(record)
        self.assertEqual(set(table), {(data, "read"), (self.path("out.txt"), "write")})
        self.assertEqual(table[(self.path("out.txt"), "write")]["sha256"], sha256(b"x"))

    def test_switch_values(self):
        script = self.write("s.py", "pass\n")
        for value, captured in (("1", True), ("true", True), ("ON", True), ("0", False), ("", False)):
            server = self.server()
            env = self.env(server)
            env["HEADWATER_CAPTURE"] = value
            support.run([support.PY, script], env, cwd=self.dir)
            self.assertEqual(len(server.records), 1 if captured else 0, value)

    def test_off_imports_nothing_heavy(self):
        server = self.server()
        env = self.env(server)
        del env["HEADWATER_CAPTURE"]
        done = support.run([support.PY, "-c", "import sys; print('headwater.capture' in sys.modules)"], env)
        self.assertEqual(done.stdout, b"False\n")
        self.assertEqual(server.records, [])

    def test_capture_does_not_import_data_libraries(self):
        server = self.server()
        done = support.run([support.PY, "-c", "import sys; print(sorted(m for m in ('pandas', 'numpy', "
                            "'matplotlib', 'polars', 'pyarrow', 'pathlib', 'shutil') if m in sys.modules))"],
                           self.env(server))
        self.assertEqual(done.returncode, 0, done.stderr)
        self.assertNotIn(b"pandas", done.stdout)
        self.assertNotIn(b"numpy", done.stdout)
        self.assertNotIn(b"matplotlib", done.stdout)
        self.assertEqual(len(server.records), 1)

    def test_shell_driver_every_process_is_a_run(self):
        a = self.write("a.py", "open('mid.txt', 'w').write('made by a')\n")
        b = self.write("b.py", "import sys\ndata = open('mid.txt').read()\nopen('end.txt', 'w').write(data * 2)\n")
        driver = self.write("drive.sh", '"$PY" a.py && "$PY" b.py && "$PY" -c "print(1)"\n')
        server = self.server()
        env = self.env(server, PY=support.PY)
        done = support.run(["sh", driver], env, cwd=self.dir)
        self.assertEqual(done.returncode, 0, done.stderr)
        self.assertEqual(len(server.records), 3)
        by_script = dict((r["script"]["path"], r) for r in server.records)
        mid = self.path("mid.txt")
        written = io_table(by_script[a])[(mid, "write")]
        read = io_table(by_script[b])[(mid, "read")]
        self.assertEqual(written["sha256"], read["sha256"])
        self.assertEqual(written["sha256"], sha256(b"made by a"))
        self.assertEqual(len(set(r["run_id"] for r in server.records)), 3)
        self.assertIn(None, by_script)  # the -c process has no script file

    def test_exit_status_and_exception_in_env_mode(self):
        server = self.server()
        script = self.write("e.py", "import sys\nsys.exit(3)\n")
        done = support.run([support.PY, script], self.env(server), cwd=self.dir)
        self.assertEqual(done.returncode, 3)
        self.assertEqual(self.only_record(server)["exit_code"], 3)

        server = self.server()
        script = self.write("f.py", "def f():\n    open('missing.txt')\nf()\n")
        plain = support.run([support.PY, script], support.base_env(), cwd=self.dir)
        done = support.run([support.PY, script], self.env(server), cwd=self.dir)
        self.assertEqual(done.returncode, plain.returncode)
        self.assertEqual(done.stderr, plain.stderr)
        record = self.only_record(server)
        self.assertEqual(record["exit_code"], 1)
        self.assertEqual(record["exception"], "FileNotFoundError")

    def test_atexit_writes_recorded_in_env_mode(self):
        script = self.write("a.py", "import atexit\natexit.register(lambda: open('late.txt', 'w').write('z'))\n")
        server = self.server()
        support.run([support.PY, script], self.env(server), cwd=self.dir)
        self.assertIn((self.path("late.txt"), "write"), io_table(self.only_record(server)))

    def test_runner_under_the_switch_is_one_run(self):
        script = self.write("s.py", "open('o.txt', 'w').write('1')\n")
        server = self.server()
        done = support.run(support.runner_cmd(script, "x"), self.env(server), cwd=self.dir)
        self.assertEqual(done.returncode, 0, done.stderr)
        record = self.only_record(server)
        self.assertEqual(record["script"]["path"], script)
        self.assertEqual(record["args"], ["x"])

    def test_flush_command_is_not_a_run(self):
        server = self.server()
        done = support.run([support.PY, "-m", "headwater", "flush"], self.env(server), cwd=self.dir)
        self.assertEqual(done.returncode, 0, done.stderr)
        self.assertEqual(server.records, [])


class ChainLoading(support.TempDirTest):
    """Another sitecustomize further on sys.path keeps working."""

    def other_site(self, body):
        folder = self.path("othersite")
        os.makedirs(folder)
        with open(os.path.join(folder, "sitecustomize.py"), "w") as handle:
            handle.write(textwrap.dedent(body))
        return folder

    def test_chained_sitecustomize_runs(self):
        other = self.other_site("""
            import builtins
            builtins.CHAINED_SITE = "yes"
            MARK = 42
        """)
        server = self.server()
        for capture in ("1", "0"):
            env = support.with_connector_path(
                support.capture_env(server.url, self.spool, HEADWATER_CAPTURE=capture), other)
            done = support.run([support.PY, "-c", "import sitecustomize, sys\n"
                                "print(CHAINED_SITE, sitecustomize.MARK, 'headwater.capture' in sys.modules)"], env)
            self.assertEqual(done.returncode, 0, done.stderr)
            self.assertEqual(done.stdout.decode().split(), ["yes", "42", "True" if capture == "1" else "False"])
        self.assertEqual(len(server.records), 1)

    def test_failing_chained_sitecustomize_is_reported_like_site_does(self):
        other = self.other_site("raise RuntimeError('other site broke')\n")
        env = support.with_connector_path(support.base_env(), other)
        done = support.run([support.PY, "-c", "print('still runs')"], env)
        plain = support.run([support.PY, "-c", "print('still runs')"],
                            dict(support.base_env(), PYTHONPATH=other))
        self.assertEqual(done.stdout, b"still runs\n")
        self.assertEqual(done.stderr, plain.stderr)
        self.assertIn(b"Error in sitecustomize", done.stderr)


class InstalledPth(support.TempDirTest):
    """The wheel built by the in-tree backend puts headwater_capture.pth at
    the top of site-packages; site.py runs it (Lib/site.py, addpackage:
    lines starting with "import" are executed)."""

    def build_wheel(self, out):
        code = ("import sys; sys.path.insert(0, %r); import headwater_build as b; print(b.build_wheel(%r))"
                % (os.path.join(support.CONNECTOR, "_build"), out))
        done = support.run([support.PY, "-c", code], support.base_env(HEADWATER_BUILD_STDLIB="1"),
                           cwd=support.CONNECTOR)
        self.assertEqual(done.returncode, 0, done.stderr)
        return os.path.join(out, done.stdout.decode().strip().splitlines()[-1])

    def test_wheel_contents(self):
        wheel = self.build_wheel(self.dir)
        names = set(zipfile.ZipFile(wheel).namelist())
        self.assertIn("headwater_capture.pth", names)
        self.assertIn("headwater/capture.py", names)
        self.assertIn("headwater-0.1.0.dist-info/RECORD", names)
        self.assertIn("headwater-0.1.0.dist-info/entry_points.txt", names)
        self.assertNotIn("sitecustomize.py", names)
        self.assertFalse([n for n in names if n.startswith(("tests/", "bench/", "_build/"))])

    def test_pth_starts_capture_in_a_site_dir(self):
        wheel = self.build_wheel(self.dir)
        site_dir = self.path("site")
        zipfile.ZipFile(wheel).extractall(site_dir)
        server = self.server()
        env = support.capture_env(server.url, self.spool, HEADWATER_CAPTURE="1")
        data = self.write("d.txt", "d")
        code = "import site; site.addsitedir(%r); print(open(%r).read())" % (site_dir, data)
        done = support.run([support.PY, "-c", code], env, cwd=self.dir)
        self.assertEqual(done.returncode, 0, done.stderr)
        self.assertEqual(done.stdout, b"d\n")
        record = self.only_record(server)
        self.assertIn((data, "read"), io_table(record))

    @unittest.skipUnless(os.environ.get("HEADWATER_SLOW_TESTS") == "1", "set HEADWATER_SLOW_TESTS=1 for pip tests")
    def test_plain_pip_install_offline_into_a_venv(self):
        try:
            import ensurepip  # noqa: F401
            import venv  # noqa: F401
        except ImportError:
            self.skipTest("this interpreter has no venv/ensurepip")
        venv_dir = self.path("venv")
        subprocess.run([support.PY, "-m", "venv", venv_dir], check=True)
        python = os.path.join(venv_dir, "bin", "python")
        done = support.run([python, "-m", "pip", "install", "--no-index", "--no-cache-dir", support.CONNECTOR],
                           support.base_env(PIP_NO_INDEX="1", PIP_FIND_LINKS=None), timeout=300)
        self.assertEqual(done.returncode, 0, done.stdout + done.stderr)
        server = self.server()
        env = support.capture_env(server.url, self.spool, HEADWATER_CAPTURE="1")
        done = support.run([python, "-c", "open('x.txt', 'w').write('1')"], env, cwd=self.dir)
        self.assertEqual(done.returncode, 0, done.stderr)
        self.assertIn((self.path("x.txt"), "write"), io_table(self.only_record(server)))


if __name__ == "__main__":
    unittest.main()
