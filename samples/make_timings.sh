#!/usr/bin/env bash
# Writes samples/timings/<id>.json: word and phone timings of every demo take
# in samples/lines.csv, found by `earmark-cli align` from the take's text
# (Earmark JSON, docs/timings-json.md). The takes were rendered with
# en-gb-x-rp; the aligner's reference reads with its default voice (en-us),
# so the timings come from a real cross-voice alignment.
#
# Usage: samples/make_timings.sh [EARMARK_CLI]
#   EARMARK_CLI defaults to build/release/app/cli/earmark-cli, then to
#   earmark-cli on PATH. Runs from any directory.
set -euo pipefail

# shellcheck source=find_cli.sh
source "$(dirname "${BASH_SOURCE[0]}")/find_cli.sh"

mkdir -p "$here/timings"
# lines.csv quotes texts that hold commas (RFC 4180): let Python's csv module
# read it and hand over id, audio and text separated by NUL bytes.
/usr/bin/python3 - "$here/lines.csv" <<'PY' |
import csv, sys
with open(sys.argv[1], newline="", encoding="utf-8") as f:
    for row in csv.DictReader(f):
        sys.stdout.write(row["id"] + "\0" + row["audio"] + "\0" + row["text"] + "\0")
PY
while IFS= read -r -d '' id && IFS= read -r -d '' audio && IFS= read -r -d '' text; do
    "$cli" align "$here/$audio" --text "$text" --json "$here/timings/$id.json" >/dev/null
    echo "$id: timings/$id.json"
done
