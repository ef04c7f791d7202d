#!/usr/bin/env python3
"""Seeds for the npy fuzz target: <sidecar length / 4 as one byte><sidecar JSON><.npy bytes>.

The .npy bytes follow NumPy's format description (NEP 1, "A simple file
format for NumPy arrays", version 1.0): magic, version, a little-endian
header length, a Python-literal header padded to 64 bytes, then the data.
Written by hand so the seeds need no NumPy.
"""
import json
import math
import pathlib
import struct


def npy(shape, descr, values, fortran=False):
    header = "{'descr': '%s', 'fortran_order': %s, 'shape': (%s), }" % (
        descr, "True" if fortran else "False", "".join("%d, " % n for n in shape))
    pad = 64 - (10 + len(header) + 1) % 64
    header = header + " " * pad + "\n"
    fmt = {"<f4": "f", "<f8": "d", "<f2": "e"}[descr]
    return b"\x93NUMPY\x01\x00" + struct.pack("<H", len(header)) + header.encode() + \
        struct.pack("<%d%s" % (len(values), fmt), *values)


def seed(sidecar, data):
    text = json.dumps(sidecar).encode() if sidecar is not None else b""
    text += b" " * (-len(text) % 4)  # the target reads the length in units of 4 bytes
    return bytes([len(text) // 4]) + text + data


here = pathlib.Path(__file__).parent / "npy"
here.mkdir(exist_ok=True)
mel = [math.log(1e-3 + abs(math.sin(0.1 * i))) for i in range(8 * 10)]
# Keys as docs/model-outputs.md documents them.
sidecar = {"sample_rate": 22050, "hop_size": 256, "fft_size": 1024, "window_size": 1024,
           "window": "hann-periodic", "bands": 10, "fmin_hz": 0, "fmax_hz": 8000, "mel_scale": "slaney",
           "normalisation": "area", "spectrum": "magnitude", "log": "natural", "log_floor": 1e-5,
           "layout": "frames x bands"}
(here / "mel-f4-sidecar").write_bytes(seed(sidecar, npy((8, 10), "<f4", mel)))
(here / "mel-f8").write_bytes(seed(None, npy((10, 8), "<f8", mel)))
(here / "mel-f2").write_bytes(seed(None, npy((8, 10), "<f2", mel)))
attention = [1.0 if abs(t - 2 * k) < 1 else 0.0 for t in range(6) for k in range(3)]
(here / "attention-f4").write_bytes(seed(None, npy((6, 3), "<f4", attention)))
(here / "fortran").write_bytes(seed(None, npy((3, 6), "<f4", attention, fortran=True)))
