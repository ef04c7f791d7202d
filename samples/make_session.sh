#!/usr/bin/env bash
# Builds samples/demo.earmark: a listening session over the twelve demo takes
# of samples/lines.csv, with example marks on the takes that carry a planted
# fault (samples/README.md) and the clean takes set to "clean". Uses only
# earmark-cli, so it also shows the command line at work.
#
# Usage: samples/make_session.sh [EARMARK_CLI]
#   EARMARK_CLI defaults to build/release/app/cli/earmark-cli, then to
#   earmark-cli on PATH. Runs from any directory; audio paths in the session
#   are stored relative to it (takes/…), so the folder can be moved whole.
#
# Spans come from the measurements in samples/README.md (0.25 s of padding
# before each take's speech; the pause in ferry-005 from 1.84 to 3.33 s; the
# speech of ferry-011 starting at 2.00 s). When samples/timings/<id>.json
# exists, it is stored as that take's tiers so marks name the words they cover.
# Timestamps differ from run to run; everything else is the same.
set -euo pipefail

# shellcheck source=find_cli.sh
source "$(dirname "${BASH_SOURCE[0]}")/find_cli.sh"
cli="$(cd "$(dirname "$cli")" && pwd)/$(basename "$cli")"   # stays valid after the cd below

cd "$here"
export EARMARK_RATER=demo   # who the tiers, marks and statuses below are recorded for, unless --rater says otherwise
part=demo.earmark.part   # built beside the final file, so relative paths stay right
rm -f "$part" "$part-wal" "$part-shm"
trap 'rm -f "$part" "$part-wal" "$part-shm"' EXIT

"$cli" session new "$part" >/dev/null
"$cli" session add "$part" --text-file lines.csv --build pennant-2 >/dev/null
for timings in timings/*.json; do
    [[ -e "$timings" ]] || continue
    id="$(basename "$timings" .json)"
    "$cli" session tiers "$part" --take "$id" "$timings" >/dev/null
done

mark() {  # mark TAKE START END CATEGORY SUBTYPE SEVERITY NOTE
    local subtype=()
    [[ -n "$5" ]] && subtype=(--subtype "$5")
    "$cli" mark add "$part" --take "$1" --start "$2" --end "$3" --category "$4" "${subtype[@]}" \
        --severity "$6" --note "$7" >/dev/null
}

mark ferry-003 0.25 3.83 intonation flat major \
    "The whole line sits on one note; the statement never falls."
mark ferry-005 1.84 3.33 timing pause-too-long major \
    "1.5 s of silence between \"pass\" and \"ready\"."
mark ferry-006 0.25 2.67 timing rushed major \
    "About twice the normal rate; names run together."
mark ferry-008 0.25 4.38 artifact clipping blocker \
    "Clips all through the line (over 2 000 samples at full scale)."
mark ferry-009 3.75 4.048 artifact truncation blocker \
    "Cut off inside \"gangway\"; no trailing silence."
mark ferry-011 0.00 2.00 timing pause-extra minor \
    "2 s of silence before the speech starts."
mark ferry-012 0.25 4.50 other "" minor \
    "Peak at -23 dBFS, 20 dB quieter than the other takes."

for clean in ferry-001 ferry-002 ferry-004 ferry-007 ferry-010; do
    "$cli" session status "$part" --take "$clean" clean >/dev/null
done

# Closing the last connection has folded the journal into the file, so the
# session is one self-contained file now.
mv "$part" demo.earmark
trap - EXIT
"$cli" session list demo.earmark
