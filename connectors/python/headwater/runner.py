"""``python -m headwater run script.py ARGS...``: run a script as
``__main__`` the way ``python script.py ARGS...`` does, with capture on.

What the interpreter does for a script and is copied here (CPython
Modules/main.c and Python/pythonrun.c, checked against Python 3.9-3.13):
``sys.argv`` is the script as given followed by its arguments; ``__file__``
and the code's file name are the absolute path; ``sys.path[0]`` is the
folder of the script with symbolic links resolved (not under -P/-I); the
``__main__`` module has ``__loader__`` a SourceFileLoader, ``__spec__``,
``__package__`` and ``__cached__`` None.  Tracebacks lose the runner's
frames (tbfilter.py), so they print as without capture; SystemExit and other
exceptions leave the runner unchanged, so the interpreter turns them into the
same exit status and messages.
"""

import atexit
import builtins
import hashlib
import importlib.machinery
import os
import sys
import threading
import types

from headwater import capture, tbfilter

# Imported now: sys.path[0] changes to the script's folder below, and the
# package may have been found through the current directory.
from headwater import delivery, stamp  # noqa: F401


class _NoFrames(object):
    """Stands for a code object no frame has: strip every frame."""


def _other_threads_running():
    main = threading.main_thread()
    return any(t.is_alive() and not t.daemon and t is not main for t in threading.enumerate())


def _atexit_count():
    count = getattr(atexit, "_ncallbacks", None)  # CPython
    return count() if count is not None else None


def _finish(session, handlers_before):
    # The run ends here, unless more may still be written: non-daemon
    # threads (joined by the interpreter before atexit) or atexit handlers
    # registered while the script ran (they run before the connector's own,
    # which was registered first).  Then the session finishes at atexit.
    after = _atexit_count()
    if _other_threads_running() or after is None or after > handlers_before:
        return
    session.finish()


def run(script, args):
    session = capture.start(mode="runner")
    path = os.path.abspath(script)
    try:
        with capture._open(path, "rb") as handle:
            source = handle.read()
    except OSError as exc:
        capture.discard()
        sys.stderr.write("%s: can't open file %r: [Errno %s] %s\n"
                         % (sys.executable, path, exc.errno, exc.strerror))
        return 2
    session.set_script(path, hashlib.sha256(source).hexdigest())
    session.args = list(args)

    old_main = sys.modules.get("__main__")
    main = types.ModuleType("__main__")
    main.__file__ = path
    main.__cached__ = None
    main.__builtins__ = builtins
    main.__loader__ = importlib.machinery.SourceFileLoader("__main__", path)
    main.__spec__ = None
    main.__package__ = None
    if old_main is not None and "__annotations__" in vars(old_main):
        main.__annotations__ = {}

    launcher = sys.argv[0] if sys.argv else ""
    sys.argv[:] = [script] + list(args)
    flags = sys.flags
    if not (getattr(flags, "safe_path", False) or flags.isolated):
        # The entry Python put first for this launcher (the current folder
        # for -m, the console script's folder for `headwater run`) gives
        # way to the script's folder.
        folder = os.path.dirname(os.path.realpath(path))
        first = os.path.abspath(sys.path[0]) if sys.path and sys.path[0] else os.getcwd()
        launcher_dir = os.path.dirname(os.path.realpath(launcher)) if launcher not in ("", "-m", "-c") else None
        if sys.path and (first == os.getcwd() or first == launcher_dir):
            sys.path[0] = folder
        else:
            sys.path.insert(0, folder)
    sys.modules["__main__"] = main
    handlers = _atexit_count()

    try:
        code = compile(source, path, "exec", dont_inherit=True)
    except BaseException as exc:
        tbfilter.script_code = _NoFrames
        session.note_result(1, type(exc).__name__)
        _finish(session, handlers)
        raise
    tbfilter.script_code = code
    try:
        exec(code, main.__dict__)
    except SystemExit as exc:
        session.note_result(capture.exit_status(exc.code), None)
        _finish(session, handlers)
        raise
    except BaseException as exc:
        status = capture.KEYBOARD_INTERRUPT_STATUS if isinstance(exc, KeyboardInterrupt) else 1
        session.note_result(status, type(exc).__name__)
        _finish(session, handlers)
        raise
    session.note_result(0, None)
    _finish(session, handlers)
    return 0
