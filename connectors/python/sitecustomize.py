"""Headwater's start-up hook for use with PYTHONPATH=connectors/python.

With HEADWATER_CAPTURE=1 every Python process that has this folder on its
path records a run.  Any other sitecustomize that this file shadows (one
further on sys.path, e.g. the system's) is loaded first, so it keeps working.
This file is not part of the installed package: pip installs
headwater_capture.pth instead.
"""


def _headwater_start(namespace):
    try:
        from headwater import _boot
    except Exception:
        return
    try:
        _boot.chain_sitecustomize(__file__, namespace)
    finally:
        _boot.from_environment()


_headwater_start(globals())
del _headwater_start
