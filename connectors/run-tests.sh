#!/bin/sh
# Runs the Python and R connectors' own test suites (Maven calls this in the test phase).
# A missing interpreter skips its suite with a message, unless HEADWATER_REQUIRE_EXTERNAL=true (CI),
# where it is a failure. The Python suite prefers Debian's interpreter, which sees python3-pandas and
# python3-matplotlib; HEADWATER_PYTHON overrides it.
set -eu
cd "$(dirname "$0")/.."
require="${HEADWATER_REQUIRE_EXTERNAL:-false}"
status=0

python="${HEADWATER_PYTHON:-}"
if [ -z "$python" ]; then
  if [ -x /usr/bin/python3 ]; then python=/usr/bin/python3; else python=$(command -v python3 || true); fi
fi
if [ -n "$python" ]; then
  echo "connectors: Python connector tests with $python"
  # Under CI also the slow test that pip-installs the package into a fresh virtual environment.
  if [ "$require" = "true" ]; then export HEADWATER_SLOW_TESTS=1; fi
  "$python" -m unittest discover -s connectors/python/tests -t connectors/python || status=1
elif [ "$require" = "true" ]; then
  echo "connectors: python3 is missing (HEADWATER_REQUIRE_EXTERNAL=true)" >&2; status=1
else
  echo "connectors: python3 not found; skipping the Python connector tests"
fi

if command -v Rscript >/dev/null 2>&1; then
  echo "connectors: R connector tests"
  Rscript connectors/r/tests/run-tests.R || status=1
elif [ "$require" = "true" ]; then
  echo "connectors: Rscript is missing (HEADWATER_REQUIRE_EXTERNAL=true)" >&2; status=1
else
  echo "connectors: Rscript not found; skipping the R connector tests"
fi
exit $status
