"""Keep tracebacks exactly as they are without capture.

Two kinds of frames would otherwise show up in a traceback that an uncaught
exception prints: the connector's call wrappers (when an exception passes
through a wrapped ``open`` or ``read_csv``), and, under the runner, the
runner's own frames above the script's module frame.  Both are unlinked from
the traceback before the interpreter's exception hook prints it
(``traceback.tb_next`` is writable since Python 3.7, see the language
reference, "Traceback objects").
"""

import sys

from headwater.hooks import HIDDEN_FILENAME

# Under the runner: the code object of the script's module; frames above its
# first appearance are the runner's.
script_code = None
# Called with the exception before it is printed (the session notes it).
on_uncaught = None


def _hidden(tb):
    return tb.tb_frame.f_code.co_filename == HIDDEN_FILENAME


def strip(tb, top_code=None):
    if top_code is not None:
        head = tb
        while head is not None and head.tb_frame.f_code is not top_code:
            head = head.tb_next
        # An exception that never reached the script's code (its compile
        # failed, e.g. a SyntaxError) is printed by Python without frames.
        tb = head
    while tb is not None and _hidden(tb):
        tb = tb.tb_next
    cur = tb
    while cur is not None:
        nxt = cur.tb_next
        while nxt is not None and _hidden(nxt):
            nxt = nxt.tb_next
        if nxt is not cur.tb_next:
            try:
                cur.tb_next = nxt
            except (AttributeError, TypeError, ValueError):
                return tb
        cur = nxt
    return tb


def clean(value, top_code=None):
    """Strip the exception's traceback and those of its causes, contexts
    and (for exception groups) members.  Returns the new top traceback."""
    top = None
    seen = set()
    todo = [(value, top_code)]
    first = True
    while todo:
        exc, code = todo.pop()
        if exc is None or id(exc) in seen or not isinstance(exc, BaseException):
            continue
        seen.add(id(exc))
        new_tb = strip(exc.__traceback__, code)
        try:
            exc.__traceback__ = new_tb
        except Exception:
            pass
        if first:
            top = new_tb
            first = False
        todo.append((exc.__cause__, None))
        todo.append((exc.__context__, None))
        for member in getattr(exc, "exceptions", ()) or ():
            todo.append((member, None))
    return top


def make_excepthook(previous):
    def excepthook(exc_type, exc_value, exc_tb):
        try:
            if on_uncaught is not None:
                on_uncaught(exc_value)
        except Exception:
            pass
        try:
            if exc_value is not None and exc_tb is exc_value.__traceback__:
                exc_tb = clean(exc_value, script_code)
            elif exc_tb is not None:
                exc_tb = strip(exc_tb, script_code)
        except Exception:
            pass
        return previous(exc_type, exc_value, exc_tb)

    excepthook.__headwater_previous__ = previous
    return excepthook


def make_thread_excepthook(previous):
    def excepthook(args):
        try:
            if args.exc_value is not None:
                clean(args.exc_value)
                if args.exc_traceback is not None:
                    # ExceptHookArgs is a struct sequence: rebuild it.
                    import threading

                    args = threading.ExceptHookArgs(
                        (args.exc_type, args.exc_value, args.exc_value.__traceback__, args.thread)
                    )
        except Exception:
            pass
        return previous(args)

    excepthook.__headwater_previous__ = previous
    return excepthook


def install():
    if not hasattr(sys.excepthook, "__headwater_previous__"):
        sys.excepthook = make_excepthook(sys.excepthook)
    threading = sys.modules.get("threading")
    if threading is not None and hasattr(threading, "excepthook"):
        if not hasattr(threading.excepthook, "__headwater_previous__"):
            threading.excepthook = make_thread_excepthook(threading.excepthook)
