"""The capture session: one per process, one run record.

Everything a wrapper does goes through Session.enter (before the wrapped
call) and Session.leave (after it returned).  Both catch every exception:
a fault in the connector is logged once and the script's call goes on
exactly as without capture.
"""

import atexit
import hashlib
import os
import stat as stat_module
import sys
import threading
import time

from headwater import CLIENT, config, hooks, log, tbfilter
from headwater.hooks import RETURN, internal, tls

# The real functions, taken before anything is wrapped.
_open = open
_stat = os.stat
_isdir = os.path.isdir
_walk = os.walk

_session = None
_start_lock = threading.Lock()

_HASH_CHUNK = 1024 * 1024
_PACKAGE_DIR = os.path.dirname(os.path.abspath(__file__))


def iso_utc(epoch):
    """ISO 8601 UTC with milliseconds, e.g. 2026-12-01T22:00:00.123Z."""
    millis = int(round(epoch * 1000))
    return time.strftime("%Y-%m-%dT%H:%M:%S", time.gmtime(millis // 1000)) + ".%03dZ" % (millis % 1000)


def uuid4():
    """A random UUID, RFC 4122 section 4.4 (version 4, variant 10xx): the
    same as str(uuid.uuid4()) without importing uuid at start-up."""
    raw = bytearray(os.urandom(16))
    raw[6] = (raw[6] & 0x0F) | 0x40
    raw[8] = (raw[8] & 0x3F) | 0x80
    h = raw.hex()
    return "%s-%s-%s-%s-%s" % (h[:8], h[8:12], h[12:16], h[16:20], h[20:])


def python_version():
    """What platform.python_version() gives (e.g. 3.11.7, 3.14.0a1)."""
    v = sys.version_info
    text = "%d.%d.%d" % (v[0], v[1], v[2])
    if v.releaselevel != "final":
        text += {"alpha": "a", "beta": "b", "candidate": "rc"}.get(v.releaselevel, "") + str(v.serial)
    return text


def utc_now():
    return iso_utc(time.time())


def sha256_file(path, limit=None):
    """(size, hex digest) of a regular file; digest None when the file is
    larger than ``limit`` bytes or unreadable."""
    try:
        st = _stat(path)
    except OSError:
        return None, None
    if not stat_module.S_ISREG(st.st_mode):
        return None, None
    if limit is not None and st.st_size > limit:
        return st.st_size, None
    digest = hashlib.sha256()
    size = 0
    try:
        with _open(path, "rb", buffering=0) as handle:
            if st.st_size < _HASH_CHUNK:
                data = handle.read()
                while data:
                    size += len(data)
                    digest.update(data)
                    data = handle.read()
            else:
                buf = bytearray(_HASH_CHUNK)
                view = memoryview(buf)
                while True:
                    n = handle.readinto(buf)
                    if not n:
                        break
                    size += n
                    digest.update(view[:n])
    except OSError:
        return st.st_size, None
    return size, digest.hexdigest()


def as_path(value):
    """The file system path a call argument names, or None for file
    objects, descriptors, URLs and literal contents."""
    if isinstance(value, str):
        text = value
    elif isinstance(value, bytes):
        try:
            text = os.fsdecode(value)
        except Exception:
            return None
    elif hasattr(value, "__fspath__"):
        try:
            text = os.fspath(value)
        except Exception:
            return None
        if isinstance(text, bytes):
            text = os.fsdecode(text)
    else:
        return None
    if not text or "\n" in text or "\x00" in text or len(text) > 4096:
        return None
    if "://" in text[:16]:
        if text.startswith("file://"):
            from urllib.parse import unquote, urlsplit

            text = unquote(urlsplit(text).path)
        else:
            return None
    return text


def argument(args, kwargs, position, keyword, default=None):
    if keyword is not None and keyword in kwargs:
        return kwargs[keyword]
    if position is not None and position != RETURN and position < len(args):
        return args[position]
    return default


def mode_directions(mode):
    """What an ``open`` mode lets the caller do with existing content
    (Python docs, built-in open(): 'r' read, 'w' truncate, 'x' create,
    'a' append, '+' updating)."""
    mode = str(mode) if mode is not None else "r"
    if "r" in mode:
        return ("read", "write") if "+" in mode else ("read",)
    if "a" in mode:
        return ("read", "write") if "+" in mode else ("write",)
    if "w" in mode or "x" in mode:
        return ("write",)
    return ("read",)


def frame_info(obj):
    """Column names, dtypes and row count of a pandas/polars/pyarrow table,
    taken when the call happens (the frame may change later) in a cheap
    raw form: (columns, dtypes, rows); frame_json makes it JSON.  Types are
    checked with isinstance, not hasattr: on a DataFrame, hasattr of a
    missing name searches the columns and hasattr(df, "dtypes") builds a
    Series."""
    if obj is None:
        return None
    root = type(obj).__module__.split(".", 1)[0]
    library = sys.modules.get(root)
    if library is None or root not in ("pandas", "polars", "pyarrow"):
        return None
    try:
        if root == "pandas":
            if isinstance(obj, library.DataFrame):
                dtypes = None
                manager = getattr(obj, "_mgr", None)
                if manager is not None and hasattr(manager, "get_dtypes"):
                    # The block manager's dtypes: what DataFrame.dtypes
                    # holds, without building that Series.
                    dtypes = list(manager.get_dtypes())
                    if len(dtypes) != len(obj.columns):
                        dtypes = None
                if dtypes is None:
                    dtypes = list(obj.dtypes)
                return (obj.columns.tolist(), dtypes, int(len(obj)))
            if isinstance(obj, library.Series):
                return ([obj.name], [obj.dtype], int(len(obj)))
        elif root == "polars":
            if isinstance(obj, library.DataFrame):
                return (list(obj.columns), list(obj.dtypes), int(obj.height))
        elif root == "pyarrow":
            if isinstance(obj, (library.Table, library.RecordBatch)):
                return (list(obj.column_names), [field.type for field in obj.schema], int(obj.num_rows))
    except Exception:
        return None
    return None


def frame_json(raw):
    columns, dtypes, rows = raw
    return {"columns": [str(c) for c in columns], "dtypes": [str(d) for d in dtypes], "rows": rows}


def exit_status(code):
    """The process exit status the interpreter derives from SystemExit's
    argument (Python docs, sys.exit: None is 0, an integer is itself, any
    other object is printed and gives 1)."""
    if code is None:
        return 0
    if isinstance(code, bool):
        return int(code)
    if isinstance(code, int):
        return code & 0xFF if os.name == "posix" else code
    return 1


# 128 + signal number for a process ended by a signal.
# common practice, no source (POSIX shells report it so; CPython ends on an
# uncaught KeyboardInterrupt by re-raising SIGINT, signal 2).
KEYBOARD_INTERRUPT_STATUS = 130


def git_commit(path, timeout=1.0):
    """HEAD of the git work tree holding ``path``, or None (no git, not a
    work tree, or slower than ``timeout``)."""
    if not path:
        return None
    folder = os.path.dirname(path)
    if "GIT_DIR" not in os.environ:
        probe = folder
        while True:
            if os.path.exists(os.path.join(probe, ".git")):
                break
            parent = os.path.dirname(probe)
            if parent == probe:
                return None
            probe = parent
    import subprocess

    env = dict(os.environ)
    env.pop("HEADWATER_CAPTURE", None)
    try:
        done = subprocess.run(
            ["git", "-C", folder, "rev-parse", "HEAD"],
            stdin=subprocess.DEVNULL,
            stdout=subprocess.PIPE,
            stderr=subprocess.DEVNULL,
            timeout=timeout,
            env=env,
        )
    except (OSError, subprocess.SubprocessError, ValueError):
        return None
    if done.returncode != 0:
        return None
    commit = done.stdout.decode("ascii", "replace").strip()
    if len(commit) in (40, 64) and all(c in "0123456789abcdef" for c in commit):
        return commit
    return None


def _user():
    try:
        import getpass

        return getpass.getuser()
    except Exception:
        return None


def _host():
    try:
        import socket

        return socket.gethostname()
    except Exception:
        return None


class Session(object):
    def __init__(self, cfg, mode):
        self.cfg = cfg
        self.mode = mode
        self.run_id = uuid4()
        self.started_at = utc_now()
        self._now = time.time
        self.ended_at = None
        self.cwd = os.getcwd()
        self.args = list(sys.argv[1:]) if getattr(sys, "argv", None) else None
        self.script_path = None
        self.script_sha = None
        self.exit_code = None
        self.exception = None
        self.active = True
        self.finished = False
        self.forked = False
        self.record = None  # the run record, once built
        self.outcome = None  # what delivery did with it
        self._lock = threading.RLock()
        self._io = {}  # (path, direction) -> entry
        self._pending = {}  # (path, direction) -> produced flag; outputs not yet hashed
        self._written = set()  # paths written in this run (stamp candidates)
        self._hash_cache = {}
        self._uncaught = None
        self._exit_args = None
        self._patched = []
        self._shared = {}
        self._watcher = None
        self._groups = hooks.groups()
        self.excluder = hooks.Excluder(
            hooks.EXCLUDE, _PACKAGE_DIR, cfg.spool, cfg.extra_excludes
        )
        argv0 = sys.argv[0] if getattr(sys, "argv", None) else ""
        if argv0 not in ("", "-c", "-m", "-"):
            try:
                candidate = os.path.abspath(argv0)
                if os.path.isfile(candidate):
                    self.set_script(candidate)
            except Exception:
                pass

    # -- set up ------------------------------------------------------------
    def install(self):
        log.verbose = self.cfg.verbose
        for problem in self.cfg.problems:
            log.once("config:" + problem, problem)
        with internal():
            for name, module_groups in self._groups.items():
                module = sys.modules.get(name)
                if module is not None:
                    self._patch(name, module)
            self._watcher = hooks.ImportWatcher(
                dict((name, self._patcher(name)) for name in self._groups)
            )
            sys.meta_path.insert(0, self._watcher)
            try:
                if not hasattr(sys.exit, hooks._MARK):
                    wrapper = hooks.make_exit(sys.exit, self._note_exit)
                    setattr(wrapper, hooks._MARK, sys.exit)
                    self._patched.append((sys, "exit", sys.exit, True))
                    sys.exit = wrapper
            except Exception:
                pass
            tbfilter.install()
            tbfilter.on_uncaught = self._note_uncaught
            atexit.register(self._at_exit)
            if hasattr(os, "register_at_fork"):
                os.register_at_fork(after_in_child=self._after_fork)

    def _patcher(self, name):
        def on_loaded(module):
            with internal():
                self._patch(name, module)

        return on_loaded

    def _patch(self, name, module):
        try:
            hooks.patch_module(module, self._groups.get(name, ()), self.enter, self.leave, self._patched,
                               self._shared)
        except Exception as exc:
            log.error("patching " + name, exc)

    def uninstall(self):
        """Undo the wrapping (tests and ``discard``)."""
        hooks.unpatch(self._patched)
        try:
            sys.meta_path.remove(self._watcher)
        except ValueError:
            pass

    def _after_fork(self):
        # A forked child shares the parent's run id; only the parent reports.
        self.forked = True

    def _note_exit(self, args):
        self._exit_args = args[0] if args else None

    def _note_uncaught(self, exc):
        self._uncaught = exc

    def set_script(self, path, sha=None):
        self.script_path = path
        if sha is None:
            with internal():
                sha = sha256_file(path)[1]
        self.script_sha = sha

    # -- recording ---------------------------------------------------------
    def enter(self, group, args, kwargs):
        if not self.active:
            return None
        tls.depth += 1
        try:
            options = group.options
            skip = options.get("skip_if_kw")
            if skip:
                for key in skip:
                    if kwargs.get(key) is not None:
                        return None
            specs = []
            for position, keyword, direction in group.paths:
                if position == RETURN:
                    specs.append((None, direction))
                    continue
                path = as_path(argument(args, kwargs, position, keyword))
                if path is None:
                    continue
                path = os.path.abspath(path)
                if direction == "by_mode":
                    mode_pos, mode_kw, mode_default = options["mode"]
                    directions = mode_directions(argument(args, kwargs, mode_pos, mode_kw, mode_default))
                else:
                    directions = (direction,)
                for d in directions:
                    if not self.excluder.excluded(path, d):
                        specs.append((path, d))
            if not specs:
                return None
            pre = {}
            for path, direction in specs:
                if path is None:
                    continue
                if direction in ("delete", "rename_from"):
                    pre[(path, direction)] = self._before_removal(path)
                elif direction == "write" and _isdir(path):
                    pre[(path, direction)] = self._listing_state(path)
            return (group, args, kwargs, specs, pre)
        except Exception as exc:
            log.error("recording " + group.via, exc)
            return None
        finally:
            tls.depth -= 1

    def leave(self, ticket, result):
        if not self.active:
            return
        tls.depth += 1
        try:
            group, args, kwargs, specs, pre = ticket
            options = group.options
            source = options.get("frame")
            frame = None
            if source == "return":
                frame = frame_info(result)
            elif source == "arg0" and args:
                frame = frame_info(args[0])
            moved = None
            for path, direction in specs:
                if path is None:
                    path = as_path(result)
                    if path is None:
                        continue
                    path = os.path.abspath(path)
                    if self.excluder.excluded(path, direction):
                        continue
                suffix = options.get("suffix")
                if suffix and direction == "write":
                    path = self._library_suffix(path, suffix, kwargs)
                if direction == "read":
                    self._after_read(group.via, path, frame)
                elif direction == "write":
                    self._after_write(group.via, path, frame, pre.get((path, direction)))
                elif direction in ("delete", "rename_from"):
                    removed = pre.get((path, direction)) or []
                    for file_path, size, sha, produced, rel in removed:
                        self._add(file_path, direction, group.via, size, sha, None)
                    if direction == "rename_from":
                        moved = removed
                elif direction == "rename_to":
                    self._after_rename_to(group.via, path, moved)
        except Exception as exc:
            log.error("recording " + group.via, exc)
        finally:
            tls.depth -= 1

    def _library_suffix(self, path, suffix, kwargs):
        if suffix == "matplotlib":
            # matplotlib FigureCanvasBase.print_figure: with no format given
            # and no extension, rcParams["savefig.format"] is appended.
            if kwargs.get("format") is None and os.path.splitext(path)[1][1:] == "":
                mpl = sys.modules.get("matplotlib")
                fmt = "png"
                try:
                    fmt = mpl.rcParams["savefig.format"]
                except Exception:
                    pass
                return path.rstrip(".") + "." + fmt
            return path
        if not path.endswith(suffix):
            return path + suffix
        return path

    def _files_under(self, folder):
        files = []
        for root, dirs, names in _walk(folder):
            dirs.sort()
            for name in sorted(names):
                files.append(os.path.join(root, name))
                if len(files) >= hooks.TREE_LIMIT:
                    log.once("tree-limit", "more than %d files under %s; recorded the first %d"
                             % (hooks.TREE_LIMIT, folder, hooks.TREE_LIMIT))
                    return files
        return files

    def _listing_state(self, folder):
        state = {}
        for file_path in self._files_under(folder):
            try:
                st = _stat(file_path)
                state[file_path] = (st.st_size, st.st_mtime_ns)
            except OSError:
                pass
        return state

    def _before_removal(self, path):
        """Facts about files that the call is about to delete or move away:
        [(path, bytes, sha256, produced-in-this-run, relative name)]."""
        try:
            st = _stat(path)
        except OSError:
            return []
        if stat_module.S_ISDIR(st.st_mode):
            files = [(f, os.path.relpath(f, path)) for f in self._files_under(path)]
        elif stat_module.S_ISREG(st.st_mode):
            files = [(path, "")]
        else:
            return []
        out = []
        for file_path, rel in files:
            if self.excluder.excluded(file_path, "delete"):
                continue
            self._settle(file_path)
            size, sha = self._input_hash(file_path)
            out.append((file_path, size, sha, file_path in self._written, rel))
        return out

    def _input_hash(self, path, st=None):
        if st is None:
            try:
                st = _stat(path)
            except OSError:
                return None, None
        key = (path, st.st_size, st.st_mtime_ns, st.st_ino)
        cached = self._hash_cache.get(key)
        if cached is not None:
            return cached
        value = sha256_file(path, self.cfg.hash_cap)
        self._hash_cache[key] = value
        return value

    def _after_read(self, via, path, frame):
        try:
            st = _stat(path)
        except OSError:
            return
        if stat_module.S_ISDIR(st.st_mode):
            files = [f for f in self._files_under(path) if not self.excluder.excluded(f, "read")]
            for file_path in files:
                size, sha = self._input_hash(file_path)
                self._add(file_path, "read", via, size, sha, frame if len(files) == 1 else None)
        elif stat_module.S_ISREG(st.st_mode):
            size, sha = self._input_hash(path, st)
            self._add(path, "read", via, size, sha, frame)

    def _after_write(self, via, path, frame, before):
        try:
            st = _stat(path)
        except OSError:
            st = None
        if st is not None and stat_module.S_ISDIR(st.st_mode):
            before = before or {}
            files = []
            for file_path in self._files_under(path):
                try:
                    fst = _stat(file_path)
                except OSError:
                    continue
                if before.get(file_path) != (fst.st_size, fst.st_mtime_ns):
                    if not self.excluder.excluded(file_path, "write"):
                        files.append(file_path)
            for file_path in files:
                self._add_output(file_path, "write", via, frame if len(files) == 1 else None, True)
        elif st is None or stat_module.S_ISREG(st.st_mode):
            self._add_output(path, "write", via, frame, True)

    def _after_rename_to(self, via, path, moved):
        produced_by_rel = {}
        for file_path, size, sha, produced, rel in moved or ():
            produced_by_rel[rel] = produced
        try:
            st = _stat(path)
        except OSError:
            return
        if stat_module.S_ISDIR(st.st_mode):
            for file_path in self._files_under(path):
                if self.excluder.excluded(file_path, "rename_to"):
                    continue
                rel = os.path.relpath(file_path, path)
                self._add_output(file_path, "rename_to", via, None, produced_by_rel.get(rel, False))
        elif stat_module.S_ISREG(st.st_mode):
            self._add_output(path, "rename_to", via, None, produced_by_rel.get("", False))

    def _add(self, path, direction, via, size, sha, frame):
        key = (path, direction)
        with self._lock:
            entry = self._io.get(key)
            if entry is None:
                self._io[key] = {
                    "path": path,
                    "direction": direction,
                    "bytes": size,
                    "sha256": sha,
                    "via": via,
                    "at": self._now(),
                    "frame": frame,
                    "stamped": False,
                }
            else:
                entry["bytes"] = size
                entry["sha256"] = sha
                if frame is not None:
                    # via and frame describe the same call: the last one
                    # that saw a data frame, else the first.
                    entry["frame"] = frame
                    entry["via"] = via

    def _add_output(self, path, direction, via, frame, produced):
        with self._lock:
            self._add(path, direction, via, None, None, frame)
            key = (path, direction)
            self._pending[key] = self._pending.get(key, False) or produced
            if produced:
                self._written.add(path)

    def _settle(self, path):
        """Hash outputs of ``path`` now (before it is moved or deleted)."""
        for direction in ("write", "rename_to"):
            key = (path, direction)
            if key in self._pending:
                size, sha = sha256_file(path)
                with self._lock:
                    self._pending.pop(key, None)
                    entry = self._io[key]
                    entry["bytes"], entry["sha256"] = size, sha

    # -- the end -----------------------------------------------------------
    def _at_exit(self):
        self.finish()

    def note_result(self, exit_code, exception=None):
        """Set by the runner, which knows exactly how the script ended."""
        self.exit_code = exit_code
        self.exception = exception

    def _final_status(self):
        if self.exit_code is not None:
            return self.exit_code, self.exception
        exc = self._uncaught
        if exc is None:
            exc = getattr(sys, "last_exc", None) or getattr(sys, "last_value", None)
        if exc is not None:
            if isinstance(exc, KeyboardInterrupt):
                return KEYBOARD_INTERRUPT_STATUS, type(exc).__name__
            return 1, type(exc).__name__
        if self._exit_args is not None:
            return exit_status(self._exit_args), None
        return 0, None

    def finish(self):
        """Close the run: stamp and hash outputs, build the record, deliver
        it.  Runs once; never raises."""
        with self._lock:
            if self.finished:
                return self.record
            self.finished = True
            self.active = False
        if self.forked:
            return None
        with internal():
            try:
                self.ended_at = utc_now()
                self.exit_code, self.exception = self._final_status()
                self._finish_outputs()
                self.record = self.build_record()
            except Exception as exc:
                log.error("closing the run", exc)
                return None
            try:
                from headwater import delivery

                self.outcome = delivery.deliver(self.record, self.cfg)
            except Exception as exc:
                log.error("delivering the run record", exc)
        return self.record

    def _finish_outputs(self):
        stamp = None
        if self.cfg.stamp and any(
            os.path.splitext(path)[1].lower() in hooks.STAMPABLE for path, _ in self._pending
        ):
            from headwater import stamp
        for key in list(self._pending):
            path, direction = key
            produced = self._pending.get(key)
            entry = self._io[key]
            if stamp is not None and produced:
                ext = os.path.splitext(path)[1].lower()
                name = hooks.STAMPABLE.get(ext)
                try:
                    small = name is not None and os.path.getsize(path) <= hooks.STAMP_MAX_BYTES
                except OSError:
                    small = False
                if small:
                    try:
                        entry["stamped"] = bool(getattr(stamp, name)(path, self.run_id))
                    except OSError:
                        pass  # gone, read-only...: left as the script made it
                    except Exception as exc:
                        log.error("stamping " + ext, exc)
            size, sha = sha256_file(path)
            entry["bytes"], entry["sha256"] = size, sha
            self._pending.pop(key, None)

    def build_record(self):
        if self.script_path is None:
            main = sys.modules.get("__main__")
            main_file = getattr(main, "__file__", None)
            if isinstance(main_file, str) and main_file:
                path = os.path.join(self.cwd, main_file)
                if os.path.isfile(path):
                    self.set_script(os.path.abspath(path))
        args = self.args
        if args is None:
            args = list(sys.argv[1:]) if getattr(sys, "argv", None) else []
        with self._lock:
            io = [dict(entry) for entry in self._io.values()]
        for entry in io:
            entry["at"] = iso_utc(entry["at"])
            if entry["frame"] is not None:
                entry["frame"] = frame_json(entry["frame"])
        return {
            "run_id": self.run_id,
            "client": CLIENT,
            "script": {
                "path": self.script_path,
                "sha256": self.script_sha,
                "git_commit": git_commit(self.script_path),
                "language": "python",
            },
            "args": [str(a) for a in args],
            "user": _user(),
            "host": _host(),
            "python": python_version(),
            "cwd": self.cwd,
            "started_at": self.started_at,
            "ended_at": self.ended_at,
            "exit_code": self.exit_code,
            "exception": self.exception,
            "io": io,
        }


def start(mode="env", environ=None):
    """Start capture in this process; later calls return the same session."""
    global _session
    with _start_lock:
        if _session is None:
            session = Session(config.Config(environ), mode)
            _session = session
            session.install()
        return _session


def current():
    return _session


def discard():
    """Stop capturing without sending anything (``python -m headwater
    flush`` under HEADWATER_CAPTURE=1 is not a run)."""
    global _session
    with _start_lock:
        session = _session
        if session is None:
            return
        session.active = False
        session.finished = True
        session.uninstall()
        _session = None
