#!/bin/sh
# Fetches the csv-spectrum test suite (BSD-2-Clause, npm package csv-spectrum) into
# server/target/csv-spectrum/package/, where CsvSpectrumTest looks for it.
# Run it after any `mvn clean`, which deletes target/. Needs npm and the npm registry.
set -eu
version=2.0.0
server_dir=$(cd "$(dirname "$0")/../.." && pwd)
dest="$server_dir/target/csv-spectrum"
if [ -f "$dest/package/package.json" ] && grep -q "\"version\": \"$version\"" "$dest/package/package.json"; then
  exit 0
fi
rm -rf "$dest"
mkdir -p "$dest"
cd "$dest"
npm pack --silent "csv-spectrum@$version" >/dev/null
tar -xzf "csv-spectrum-$version.tgz"
test -d package/csvs && test -d package/json
