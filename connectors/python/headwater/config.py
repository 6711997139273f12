"""Settings, all read from environment variables (see README.md)."""

import os

TRUE_WORDS = ("1", "true", "yes", "on")
FALSE_WORDS = ("0", "false", "no", "off")

DEFAULT_HASH_CAP = 64 * 1024 * 1024  # 64 MiB
POST_TIMEOUT_S = 2.0
# At exit, earlier spooled records are sent first, within this budget, so
# that a run never waits long for its predecessors' backlog.
EXIT_FLUSH_BUDGET_S = 1.5
EXIT_FLUSH_MAX_RECORDS = 50


def env_flag(name, default=False, environ=None):
    value = (environ if environ is not None else os.environ).get(name)
    if value is None or value.strip() == "":
        return default
    value = value.strip().lower()
    if value in TRUE_WORDS:
        return True
    if value in FALSE_WORDS:
        return False
    return default


def capture_requested(environ=None):
    return env_flag("HEADWATER_CAPTURE", False, environ)


def default_spool_path():
    return os.path.join(os.path.expanduser("~"), ".headwater", "spool.ndjson")


class Config(object):
    """A snapshot of the HEADWATER_* variables, taken when capture starts."""

    def __init__(self, environ=None):
        env = environ if environ is not None else os.environ
        self.url = (env.get("HEADWATER_URL") or "").strip() or None
        self.token = (env.get("HEADWATER_TOKEN") or "").strip() or None
        spool = (env.get("HEADWATER_SPOOL") or "").strip()
        self.spool = os.path.abspath(os.path.expanduser(spool)) if spool else default_spool_path()
        self.hash_cap = DEFAULT_HASH_CAP
        self.problems = []
        raw_cap = (env.get("HEADWATER_HASH_CAP") or "").strip()
        if raw_cap:
            try:
                self.hash_cap = int(raw_cap)
                if self.hash_cap < 0:
                    raise ValueError(raw_cap)
            except ValueError:
                self.hash_cap = DEFAULT_HASH_CAP
                self.problems.append(
                    "HEADWATER_HASH_CAP=%r is not a number of bytes; using %d" % (raw_cap, DEFAULT_HASH_CAP)
                )
        self.stamp = env_flag("HEADWATER_STAMP", True, env)
        self.verbose = env_flag("HEADWATER_VERBOSE", False, env)
        extra = env.get("HEADWATER_EXCLUDE") or ""
        self.extra_excludes = [os.path.abspath(os.path.expanduser(p)) for p in extra.split(os.pathsep) if p.strip()]
        self.timeout = POST_TIMEOUT_S
