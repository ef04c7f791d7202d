#!/usr/bin/python3
"""Writes the reference data that the spectral and .npy tests compare against.

Run from anywhere with the system Python that has numpy:
    /usr/bin/python3 tests/data/make_reference_data.py

Everything here is computed independently of Earmark's C++ code:
- mel scales and filterbanks straight from the published formulas (HTK Book;
  Slaney, Auditory Toolbox, 1998), as written in shared/REFERENCES.md;
- mel spectrograms with numpy's own padding (np.pad) and FFT (np.fft.rfft)
  in float64;
- .npy files written by numpy itself (np.save, numpy.lib.format), plus a few
  deliberately broken ones.

Outputs (small, committed): tests/data/mel/* and tests/data/npy/*.
The output is deterministic: re-running rewrites identical files.
"""

import json
import os

import numpy as np
import numpy.lib.format as npformat

HERE = os.path.dirname(os.path.abspath(__file__))
MEL_DIR = os.path.join(HERE, "mel")
NPY_DIR = os.path.join(HERE, "npy")


# ---------------------------------------------------------------- mel scales

def hz_to_mel(hz, scale):
    hz = np.asarray(hz, dtype=np.float64)
    if scale == "htk":
        return 2595.0 * np.log10(1.0 + hz / 700.0)
    # Slaney: 3f/200 below 1 kHz, 15 + 27 ln(f/1000)/ln(6.4) above.
    lin = 3.0 * hz / 200.0
    log = 15.0 + 27.0 * np.log(np.maximum(hz, 1e-12) / 1000.0) / np.log(6.4)
    return np.where(hz < 1000.0, lin, log)


def mel_to_hz(mel, scale):
    mel = np.asarray(mel, dtype=np.float64)
    if scale == "htk":
        return 700.0 * (10.0 ** (mel / 2595.0) - 1.0)
    lin = 200.0 * mel / 3.0
    log = 1000.0 * np.exp((mel - 15.0) * np.log(6.4) / 27.0)
    return np.where(mel < 15.0, lin, log)


def filterbank(rate, n_fft, bands, fmin, fmax, scale, norm):
    """Triangles with bands+2 mel-spaced edges, sampled at k*rate/n_fft."""
    edges = mel_to_hz(np.linspace(hz_to_mel(fmin, scale), hz_to_mel(fmax, scale), bands + 2), scale)
    freqs = np.arange(n_fft // 2 + 1) * rate / n_fft
    lo, mid, hi = edges[:-2, None], edges[1:-1, None], edges[2:, None]
    rising = (freqs[None, :] - lo) / (mid - lo)
    falling = (hi - freqs[None, :]) / (hi - mid)
    weights = np.maximum(0.0, np.minimum(rising, falling))
    if norm == "area":
        weights *= 2.0 / (hi - lo)
    return edges, weights


# ------------------------------------------------------------------- STFT

def stft(x, n_fft, win, hop, alignment, padding):
    """|rfft| of windowed frames, frame-major (frames, n_fft//2+1), float64."""
    n = np.arange(win)
    window = 0.5 - 0.5 * np.cos(2.0 * np.pi * n / win)  # periodic Hann
    full = np.zeros(n_fft)
    off = (n_fft - win) // 2
    full[off:off + win] = window
    pad = n_fft // 2 if alignment == "centred" else (n_fft - hop) // 2
    mode = "reflect" if padding == "reflect" else "constant"
    xp = np.pad(x.astype(np.float64), pad, mode=mode)
    count = 1 + (len(xp) - n_fft) // hop
    frames = np.lib.stride_tricks.sliding_window_view(xp, n_fft)[::hop][:count]
    return np.abs(np.fft.rfft(frames * full[None, :], axis=1))


def mel_spectrogram(x, rate, cfg):
    mag = stft(x, cfg["fftSize"], cfg["windowSize"], cfg["hopSize"], cfg["alignment"], cfg["padding"])
    spec = mag if cfg["kind"] == "magnitude" else mag ** 2
    _, weights = filterbank(rate, cfg["fftSize"], cfg["bands"], cfg["fminHz"], cfg["fmaxHz"],
                            cfg["scale"], cfg["normalisation"])
    mel = spec @ weights.T
    if cfg["log"] == "natural":
        return np.log(np.maximum(mel, cfg["floor"]))
    if cfg["log"] == "decibel":
        factor = 10.0 if cfg["kind"] == "power" else 20.0
        with np.errstate(divide="ignore"):
            return np.maximum(factor * np.log10(mel), cfg["floor"])
    return mel


def test_signal(rate, seconds):
    """A linear chirp 100 Hz -> 8 kHz, two steady sines and faint noise."""
    t = np.arange(int(round(rate * seconds))) / rate
    f0, f1 = 100.0, 8000.0
    chirp = 0.3 * np.sin(2.0 * np.pi * (f0 * t + 0.5 * (f1 - f0) / seconds * t * t))
    tones = 0.2 * np.sin(2.0 * np.pi * 440.0 * t) + 0.1 * np.sin(2.0 * np.pi * 3000.0 * t + 0.3)
    noise = 0.001 * np.random.default_rng(1234).standard_normal(len(t))
    return (chirp + tones + noise).astype(np.float32)


def write_mel_data():
    os.makedirs(MEL_DIR, exist_ok=True)
    filterbanks = [
        dict(name="slaney_area_22050", rate=22050.0, fftSize=1024, bands=80, fminHz=0.0, fmaxHz=8000.0,
             scale="slaney", normalisation="area"),
        dict(name="slaney_none_16000", rate=16000.0, fftSize=512, bands=40, fminHz=20.0, fmaxHz=7600.0,
             scale="slaney", normalisation="none"),
        dict(name="htk_none_16000", rate=16000.0, fftSize=512, bands=40, fminHz=0.0, fmaxHz=8000.0,
             scale="htk", normalisation="none"),
        dict(name="htk_area_44100", rate=44100.0, fftSize=1024, bands=64, fminHz=30.0, fmaxHz=16000.0,
             scale="htk", normalisation="area"),
    ]
    for fb in filterbanks:
        edges, weights = filterbank(fb["rate"], fb["fftSize"], fb["bands"], fb["fminHz"], fb["fmaxHz"],
                                    fb["scale"], fb["normalisation"])
        fb["edgesHz"] = [float(e) for e in edges]
        fb["weights"] = "fb_" + fb["name"] + ".npy"
        np.save(os.path.join(MEL_DIR, fb["weights"]), weights.astype("<f4"))

    rate = 22050.0
    signal = test_signal(rate, 1.0)
    np.save(os.path.join(MEL_DIR, "signal.npy"), signal)
    tts = dict(fftSize=1024, windowSize=1024, hopSize=256, padding="reflect", bands=80, fminHz=0.0,
               fmaxHz=8000.0, scale="slaney", normalisation="area", kind="magnitude", log="natural",
               floor=1e-5)
    spectrograms = [
        dict(tts, name="tts_centred", alignment="centred"),
        dict(tts, name="tts_vocoder", alignment="vocoder"),
        dict(name="htk_power_db", fftSize=512, windowSize=400, hopSize=160, alignment="centred",
             padding="zeros", bands=40, fminHz=0.0, fmaxHz=8000.0, scale="htk", normalisation="none",
             kind="power", log="decibel", floor=-100.0),
    ]
    for cfg in spectrograms:
        cfg["values"] = "melspec_" + cfg["name"] + ".npy"
        np.save(os.path.join(MEL_DIR, cfg["values"]), mel_spectrogram(signal, rate, cfg).astype("<f4"))

    with open(os.path.join(MEL_DIR, "reference.json"), "w") as f:
        json.dump({
            "about": "Written by tests/data/make_reference_data.py with numpy " + np.__version__ +
                     " from the published mel formulas; do not edit by hand.",
            "signal": {"file": "signal.npy", "sampleRate": rate},
            "filterbanks": filterbanks,
            "spectrograms": spectrograms,
        }, f, indent=1)
        f.write("\n")


# -------------------------------------------------------------- .npy files

def ramp(shape, dtype):
    """Values k*0.25 - 2 in C order: exact in float16, float32 and float64."""
    count = int(np.prod(shape)) if len(shape) else 1
    return (np.arange(count) * 0.25 - 2.0).reshape(shape).astype(dtype)


def raw_npy(path, header, payload, align):
    """A version 1.0 file with a hand-written header padded to `align` bytes."""
    text = header
    total = 10 + len(text) + 1
    text += " " * ((-total) % align) + "\n"
    with open(path, "wb") as f:
        f.write(b"\x93NUMPY\x01\x00" + len(text).to_bytes(2, "little") + text.encode("latin1") + payload)


def write_npy_data():
    os.makedirs(NPY_DIR, exist_ok=True)
    good = [
        ("f2_le_1d", (7,), "<f2"),
        ("f4_le_2d", (3, 4), "<f4"),
        ("f8_le_3d", (2, 3, 4), "<f8"),
        ("f4_be_2d", (4, 3), ">f4"),
        ("f8_be_1d", (5,), ">f8"),
        ("f2_be_3d", (2, 2, 3), ">f2"),
        ("f4_scalar", (), "<f4"),
        ("f4_empty", (0, 5), "<f4"),
    ]
    for name, shape, dtype in good:
        np.save(os.path.join(NPY_DIR, name + ".npy"), ramp(shape, dtype))
    for version in (2, 3):
        with open(os.path.join(NPY_DIR, "f4_v%d.npy" % version), "wb") as f:
            npformat.write_array(f, ramp((2, 5), "<f4"), version=(version, 0))
    # NEP 1 asks for 16-byte alignment; older numpy wrote exactly that.
    raw_npy(os.path.join(NPY_DIR, "f4_align16.npy"),
            "{'descr': '<f4', 'fortran_order': False, 'shape': (6,), }", ramp((6,), "<f4").tobytes(), 16)
    special = np.array([np.inf, -np.inf, np.nan, 2.0 ** -24, 65504.0, -0.0], dtype="<f2")
    np.save(os.path.join(NPY_DIR, "f2_special.npy"), special)

    np.save(os.path.join(NPY_DIR, "bad_fortran.npy"), np.asfortranarray(ramp((3, 4), "<f4")))
    np.save(os.path.join(NPY_DIR, "bad_int32.npy"), np.arange(6, dtype="<i4"))
    np.save(os.path.join(NPY_DIR, "bad_object.npy"), np.array([1.5, "x"], dtype=object), allow_pickle=True)
    np.save(os.path.join(NPY_DIR, "bad_structured.npy"), np.zeros(3, dtype=[("a", "<f4"), ("b", "<f4")]))
    full = open(os.path.join(NPY_DIR, "f4_le_2d.npy"), "rb").read()
    with open(os.path.join(NPY_DIR, "bad_truncated.npy"), "wb") as f:
        f.write(full[:-5])
    with open(os.path.join(NPY_DIR, "bad_magic.npy"), "wb") as f:
        f.write(b"RIFF\x00\x00\x00\x00WAVEfmt ")
    raw_npy(os.path.join(NPY_DIR, "bad_header_no_shape.npy"),
            "{'descr': '<f4', 'fortran_order': False, }", b"\x00" * 8, 64)
    raw_npy(os.path.join(NPY_DIR, "bad_header_syntax.npy"),
            "{'descr': '<f4', 'fortran_order': False, 'shape': (2, 'x'), }", b"\x00" * 8, 64)


if __name__ == "__main__":
    write_mel_data()
    write_npy_data()
