"""Connector messages go to the interpreter's original stderr, each at most
once per process, so that a fault in the connector never floods a script's
output or stops it."""

import sys
import threading

_seen = set()
_lock = threading.Lock()
verbose = False


def once(key, message):
    with _lock:
        if key in _seen:
            return
        _seen.add(key)
    write(message)


def info(message):
    if verbose:
        write(message)


def write(message):
    stream = sys.__stderr__
    if stream is None:
        return
    try:
        stream.write("headwater: %s\n" % (message,))
        stream.flush()
    except Exception:
        pass


def error(key, exc):
    """Log an unexpected exception inside the connector, once per key."""
    once(key, "internal error in %s (capture goes on, the script is not affected): %s: %s"
         % (key, type(exc).__name__, exc))
