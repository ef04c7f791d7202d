#!/usr/bin/env bash
# Writes samples/pairs/: a demo pair for `earmark-cli compare` and demo model
# outputs for `earmark-cli model` (see README.md, "Pairs and model outputs").
#
# - build-a.wav, build-b.wav: one announcement of the invented Ostrel Sound
#   Ferries read by two invented voice builds, "pennant-2" and
#   "pennant-3-beta" (espeak-ng with another voice, rate and pitch).
# - build-a.words.json: the words of build-a.wav, aligned from its text.
# - predicted-mel.npy (+ .npy.json sidecar): Earmark's own mel spectrogram of
#   build-a.wav standing in for a model's prediction, with one planted local
#   distortion (see PLANT below).
# - attention.npy + attention-tokens.txt: a made-up attention matrix over the
#   line's words, paced like build-a.wav, in which the "model" skips one word
#   and goes back to repeat another.
#
# Usage: samples/make_pairs.sh [EARMARK_CLI]
#   EARMARK_CLI defaults to build/release/app/cli/earmark-cli, then to
#   earmark-cli on PATH. Needs espeak-ng, sox and /usr/bin/python3 with numpy.
#   Runs from any directory; deterministic for the same tool versions.
set -euo pipefail

# shellcheck source=find_cli.sh
source "$(dirname "${BASH_SOURCE[0]}")/find_cli.sh"
for tool in espeak-ng sox; do
    if ! command -v "$tool" >/dev/null 2>&1; then
        echo "make_pairs.sh: '$tool' not found on PATH (Debian package: $tool)" >&2
        exit 1
    fi
done
if ! /usr/bin/python3 -c 'import numpy' 2>/dev/null; then
    echo "make_pairs.sh: /usr/bin/python3 with numpy is needed (Debian package: python3-numpy)" >&2
    exit 1
fi

text="The evening ferry to Wrenholm leaves from berth three at half past six."

work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
mkdir -p "$work/pairs"

# render OUT VOICE RATE PITCH: espeak-ng, then the same tidy step as
# make_samples.sh (22 050 Hz 16-bit mono, silence stripped, peak -3 dBFS,
# 0.25 s padding), sox without dither and in repeatable mode.
render() {
    espeak-ng -v "$2" -s "$3" -p "$4" -z -w "$work/raw.wav" "$text"
    sox -D -R -V1 "$work/raw.wav" -r 22050 -b 16 -c 1 "$1" \
        silence 1 0.01 0.1% reverse silence 1 0.01 0.1% reverse gain -n -3 pad 0.25 0.25
}
render "$work/pairs/build-a.wav" en-gb-x-rp 160 50   # pennant-2
render "$work/pairs/build-b.wav" en-us 140 62        # pennant-3-beta: other voice, slower, higher

"$cli" align "$work/pairs/build-a.wav" --text "$text" --json "$work/pairs/build-a.words.json" >/dev/null
"$cli" analyze "$work/pairs/build-a.wav" --tracks mel --mel-npy "$work/pairs/predicted-mel.npy" >/dev/null

/usr/bin/python3 - "$work/pairs" "$text" <<'PY'
import json, os, sys
import numpy as np

out, text = sys.argv[1], sys.argv[2]

# PLANT: +10 dB over bands 30-44 (centres 1.2-2.0 kHz) during "berth three",
# as if the model had smeared a formant there. The mel is ln(magnitude), so
# +10 dB is +10·ln(10)/20 in its units. Frames: 256 samples at 22 050 Hz.
words = json.load(open(os.path.join(out, "build-a.words.json")))["words"]
span = [w for w in words if w["text"] in ("berth", "three")]
hop = 256 / 22050
first, last = int(round(span[0]["start"] / hop)), int(round(span[-1]["end"] / hop))
path = os.path.join(out, "predicted-mel.npy")
mel = np.load(path)  # (bands, frames), as Earmark writes it
mel[30:45, first:last + 1] += np.float32(10.0 * np.log(10.0) / 20.0)
np.save(path, mel)
with open(os.path.join(out, "planted.txt"), "w") as f:
    f.write("predicted-mel.npy: +10 dB, bands 30-44, frames %d-%d (%.3f-%.3f s)\n"
            % (first, last, first * hop, (last + 1) * hop))

# Attention over the words (one token each): each word holds the frames the
# take gives it, pauses go to the word before. The "model" skips "from"
# (it jumps from "leaves" to "berth") and, after moving on to "past", goes
# back to "half" for 8 frames before reading "past" again.
tokens = [w["text"] for w in words]
frames_total = int(round(float(json.load(open(os.path.join(out, "build-a.words.json")))["duration"]) / hop))
bounds = [int(round(w["start"] / hop)) for w in words] + [frames_total]
bounds[0] = 0
path_tokens = []
for k, tok in enumerate(tokens):
    n = bounds[k + 1] - bounds[k]
    if tok == "from":
        path_tokens.extend([k + 1] * n)   # skipped: attention already on the next word
        continue
    path_tokens.extend([k] * n)
    if tok == "past":
        path_tokens.extend([k - 1] * 8 + [k] * 6)
path_tokens = np.array(path_tokens)
positions = np.arange(len(tokens))[None, :]
weights = np.exp(-0.5 * ((positions - path_tokens[:, None]) / 0.6) ** 2)
weights /= weights.sum(axis=1, keepdims=True)
np.save(os.path.join(out, "attention.npy"), weights.astype("<f4"))
with open(os.path.join(out, "attention-tokens.txt"), "w") as f:
    f.write("\n".join(tokens) + "\n")
PY

rm -rf "$here/pairs"
mv "$work/pairs" "$here/pairs"
ls -l "$here/pairs"
