"""Headwater's Python connector: records which data files a script reads and
writes, and sends one run record per run to a Headwater server.

Switch it on without editing scripts:

* ``python -m headwater run script.py ARGS...``
* ``HEADWATER_CAPTURE=1`` in the environment (picked up at interpreter start by
  ``headwater_capture.pth`` when pip-installed, or by ``sitecustomize.py`` when
  only ``connectors/python`` is on ``PYTHONPATH``).

Importing this package does not import pandas, numpy, matplotlib or any other
data library; their public functions are wrapped only when they get imported.
"""

__version__ = "0.1.0"
CLIENT = "headwater-python/" + __version__


def start():
    """Start capturing in this process (idempotent) and return the session."""
    from headwater import capture

    return capture.start()


def current():
    """The active capture session, or None."""
    from headwater import capture

    return capture.current()
