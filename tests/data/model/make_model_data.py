#!/usr/bin/python3
"""Writes the reference data for the compare and model tests.

Run from anywhere with the system Python that has numpy:
    /usr/bin/python3 tests/data/model/make_model_data.py

Independent of Earmark's C++ code:
- MCD (Kubichek, "Mel-cepstral distance measure for objective speech
  quality assessment", IEEE PACRIM 1993): (10/ln 10)·sqrt(2·Σ_d (c_d − ĉ_d)²)
  over c1…cD, averaged over frame pairs, computed here with numpy in float64
  from two cepstral matrices written as .npy;
- "predicted" mel spectrograms: numpy's own mel of tests/data/mel/signal.npy
  (the formulas of tests/data/make_reference_data.py, float64), stored in
  both layouts and several dtypes, one with a planted local distortion whose
  place is written down, plus a sidecar in Earmark's form;
- attention matrices built frame by frame with a known path: a clean one and
  one with a skipped and a repeated token at known frames.

Outputs (small, committed): tests/data/model/*. Deterministic: re-running
rewrites identical files.
"""

import json
import os
import sys

import numpy as np

HERE = os.path.dirname(os.path.abspath(__file__))
DATA = os.path.dirname(HERE)
sys.dont_write_bytecode = True  # leave no __pycache__ beside the data
sys.path.insert(0, DATA)
import make_reference_data as ref  # noqa: E402  (the mel formulas, not re-written here)


def save(name, array):
    np.save(os.path.join(HERE, name), array)


# ------------------------------------------------------------------- MCD

def mcd_db(a, b):
    """Kubichek's MCD per pair of rows, over coefficients 1..D (c0 left out)."""
    diff = a[:, 1:].astype(np.float64) - b[:, 1:].astype(np.float64)
    return 10.0 / np.log(10.0) * np.sqrt(2.0 * np.sum(diff * diff, axis=1))


def write_mcd():
    rng = np.random.default_rng(2024)
    dims = 25
    # Cepstra fall off with the coefficient index, as speech cepstra do.
    scale = 1.0 / (1.0 + np.arange(dims))
    a = (rng.standard_normal((70, dims)) * scale).astype("<f4")
    # B: a warped copy of A (some frames doubled, some dropped) plus a small change.
    src = np.clip(np.round(np.linspace(0, 69, 64) + 1.5 * np.sin(np.linspace(0, 6, 64))), 0, 69).astype(int)
    b = (a[src] + 0.05 * rng.standard_normal((64, dims)) * scale).astype("<f4")
    # A monotonic pairing with steps of at most one frame on each side.
    pairs = [(0, 0)]
    while pairs[-1] != (69, 63):
        i, j = pairs[-1]
        step = [(1, 1), (1, 0), (0, 1)][rng.integers(0, 3)]
        i, j = min(69, i + step[0]), min(63, j + step[1])
        pairs.append((i, j))
    pairs = np.array(pairs)
    save("mcd_a.npy", a)
    save("mcd_b.npy", b)
    save("mcd_pairs.npy", pairs.astype("<f4"))  # whole numbers, exact in float32
    per_pair = mcd_db(a[pairs[:, 0]], b[pairs[:, 1]])
    diagonal = mcd_db(a[:64], b)
    return {
        "a": "mcd_a.npy", "b": "mcd_b.npy", "pairs": "mcd_pairs.npy",
        "coefficients": "c1..c24 of 25 (c0 left out)",
        "pairs_mean_db": float(per_pair.mean()),
        "pairs_first_db": [float(v) for v in per_pair[:5]],
        "diagonal_mean_db": float(diagonal.mean()),
        "identical_mean_db": float(mcd_db(a, a).mean()),
    }


# ------------------------------------------------------- predicted mel

def write_predicted_mels():
    mel_ref = json.load(open(os.path.join(DATA, "mel", "reference.json")))
    rate = mel_ref["signal"]["sampleRate"]
    signal = np.load(os.path.join(DATA, "mel", mel_ref["signal"]["file"]))
    cfg = next(s for s in mel_ref["spectrograms"] if s["name"] == "tts_centred")
    mel = ref.mel_spectrogram(signal, rate, cfg)  # (frames, bands), ln of magnitude, float64
    frames, bands = mel.shape

    # C order: Earmark's reader refuses Fortran-order files (np.save of a bare .T writes one).
    save("pred_f16_bands_frames.npy", np.ascontiguousarray(mel.T).astype("<f2"))
    save("pred_log10_bands_frames.npy", np.ascontiguousarray(mel.T / np.log(10.0)).astype("<f4"))
    save("pred_square_f4.npy", mel[:bands].astype("<f4"))  # 80 frames x 80 bands: ambiguous

    planted = dict(first_frame=30, last_frame=39, first_band=20, last_band=29, db=12.0)
    distorted = mel.copy()
    # +12 dB on a magnitude mel is +12·ln(10)/20 in natural log units.
    distorted[30:40, 20:30] += planted["db"] * np.log(10.0) / 20.0
    save("pred_planted_f8_frames_bands.npy", distorted.astype("<f8"))
    sidecar = {
        "layout": "frames x bands", "sample_rate": rate, "hop_size": cfg["hopSize"],
        "fft_size": cfg["fftSize"], "window_size": cfg["windowSize"], "window": "hann-periodic",
        "frame_alignment": "centred", "bands": cfg["bands"], "fmin_hz": cfg["fminHz"],
        "fmax_hz": cfg["fmaxHz"], "mel_scale": cfg["scale"], "normalisation": cfg["normalisation"],
        "spectrum": cfg["kind"], "log": cfg["log"], "log_floor": cfg["floor"], "frames": frames,
    }
    with open(os.path.join(HERE, "pred_planted_f8_frames_bands.npy.json"), "w") as f:
        json.dump(sidecar, f, indent=2)
        f.write("\n")
    with open(os.path.join(HERE, "pred_log10_bands_frames.npy.json"), "w") as f:
        json.dump(dict(sidecar, layout="bands x frames", log="log10"), f, indent=2)
        f.write("\n")
    return {
        "signal": "../mel/" + mel_ref["signal"]["file"], "sample_rate": rate,
        "frames": frames, "bands": bands,
        "f16_bands_frames": "pred_f16_bands_frames.npy",
        "log10_bands_frames": "pred_log10_bands_frames.npy",
        "square": "pred_square_f4.npy",
        "planted_file": "pred_planted_f8_frames_bands.npy",
        "planted": planted,
    }


# ------------------------------------------------------------ attention

TOKENS = ["the", "tide", "turns", "at", "dusk", "so", "we", "wait", "by", "the", "old", "slipway",
          "for", "the", "last", "boat", "to", "come", "in", "from", "the", "far", "reef", "."]


def attention_from_path(path, tokens, sigma=0.7):
    """One row per frame: a Gaussian bump over token positions around path[f], rows sum to 1."""
    k = np.arange(tokens)[None, :]
    centre = np.asarray(path, dtype=np.float64)[:, None]
    w = np.exp(-0.5 * ((k - centre) / sigma) ** 2)
    return w / w.sum(axis=1, keepdims=True)


def write_attention():
    K, D = len(TOKENS), 5  # five frames per token
    clean_path = np.repeat(np.arange(K), D)
    save("attention_clean.npy", attention_from_path(clean_path, K).astype("<f4"))

    # Faulty: token 9 ("the") is never attended — the path jumps from 8 to 10;
    # after moving on to token 17, attention goes back to token 16 for four
    # frames, then on to 17 again.
    faulty = []
    for k in range(K):
        if k == 9:
            continue
        faulty.extend([k] * D)
        if k == 17:
            faulty.extend([16] * 4 + [17] * 3)
    faulty = np.array(faulty)
    skip_frame = int(np.argmax(faulty == 10))
    repeat_first = int(np.flatnonzero(faulty == 17)[0]) + D
    matrix = attention_from_path(faulty, K)
    save("attention_faulty.npy", matrix.astype("<f4"))
    save("attention_faulty_tokens_frames_f2.npy", np.ascontiguousarray(matrix.T).astype("<f2"))
    with open(os.path.join(HERE, "attention_tokens.txt"), "w") as f:
        f.write("\n".join(TOKENS) + "\n")
    return {
        "tokens_file": "attention_tokens.txt", "tokens": K, "frames_per_token": D,
        "clean": "attention_clean.npy", "clean_frames": int(len(clean_path)),
        "faulty": "attention_faulty.npy", "faulty_tokens_frames": "attention_faulty_tokens_frames_f2.npy",
        "faulty_frames": int(len(faulty)),
        "skip": {"frame": skip_frame, "first_token": 9, "last_token": 9},
        "repeat": {"first_frame": repeat_first, "last_frame": repeat_first + 3, "first_token": 16, "last_token": 16},
    }


def main():
    out = {
        "about": "Written by tests/data/model/make_model_data.py with numpy " + np.__version__ +
                 "; do not edit by hand.",
        "mcd": write_mcd(),
        "predicted_mel": write_predicted_mels(),
        "attention": write_attention(),
    }
    with open(os.path.join(HERE, "reference.json"), "w") as f:
        json.dump(out, f, indent=1)
        f.write("\n")


if __name__ == "__main__":
    main()
