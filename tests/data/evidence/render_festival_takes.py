#!/usr/bin/env python3
"""Renders the test takes of the word-evidence tests with Debian's festival
voices and writes, beside each WAV, the truth: festival's own word start and
end times from its utterance structure (first and last segment of each word).

Usage: render_festival_takes.py OUTDIR

Takes (texts of our own, sentences.txt): every sentence by three voices that
are not espeak-ng — cmu_us_slt_arctic_hts (statistical-parametric, trained on
recordings) and kal_diphone / ked_diphone (diphones cut from recordings) —
resampled alternately to 16 kHz and 22.05 kHz; every third take gets 0.6 s of
silence before and 0.8 s after, every fourth light white noise (30 dB SNR,
seeded). Planted faults (faults.txt, one per line: id|script|spoken|kind|cut)
are rendered by the same voices: the audio says `spoken` while the script is
`script`; kind "cut" truncates the audio inside the named word and pads 0.25 s
of silence.
Writes OUTDIR/<voice>-<n>.wav, .txt (the script) and .words (start end word).
"""
import json, os, random, subprocess, sys, wave, array, math

VOICES = [("slt", "voice_cmu_us_slt_arctic_hts"), ("kal", "voice_kal_diphone"), ("ked", "voice_ked_diphone")]
HERE = os.path.dirname(os.path.abspath(__file__))


def scheme_string(s):
    return '"' + s.replace("\\", "\\\\").replace('"', '\\"') + '"'


def render(voice_fn, jobs, out):
    """jobs: list of (name, spoken text). One festival process per voice."""
    lines = ["(%s)" % voice_fn]
    for name, text in jobs:
        wav = os.path.join(out, name + ".raw.wav")
        lines.append('(set! utt (SynthText %s))' % scheme_string(text))
        lines.append('(utt.save.wave utt %s \'riff)' % scheme_string(wav))
        lines.append('(format t "@@ %s\\n")' % name)
        lines.append("""(mapcar (lambda (w)
  (let ((s1 (item.relation.daughter1 (item.relation.daughter1 w 'SylStructure) 'SylStructure))
        (s2 (item.relation.daughtern (item.relation.daughtern w 'SylStructure) 'SylStructure)))
   (if (and s1 s2) (format t "%s\\t%f\\t%f\\n" (item.name w) (item.feat s1 "segment_start") (item.feat s2 "end")))))
 (utt.relation.items utt 'Word))""")
    script = os.path.join(out, "render-%s.scm" % voice_fn)
    with open(script, "w") as f:
        f.write("\n".join(lines) + "\n")
    text = subprocess.run(["festival", "-b", script], check=True, capture_output=True, text=True).stdout
    words, current = {}, None
    for line in text.splitlines():
        if line.startswith("@@ "):
            current = line[3:].strip()
            words[current] = []
        elif current and line.count("\t") == 2:
            w, s, e = line.split("\t")
            words[current].append((float(s), float(e), w))
    return words


def read_wav(path):
    with wave.open(path) as w:
        rate, n = w.getframerate(), w.getnframes()
        data = array.array("h", w.readframes(n))
        ch = w.getnchannels()
    if ch > 1:
        data = array.array("h", data[::ch])
    return rate, [x / 32768.0 for x in data]


def write_wav(path, rate, samples):
    data = array.array("h", [max(-32768, min(32767, int(round(x * 32767)))) for x in samples])
    with wave.open(path, "wb") as w:
        w.setnchannels(1)
        w.setsampwidth(2)
        w.setframerate(rate)
        w.writeframes(data.tobytes())


def finish(out, name, index, script, words, cut_word=None):
    raw = os.path.join(out, name + ".raw.wav")
    rate_out = 16000 if index % 2 == 0 else 22050
    res = os.path.join(out, name + ".rs.wav")
    subprocess.run(["sox", "-V1", raw, "-r", str(rate_out), res, "vol", "0.8"], check=True)
    rate, x = read_wav(res)
    os.remove(raw)
    os.remove(res)
    if cut_word is not None:
        s, e, _ = words[cut_word]
        cut = int((s + 0.55 * (e - s)) * rate)
        x = x[:cut] + [0.0] * int(0.25 * rate)
        words = words[:cut_word]
    pad_before = 0.6 if index % 3 == 0 else 0.0
    pad_after = 0.8 if index % 3 == 0 else 0.0
    x = [0.0] * int(pad_before * rate) + x + [0.0] * int(pad_after * rate)
    if index % 4 == 1:
        rng = random.Random(1000 + index)
        power = sum(v * v for v in x) / max(1, len(x))
        sigma = math.sqrt(power / (10 ** (30 / 10)))
        x = [v + rng.gauss(0, sigma) for v in x]
    write_wav(os.path.join(out, name + ".wav"), rate, x)
    with open(os.path.join(out, name + ".txt"), "w") as f:
        f.write(script + "\n")
    with open(os.path.join(out, name + ".words"), "w") as f:
        for s, e, w in words:
            f.write("%.4f\t%.4f\t%s\n" % (s + pad_before, e + pad_before, w))


def main():
    out = sys.argv[1]
    os.makedirs(out, exist_ok=True)
    sentences = [l.strip() for l in open(os.path.join(HERE, "sentences.txt")) if l.strip()]
    faults = [l.strip().split("|") for l in open(os.path.join(HERE, "faults.txt")) if l.strip() and not l.startswith("#")]
    for short, fn in VOICES:
        jobs = [("%s-%02d" % (short, i), s) for i, s in enumerate(sentences)]
        jobs += [("%s-fault-%s" % (short, f[0]), f[2]) for f in faults]
        words = render(fn, jobs, out)
        for i, s in enumerate(sentences):
            name = "%s-%02d" % (short, i)
            finish(out, name, i, s, words[name])
        for j, f in enumerate(faults):
            name = "%s-fault-%s" % (short, f[0])
            cut = None
            if f[3] == "cut":
                spoken = words[name]
                cut = [k for k, w in enumerate(spoken) if w[2].lower() == f[4].lower()][0]
            finish(out, name, j + 1, f[1], words[name], cut)


if __name__ == "__main__":
    main()
