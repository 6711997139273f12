"""``python -m headwater run``: exact io records, and a script that behaves
exactly as it does without capture."""

import getpass
import hashlib
import os
import re
import shutil
import socket
import subprocess
import sys
import textwrap
import unittest
import uuid

from tests import support
from tests.support import io_table, sha256

ISO_UTC = re.compile(r"^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$")


class RunnerRecordsIO(support.TempDirTest):
    def test_builtins_pathlib_os_and_shutil_exactly(self):
        in_csv = self.write("data/in.csv", "a,b\n1,x\n2,y\n")
        script = self.write("job.py", textwrap.dedent("""
            import os, shutil, sys
            from pathlib import Path
            with open("data/in.csv") as f:           # read
                text = f.read()
            with open("out/upper.txt", "w") as f:    # write
                f.write(text.upper())
            Path("out/raw.bin").write_bytes(b"\\x00\\x01\\x02")   # pathlib write
            Path("data/in.csv").read_text()          # pathlib read (same key: one entry)
            with Path("out/log.txt").open("a") as f:  # append is a write
                f.write("line\\n")
            with open("out/upper.txt", "r+") as f:   # read and write
                f.seek(0, 2); f.write("!")
            os.rename("out/raw.bin", "out/raw2.bin")
            shutil.copy("out/raw2.bin", "out/copy.bin")
            os.remove("out/log.txt")
            print("done", len(text))
        """))
        os.makedirs(self.path("out"))
        server = self.server()
        done = self.run_captured(server, script)
        self.assertEqual(done.returncode, 0, done.stderr)
        self.assertEqual(done.stdout, b"done 12\n")
        self.assertEqual(done.stderr, b"")
        record = self.only_record(server)
        table = io_table(record)
        p = self.path
        src = b"a,b\n1,x\n2,y\n"
        upper = src.upper() + b"!"
        raw = b"\x00\x01\x02"
        expected = {
            (in_csv, "read"): (len(src), sha256(src), "builtins.open"),
            (p("out/upper.txt"), "write"): (len(upper), sha256(upper), "builtins.open"),
            # r+ opened it after the first write: read entry with the
            # content at that moment.
            (p("out/upper.txt"), "read"): (len(src), sha256(src.upper()), "builtins.open"),
            (p("out/raw.bin"), "write"): (3, sha256(raw), "pathlib.Path.write_bytes"),
            (p("out/raw.bin"), "rename_from"): (3, sha256(raw), "os.rename"),
            (p("out/raw2.bin"), "rename_to"): (3, sha256(raw), "os.rename"),
            (p("out/raw2.bin"), "read"): (3, sha256(raw), "shutil.copy"),
            (p("out/copy.bin"), "write"): (3, sha256(raw), "shutil.copy"),
            (p("out/log.txt"), "write"): (5, sha256(b"line\n"), "pathlib.Path.open"),
            (p("out/log.txt"), "delete"): (5, sha256(b"line\n"), "os.remove"),
        }
        got = dict((key, (e["bytes"], e["sha256"], e["via"])) for key, e in table.items())
        self.assertEqual(got, expected)
        for entry in record["io"]:
            self.assertIsNone(entry["frame"])
            self.assertIs(entry["stamped"], False)
            self.assertRegex(entry["at"], ISO_UTC)
        # Entries are in order of first access.
        order = [(e["path"], e["direction"]) for e in record["io"]]
        self.assertEqual(order[0], (in_csv, "read"))
        self.assertEqual(order[1], (p("out/upper.txt"), "write"))

    def test_run_fields(self):
        script = self.write("fields.py", "print('hi')\n")
        server = self.server()
        done = self.run_captured(server, script, "--flag", "x y", HEADWATER_TOKEN="s3cret")
        self.assertEqual(done.returncode, 0, done.stderr)
        record = self.only_record(server)
        self.assertEqual(set(record), {"run_id", "client", "script", "args", "user", "host", "python", "cwd",
                                       "started_at", "ended_at", "exit_code", "exception", "io"})
        self.assertEqual(uuid.UUID(record["run_id"]).version, 4)
        self.assertEqual(record["client"], "headwater-python/0.1.0")
        with open(script, "rb") as handle:
            script_sha = hashlib.sha256(handle.read()).hexdigest()
        self.assertEqual(record["script"], {"path": script, "sha256": script_sha, "git_commit": None,
                                            "language": "python"})
        self.assertEqual(record["args"], ["--flag", "x y"])
        self.assertEqual(record["user"], getpass.getuser())
        self.assertEqual(record["host"], socket.gethostname())
        child_version = support.run([support.PY, "-c", "import platform; print(platform.python_version())"],
                                    support.base_env()).stdout.decode().strip()
        self.assertEqual(record["python"], child_version)
        self.assertEqual(record["cwd"], self.dir)
        self.assertRegex(record["started_at"], ISO_UTC)
        self.assertRegex(record["ended_at"], ISO_UTC)
        self.assertLessEqual(record["started_at"], record["ended_at"])
        self.assertEqual(record["exit_code"], 0)
        self.assertIsNone(record["exception"])
        self.assertEqual(record["io"], [])
        self.assertEqual(server.paths, ["/api/runs"])
        self.assertEqual(server.headers[0].get("Authorization"), "Bearer s3cret")
        self.assertEqual(server.headers[0].get("Content-Type"), "application/json")

    def test_no_token_no_authorization_header(self):
        script = self.write("s.py", "pass\n")
        server = self.server()
        self.run_captured(server, script)
        self.only_record(server)
        self.assertNotIn("Authorization", server.headers[0])

    def test_git_commit_of_the_script(self):
        git = shutil.which("git")
        if git is None:
            self.skipTest("git is not installed")
        repo = self.path("repo")
        os.makedirs(repo)
        env = dict(os.environ, GIT_AUTHOR_NAME="t", GIT_AUTHOR_EMAIL="t@example.invalid",
                   GIT_COMMITTER_NAME="t", GIT_COMMITTER_EMAIL="t@example.invalid")
        script = self.write("repo/tool/s.py", "pass\n")
        for cmd in (["init", "-q"], ["add", "."], ["commit", "-q", "-m", "x"]):
            subprocess.run([git] + cmd, cwd=repo, env=env, check=True, stdout=subprocess.DEVNULL)
        head = subprocess.run([git, "rev-parse", "HEAD"], cwd=repo, stdout=subprocess.PIPE,
                              check=True).stdout.decode().strip()
        server = self.server()
        self.run_captured(server, script)
        self.assertEqual(self.only_record(server)["script"]["git_commit"], head)

    def test_interpreter_files_are_not_recorded(self):
        self.write("helper_mod.py", "VALUE = 1\n")
        data = self.write("d.txt", "x")
        script = self.write("imp.py", textwrap.dedent("""
            import json, csv, decimal, linecache, email.parser
            import helper_mod
            linecache.getline(__file__, 1)
            import inspect; inspect.getsource(helper_mod)
            open("/proc/self/status").read()
            open("/dev/null", "w").write("x")
            print(open("d.txt").read())
        """))
        server = self.server()
        done = self.run_captured(server, script)
        self.assertEqual(done.returncode, 0, done.stderr)
        record = self.only_record(server)
        self.assertEqual([(e["path"], e["direction"]) for e in record["io"]], [(data, "read")])


class BehaviourUnchanged(support.TempDirTest):
    """The same script, with and without capture: same stdout, stderr and
    exit status."""

    def both(self, source, *args):
        self.write("s.py", textwrap.dedent(source))
        plain = self.run_plain("s.py", *args)
        server = self.server()
        captured = self.run_captured(server, "s.py", *args)
        return plain, captured, server

    def assertSame(self, plain, captured):
        self.assertEqual(captured.stdout, plain.stdout)
        self.assertEqual(captured.stderr, plain.stderr)
        self.assertEqual(captured.returncode, plain.returncode)

    def test_stdout_and_main_module(self):
        plain, captured, server = self.both("""
            import sys, os
            print(sys.argv, __file__, __name__, sys.path[0])
            print(sorted(k for k in globals() if k.startswith("__")))
            print(__spec__, __package__, __cached__, type(__loader__).__name__)
            print(sys.modules["__main__"] is sys.modules[__name__])
            class K: pass
            print(K.__module__)
            sys.stdout.write("no newline")
        """, "a", "--b")
        self.assertSame(plain, captured)
        self.assertIn(b"['s.py', 'a', '--b']", plain.stdout)
        self.assertEqual(self.only_record(server)["exit_code"], 0)

    def test_builtins_keep_their_identity(self):
        plain, captured, server = self.both("""
            import builtins, io, os, pickle
            print(open is io.open, builtins.open is io.open, os.remove is os.unlink)
            print(pickle.loads(pickle.dumps(open)) is open, pickle.loads(pickle.dumps(os.rename)) is os.rename)
            print(open.__name__, os.rename.__name__, callable(open))
            class Holder:
                opener = open        # a builtin stored on a class does not bind
            print(Holder().opener("s.py").readline().strip())
        """)
        self.assertSame(plain, captured)
        self.assertIn(b"True True False", captured.stdout)

    def test_sys_exit_code(self):
        plain, captured, server = self.both("import sys\nprint('x')\nsys.exit(3)\n")
        self.assertSame(plain, captured)
        self.assertEqual(captured.returncode, 3)
        record = self.only_record(server)
        self.assertEqual(record["exit_code"], 3)
        self.assertIsNone(record["exception"])

    def test_sys_exit_message(self):
        plain, captured, server = self.both("import sys\nsys.exit('bad input')\n")
        self.assertSame(plain, captured)
        self.assertEqual(captured.returncode, 1)
        self.assertEqual(self.only_record(server)["exit_code"], 1)

    def test_uncaught_exception_traceback(self):
        plain, captured, server = self.both("""
            def inner():
                raise ValueError("broken " + "input")
            def outer():
                try:
                    inner()
                except ValueError as e:
                    raise KeyError("k") from e
            print("before")
            outer()
        """)
        self.assertSame(plain, captured)
        self.assertEqual(captured.returncode, 1)
        self.assertIn(b"Traceback (most recent call last):", captured.stderr)
        self.assertIn(b"KeyError: 'k'", captured.stderr)
        record = self.only_record(server)
        self.assertEqual(record["exit_code"], 1)
        self.assertEqual(record["exception"], "KeyError")

    @unittest.skipIf(sys.version_info < (3, 11), "Python < 3.11 re-adds a re-raising frame to the traceback")
    def test_exception_through_a_wrapped_function(self):
        plain, captured, server = self.both("""
            import os
            from pathlib import Path
            try:
                Path("missing.txt").read_text()
            except FileNotFoundError:
                import traceback; traceback.print_exc()
            os.rename("nope", "nope2")
        """)
        self.assertSame(plain, captured)
        self.assertIn(b"FileNotFoundError", captured.stderr)
        self.assertEqual(self.only_record(server)["exception"], "FileNotFoundError")

    def test_uncaught_exception_through_a_wrapped_function(self):
        plain, captured, server = self.both("""
            import shutil
            def copy():
                shutil.copy("missing.txt", "there.txt")
            copy()
        """)
        self.assertSame(plain, captured)
        self.assertIn(b"FileNotFoundError", captured.stderr)

    def test_syntax_error(self):
        plain, captured, server = self.both("print('a'\nx = (\n")
        self.assertSame(plain, captured)
        self.assertEqual(captured.returncode, 1)
        self.assertEqual(self.only_record(server)["exception"], "SyntaxError")

    def test_keyboard_interrupt(self):
        plain, captured, server = self.both("raise KeyboardInterrupt\n")
        self.assertSame(plain, captured)
        self.assertEqual(self.only_record(server)["exception"], "KeyboardInterrupt")

    def test_atexit_and_threads_of_the_script(self):
        plain, captured, server = self.both("""
            import atexit, threading, time
            atexit.register(print, "bye")
            def work():
                time.sleep(0.2)
                open("late.txt", "w").write("late")
                print("thread done")
            threading.Thread(target=work).start()
            print("main done")
        """)
        self.assertSame(plain, captured)
        record = self.only_record(server)
        self.assertIn((self.path("late.txt"), "write"), io_table(record))

    def test_files_written_by_the_scripts_atexit_handlers(self):
        plain, captured, server = self.both("""
            import atexit
            def save():
                with open("at_exit.txt", "w") as f:
                    f.write("saved at exit")
                print("saved")
            atexit.register(save)
            raise SystemExit(5)
        """)
        self.assertSame(plain, captured)
        self.assertEqual(captured.returncode, 5)
        record = self.only_record(server)
        self.assertEqual(record["exit_code"], 5)
        entry = io_table(record)[(self.path("at_exit.txt"), "write")]
        self.assertEqual(entry["sha256"], sha256(b"saved at exit"))

    def test_missing_script(self):
        server = self.server()
        done = self.run_captured(server, self.path("absent.py"))
        self.assertEqual(done.returncode, 2)
        self.assertIn(b"can't open file", done.stderr)
        self.assertEqual(server.records, [])


class WarningsKeepTheirLine(support.TempDirTest):
    """A library's warning (stacklevel pointing at its caller) still names
    the script's line when the library function is wrapped."""

    def test_warning_location(self):
        stub = self.path("stubs", "polars")
        os.makedirs(stub)
        with open(os.path.join(stub, "__init__.py"), "w") as handle:
            handle.write(textwrap.dedent("""
                import warnings
                def read_csv(source, **kw):
                    warnings.warn("stub warning", UserWarning, stacklevel=2)
                    with open(source) as f:
                        return f.read()
            """))
        data = self.write("t.csv", "a\n1\n")
        script = self.write("w.py", textwrap.dedent("""
            import sys
            sys.path.insert(0, sys.argv[1])
            import polars
            print(polars.read_csv("t.csv"))
        """))
        plain = support.run([support.PY, script, self.path("stubs")], support.base_env(), cwd=self.dir)
        server = self.server()
        captured = self.run_captured(server, script, self.path("stubs"))
        self.assertEqual(captured.stderr, plain.stderr)
        self.assertIn(b"w.py:5: UserWarning: stub warning", captured.stderr)
        self.assertEqual(captured.stdout, plain.stdout)
        table = io_table(self.only_record(server))
        # Recorded once, at the wrapped library function, not again at open.
        self.assertEqual(list(table), [(data, "read")])
        self.assertEqual(table[(data, "read")]["via"], "polars.read_csv")


if __name__ == "__main__":
    unittest.main()
