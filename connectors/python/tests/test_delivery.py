"""Delivery: POST, the spool when the server is down or busy, flush, and
dropping what the server refuses."""

import json
import os
import stat
import threading
import unittest

from tests import support
from headwater import config, delivery


class SpoolAndFlush(support.TempDirTest):
    def test_down_then_flush_sends_exactly_one(self):
        script = self.write("s.py", "open('o.txt', 'w').write('o')\nprint('ran')\n")
        port = support.free_port()
        env = support.with_connector_path(support.capture_env("http://127.0.0.1:%d" % port, self.spool))
        done = support.run(support.runner_cmd(script), env, cwd=self.dir)
        self.assertEqual(done.returncode, 0)
        self.assertEqual(done.stdout, b"ran\n")
        self.assertEqual(done.stderr, b"")  # an unreachable server is not an error
        spooled = self.spooled()
        self.assertEqual(len(spooled), 1)
        run_id = spooled[0]["run_id"]
        self.assertEqual(stat.S_IMODE(os.stat(self.spool).st_mode), 0o600)

        server = support.RecordServer(port=port)
        self.addCleanup(server.close)
        flushed = support.run([support.PY, "-m", "headwater", "flush"], env, cwd=self.dir)
        self.assertEqual(flushed.returncode, 0, flushed.stderr)
        self.assertIn(b"sent 1, dropped 0, kept 0", flushed.stdout)
        self.assertEqual([r["run_id"] for r in server.records], [run_id])
        self.assertEqual(self.spooled(), [])
        self.assertEqual(os.path.getsize(self.spool), 0)
        # A second flush sends nothing more.
        support.run([support.PY, "-m", "headwater", "flush"], env, cwd=self.dir)
        self.assertEqual(len(server.records), 1)

    def test_next_run_sends_the_backlog_first(self):
        script = self.write("s.py", "pass\n")
        port = support.free_port()
        env = support.with_connector_path(support.capture_env("http://127.0.0.1:%d" % port, self.spool))
        support.run(support.runner_cmd(script), env, cwd=self.dir)
        support.run(support.runner_cmd(script), env, cwd=self.dir)
        backlog = [r["run_id"] for r in self.spooled()]
        self.assertEqual(len(backlog), 2)
        server = support.RecordServer(port=port)
        self.addCleanup(server.close)
        support.run(support.runner_cmd(script), env, cwd=self.dir)
        received = [r["run_id"] for r in server.records]
        self.assertEqual(len(received), 3)
        self.assertEqual(received[:2], backlog)
        self.assertEqual(self.spooled(), [])

    def test_retryable_statuses_are_spooled(self):
        script = self.write("s.py", "pass\n")
        for status in (408, 429, 500, 503):
            server = self.server([status])
            done = self.run_captured(server, script)
            self.assertEqual(done.returncode, 0)
            self.assertEqual(done.stderr, b"")
            self.assertEqual(server.records, [])
        self.assertEqual(len(self.spooled()), 4)
        server = self.server()
        env = support.with_connector_path(support.capture_env(server.url, self.spool))
        flushed = support.run([support.PY, "-m", "headwater", "flush"], env, cwd=self.dir)
        self.assertEqual(flushed.returncode, 0)
        self.assertEqual(len(server.records), 4)
        self.assertEqual(self.spooled(), [])

    def test_client_error_is_logged_once_and_dropped(self):
        script = self.write("s.py", "import sys\nprint('out')\nsys.exit(4)\n")
        server = self.server([400])
        done = self.run_captured(server, script)
        self.assertEqual(done.returncode, 4)
        self.assertEqual(done.stdout, b"out\n")
        lines = done.stderr.decode().splitlines()
        self.assertEqual(len(lines), 1, lines)
        self.assertTrue(lines[0].startswith("headwater: the server refused run "), lines)
        self.assertIn("HTTP 400", lines[0])
        self.assertIn("test says no", lines[0])
        self.assertEqual(self.spooled(), [])

    def test_spooled_record_refused_later_is_dropped(self):
        script = self.write("s.py", "pass\n")
        port = support.free_port()
        env = support.with_connector_path(support.capture_env("http://127.0.0.1:%d" % port, self.spool))
        support.run(support.runner_cmd(script), env, cwd=self.dir)
        self.assertEqual(len(self.spooled()), 1)
        server = support.RecordServer([422], port=port)
        self.addCleanup(server.close)
        flushed = support.run([support.PY, "-m", "headwater", "flush"], env, cwd=self.dir)
        self.assertIn(b"sent 0, dropped 1, kept 0", flushed.stdout)
        self.assertIn(b"HTTP 422", flushed.stderr)
        self.assertEqual(self.spooled(), [])

    def test_no_url_spools(self):
        script = self.write("s.py", "pass\n")
        env = support.with_connector_path(support.base_env(HEADWATER_SPOOL=self.spool))
        done = support.run(support.runner_cmd(script), env, cwd=self.dir)
        self.assertEqual(done.returncode, 0)
        self.assertEqual(done.stderr, b"")
        self.assertEqual(len(self.spooled()), 1)
        flushed = support.run([support.PY, "-m", "headwater", "flush"], env, cwd=self.dir)
        self.assertEqual(flushed.returncode, 2)

    def test_default_spool_is_in_home(self):
        home = self.path("home")
        os.makedirs(home)
        script = self.write("s.py", "pass\n")
        env = support.with_connector_path(support.base_env(HOME=home, HEADWATER_URL="http://127.0.0.1:%d"
                                                           % support.free_port()))
        support.run(support.runner_cmd(script), env, cwd=self.dir)
        spool = os.path.join(home, ".headwater", "spool.ndjson")
        with open(spool) as handle:
            self.assertEqual(len(handle.read().splitlines()), 1)
        self.assertEqual(stat.S_IMODE(os.stat(os.path.dirname(spool)).st_mode), 0o700)


class FlushUnit(support.TempDirTest):
    """In-process: the rewrite keeps lines appended while a flush runs."""

    def cfg(self, url):
        cfg = config.Config({"HEADWATER_URL": url, "HEADWATER_SPOOL": self.spool})
        return cfg

    def test_append_during_flush_is_kept(self):
        server = self.server()
        cfg = self.cfg(server.url)
        for n in range(3):
            delivery.spool_append(json.dumps({"run_id": "old-%d" % n}), self.spool)
        real_post = delivery.post
        calls = []

        def post(body, c):
            calls.append(body)
            if len(calls) == 1:
                # Another process spools a record while we are sending.
                done = threading.Event()

                def other():
                    delivery.spool_append(json.dumps({"run_id": "new"}), self.spool)
                    done.set()

                threading.Thread(target=other).start()
                done.wait(5)
            return real_post(body, c)

        delivery.post = post
        try:
            stats = delivery.flush(cfg)
        finally:
            delivery.post = real_post
        self.assertEqual(stats, {"sent": 3, "dropped": 0, "kept": 1, "unreachable": False})
        self.assertEqual([r["run_id"] for r in server.records], ["old-0", "old-1", "old-2"])
        self.assertEqual([r["run_id"] for r in self.spooled()], ["new"])

    def test_stops_at_first_unreachable(self):
        cfg = self.cfg("http://127.0.0.1:%d" % support.free_port())
        for n in range(3):
            delivery.spool_append(json.dumps({"run_id": str(n)}), self.spool)
        stats = delivery.flush(cfg)
        self.assertEqual(stats, {"sent": 0, "dropped": 0, "kept": 3, "unreachable": True})
        self.assertEqual(len(self.spooled()), 3)

    def test_corrupt_line_dropped(self):
        server = self.server()
        os.makedirs(os.path.dirname(self.spool))
        with open(self.spool, "w") as handle:
            handle.write('{"run_id": "a"}\n{not json\n\n{"run_id": "b"}')
        stats = delivery.flush(self.cfg(server.url))
        self.assertEqual(stats["sent"], 2)
        self.assertEqual(stats["dropped"], 1)
        self.assertEqual(self.spooled(), [])

    def test_budget_limits_records_sent_at_exit(self):
        server = self.server()
        for n in range(5):
            delivery.spool_append(json.dumps({"run_id": str(n)}), self.spool)
        stats = delivery.flush(self.cfg(server.url), max_records=2)
        self.assertEqual(stats["sent"], 2)
        self.assertEqual(stats["kept"], 3)

    def test_classify(self):
        # RFC 9110 15.3 (2xx), 15.5.9 (408), 15.6 (5xx); RFC 6585 4 (429).
        self.assertEqual(delivery.classify(200), delivery.SENT)
        self.assertEqual(delivery.classify(201), delivery.SENT)
        self.assertEqual(delivery.classify(204), delivery.SENT)
        for status in (408, 429, 500, 502, 503, 504):
            self.assertEqual(delivery.classify(status), delivery.RETRY, status)
        for status in (400, 401, 403, 404, 409, 413, 422):
            self.assertEqual(delivery.classify(status), delivery.DROPPED, status)
        self.assertEqual(delivery.classify(302), delivery.RETRY)


if __name__ == "__main__":
    unittest.main()
