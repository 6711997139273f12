"""Interpreter start-up: the env-var switch.

``headwater_capture.pth`` (installed by pip next to the package) and
``sitecustomize.py`` (beside the package in connectors/python, for use with
PYTHONPATH only) both call ``from_environment``; starting is idempotent, so
having both is harmless.
"""

import os
import sys


def from_environment():
    """Start capture when HEADWATER_CAPTURE is 1/true/yes/on."""
    from headwater import config

    if not config.capture_requested():
        return None
    try:
        from headwater import capture

        return capture.start(mode="env")
    except Exception as exc:  # never stop the interpreter from starting
        from headwater import log

        log.error("starting capture", exc)
        return None


def chain_sitecustomize(this_file, namespace):
    """Run the ``sitecustomize`` module that ``this_file`` shadows: the
    first one found on sys.path after the folder of ``this_file``.  Its
    public names are copied into ``namespace`` (the importing module's
    globals).  A failure is reported the way site.py reports a failing
    sitecustomize (CPython Lib/site.py, execsitecustomize)."""
    import importlib.machinery

    here = os.path.dirname(os.path.abspath(this_file))
    rest = []
    seen_here = False
    for entry in sys.path:
        if not isinstance(entry, str):
            continue
        try:
            absolute = os.path.abspath(entry or os.curdir)
        except Exception:
            continue
        if absolute == here:
            seen_here = True
            continue
        if seen_here:
            rest.append(entry)
    if not seen_here:
        return None
    spec = importlib.machinery.PathFinder.find_spec("sitecustomize", rest)
    if spec is None or spec.loader is None:
        return None
    if spec.origin and os.path.abspath(spec.origin) == os.path.abspath(this_file):
        return None
    # What importlib.util.module_from_spec does, without importing
    # importlib.util (and contextlib, collections...) at every start-up.
    module = spec.loader.create_module(spec) if hasattr(spec.loader, "create_module") else None
    if module is None:
        module = type(sys)(spec.name)
    module.__spec__ = spec
    module.__loader__ = spec.loader
    module.__package__ = spec.parent
    if spec.has_location:
        module.__file__ = spec.origin
        if spec.cached:
            module.__cached__ = spec.cached
    try:
        spec.loader.exec_module(module)
    except Exception as err:
        if sys.flags.verbose:
            sys.excepthook(*sys.exc_info())
        else:
            sys.stderr.write(
                "Error in sitecustomize; set PYTHONVERBOSE for traceback:\n%s: %s\n"
                % (err.__class__.__name__, err)
            )
        return None
    for key, value in vars(module).items():
        if not (key.startswith("__") and key.endswith("__")):
            namespace.setdefault(key, value)
    namespace["__headwater_chained__"] = module
    return module
