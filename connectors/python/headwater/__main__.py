"""Command line: ``python -m headwater run|flush|version``."""

import sys

USAGE = """usage:
  python -m headwater run SCRIPT [ARGS...]   run a script with capture on
  python -m headwater flush                  send the spooled run records
  python -m headwater version                print the connector's version
"""


def _flush():
    from headwater import config, delivery

    cfg = config.Config()
    if not cfg.url:
        sys.stderr.write("headwater: HEADWATER_URL is not set; nothing was sent (spool: %s)\n" % cfg.spool)
        return 2
    stats = delivery.flush(cfg)
    print("sent %d, dropped %d, kept %d (spool: %s)" % (stats["sent"], stats["dropped"], stats["kept"], cfg.spool))
    return 1 if stats["kept"] else 0


def main(argv=None):
    argv = list(sys.argv[1:] if argv is None else argv)
    command = argv[0] if argv else None
    if command == "run":
        if len(argv) < 2:
            sys.stderr.write(USAGE)
            return 2
        from headwater import runner

        return runner.run(argv[1], argv[2:])

    # Not a run: a session started by HEADWATER_CAPTURE=1 is dropped.
    from headwater import capture

    capture.discard()
    if command == "flush":
        return _flush()
    if command in ("version", "--version"):
        from headwater import CLIENT

        print(CLIENT)
        return 0
    if command in ("-h", "--help", "help"):
        sys.stdout.write(USAGE)
        return 0
    sys.stderr.write(USAGE)
    return 2



def cli():
    """Entry point of the ``headwater`` console script."""
    sys.exit(main())


if __name__ == "__main__":
    sys.exit(main())
