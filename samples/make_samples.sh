#!/usr/bin/env bash
# Renders Earmark's demo takes: the fictional voice build "pennant-2" reading
# announcements for the invented Ostrel Sound Ferries. Some takes carry one
# planted fault each (see README.md). Writes samples/takes/*.wav and
# samples/lines.csv next to this script, whatever the working directory.
#
# Deterministic: espeak-ng renders the same samples for the same input, and sox
# runs with dither off (-D) and in repeatable mode (-R), so a re-run with the
# same tool versions reproduces the committed files byte for byte.
set -euo pipefail

here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"

for tool in espeak-ng sox; do
    if ! command -v "$tool" >/dev/null 2>&1; then
        echo "make_samples.sh: '$tool' not found on PATH (Debian package: $tool)" >&2
        exit 1
    fi
done

voice=en-gb-x-rp      # espeak-ng English voice variant
speed_wpm=160         # normal speaking rate
pitch=50              # espeak-ng pitch adjustment, 0-99 (50 is its default)
rate_hz=22050
lead_s=0.25           # silence padded before and after each clean take
peak_db=-3            # peak level of clean takes, dBFS

work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
mkdir -p "$work/takes"

sox_q() { sox -D -R -V1 "$@"; }   # no dither, repeatable, errors only

# speak OUT SPEED TEXT_OR_SSML [ssml]: espeak-ng straight to a WAV file.
# -z drops espeak's own end-of-sentence pause; padding is added by tidy().
speak() {
    local out=$1 speed=$2 text=$3 mode=${4:-plain}
    local args=(-v "$voice" -s "$speed" -p "$pitch" -z -w "$out")
    if [[ $mode == ssml ]]; then args+=(-m); fi
    espeak-ng "${args[@]}" "$text"
}

# tidy IN OUT: 22050 Hz 16-bit mono, strip leading/trailing silence (below
# -60 dBFS), normalise the peak to $peak_db, pad $lead_s of silence each side.
tidy() {
    sox_q "$1" -r "$rate_hz" -b 16 -c 1 "$2" \
        silence 1 0.01 0.1% reverse silence 1 0.01 0.1% reverse \
        gain -n "$peak_db" pad "$lead_s" "$lead_s"
}

csv_field() {   # RFC 4180: quote a field that holds a comma or a quote
    local s=$1
    if [[ $s == *[,\"]* ]]; then s="\"${s//\"/\"\"}\""; fi
    printf '%s' "$s"
}

rows=()
add_row() {     # add_row ID TEXT FAULT
    rows+=("$1,takes/$1.wav,$(csv_field "$2"),$3")
}

# clean ID TEXT: a take with no planted fault.
clean() {
    speak "$work/$1.raw.wav" "$speed_wpm" "$2"
    tidy "$work/$1.raw.wav" "$work/takes/$1.wav"
    add_row "$1" "$2" ""
}

clean ferry-001 "Good morning, and welcome aboard the seven fifteen crossing to Wrenholm."

clean ferry-002 "Would you like a return ticket, or a single to Quellin Isle?"

# flat: SSML prosody range 0% holds F0 on one level (measured span < 1 semitone).
text="The galley on the upper deck stays open until we reach Marrowby harbour."
speak "$work/ferry-003.raw.wav" "$speed_wpm" \
    "<speak><prosody range=\"0%\">$text</prosody></speak>" ssml
tidy "$work/ferry-003.raw.wav" "$work/takes/ferry-003.wav"
add_row ferry-003 "$text" flat

clean ferry-004 "Cars and bicycles should wait in lane four until the ramp is lowered."

# pause-too-long: a 1.5 s SSML break between "pass" and "ready".
speak "$work/ferry-005.raw.wav" "$speed_wpm" \
    '<speak>Please keep your boarding pass <break time="1500ms"/> ready for the crew at the gangway.</speak>' ssml
tidy "$work/ferry-005.raw.wav" "$work/takes/ferry-005.wav"
add_row ferry-005 "Please keep your boarding pass ready for the crew at the gangway." pause-too-long

# rushed: twice the normal speaking rate.
text="Passengers for Quellin Isle, please change at Wrenholm and board the smaller launch."
speak "$work/ferry-006.raw.wav" 320 "$text"
tidy "$work/ferry-006.raw.wav" "$work/takes/ferry-006.wav"
add_row ferry-006 "$text" rushed

clean ferry-007 "Is this the last sailing from Ostrel Point to Marrowby tonight?"

# clipping: the clean take (peak -3 dBFS) raised by 12 dB; sox clips at full
# scale and would warn about it (the warning is expected, -V1 hides it).
text="Due to strong winds, the afternoon sailing will leave twenty minutes late."
speak "$work/ferry-008.raw.wav" "$speed_wpm" "$text"
tidy "$work/ferry-008.raw.wav" "$work/ferry-008.tidy.wav"
sox_q "$work/ferry-008.tidy.wav" "$work/takes/ferry-008.wav" gain 12
add_row ferry-008 "$text" clipping

# truncation: the speech stops 0.25 s before its natural end, inside the last
# word ("gangway" lasts about 0.7 s; the cut falls after "gang-"), with no
# trailing silence.
text="Thank you for travelling with Ostrel Sound Ferries, and mind the gangway."
speak "$work/ferry-009.raw.wav" "$speed_wpm" "$text"
tidy "$work/ferry-009.raw.wav" "$work/ferry-009.tidy.wav"
# tidy() padded $lead_s at the end, so cut $lead_s + 0.25 s from the end.
sox_q "$work/ferry-009.tidy.wav" "$work/takes/ferry-009.wav" trim 0 "-$(awk "BEGIN{print $lead_s + 0.25}")"
add_row ferry-009 "$text" truncation

clean ferry-010 "Dogs are welcome on the open deck but must stay on a short lead."

# leading-silence: 2 s of digital silence before the speech instead of 0.25 s.
text="The next crossing to Wrenholm departs from pier two in ten minutes."
speak "$work/ferry-011.raw.wav" "$speed_wpm" "$text"
tidy "$work/ferry-011.raw.wav" "$work/ferry-011.tidy.wav"
sox_q "$work/ferry-011.tidy.wav" "$work/takes/ferry-011.wav" pad 1.75 0
add_row ferry-011 "$text" leading-silence

# quiet: the clean take lowered by 20 dB (peak -23 dBFS).
text="Lost property can be collected from the ticket office beside the harbour gate."
speak "$work/ferry-012.raw.wav" "$speed_wpm" "$text"
tidy "$work/ferry-012.raw.wav" "$work/ferry-012.tidy.wav"
sox_q "$work/ferry-012.tidy.wav" "$work/takes/ferry-012.wav" gain -20
add_row ferry-012 "$text" quiet

{
    echo "id,audio,text,fault"
    printf '%s\n' "${rows[@]}"
} > "$work/lines.csv"

# Replace the previous output only once everything rendered.
rm -rf "$here/takes"
mkdir -p "$here/takes"
cp "$work"/takes/*.wav "$here/takes/"
cp "$work/lines.csv" "$here/lines.csv"
echo "make_samples.sh: wrote ${#rows[@]} takes to $here/takes and $here/lines.csv"
