#!/usr/bin/python3
"""Writes the reference data of the long-form tests (tests/engine/longform).

Run with the system Python that has numpy and scipy (Debian python3-scipy;
only needed to re-make the data, not to run the tests):
    /usr/bin/python3 tests/data/make_longform_reference.py

- Theil-Sen fits by scipy.stats.theilslopes (slope, intercept as
  median(y) - slope*median(x), and Sen's 95 % interval);
- the symmetric Kullback-Leibler divergence between the Gaussians fitted to
  two sets of frames, by numpy (np.cov, np.linalg.inv) from the closed form
  KL(a||b) = 1/2 [tr(Sb^-1 Sa) + (mb-ma)' Sb^-1 (mb-ma) - d + ln(det Sb/det Sa)],
  summed both ways.

Output (small, committed): tests/data/longform/reference.json. Deterministic.
"""

import json
import os

import numpy as np
from scipy import stats

HERE = os.path.dirname(os.path.abspath(__file__))
OUT = os.path.join(HERE, "longform", "reference.json")


def theil_cases(rng):
    cases = []
    x = np.arange(40, dtype=float) * 0.25
    cases.append(("linear with noise", x, 1.5 - 0.8 * x + rng.normal(0, 0.5, x.size)))
    xt = np.repeat(np.arange(12, dtype=float), 3)  # ties in x
    cases.append(("ties in x", xt, 2.0 + 0.3 * xt + np.round(rng.normal(0, 1, xt.size))))
    xo = np.sort(rng.uniform(0, 6, 30))
    yo = -3.0 + 0.1 * xo + rng.normal(0, 0.05, xo.size)
    yo[[3, 11, 20]] += [8.0, -6.0, 12.0]  # outliers
    cases.append(("outliers", xo, yo))
    out = []
    for name, xs, ys in cases:
        r = stats.theilslopes(ys, xs, 0.95)
        out.append({"name": name, "x": xs.tolist(), "y": ys.tolist(), "slope": float(r[0]),
                    "intercept": float(r[1]), "low": float(r[2]), "high": float(r[3])})
    return out


def kl(ma, sa, mb, sb):
    d = ma.size
    ib = np.linalg.inv(sb)
    diff = mb - ma
    return 0.5 * (np.trace(ib @ sa) + diff @ ib @ diff - d + np.log(np.linalg.det(sb) / np.linalg.det(sa)))


def kl_cases(rng):
    out = []
    for name, shift, scale in (("near", 0.2, 1.1), ("far", 2.0, 0.5)):
        a = rng.normal(0, 1, (200, 3)) @ np.array([[1.0, 0.3, 0.0], [0.0, 0.8, 0.2], [0.0, 0.0, 0.5]])
        b = rng.normal(shift, scale, (150, 3))
        ma, mb = a.mean(axis=0), b.mean(axis=0)
        sa, sb = np.cov(a, rowvar=False), np.cov(b, rowvar=False)
        out.append({"name": name, "a": a.tolist(), "b": b.tolist(),
                    "symmetric_kl": float(kl(ma, sa, mb, sb) + kl(mb, sb, ma, sa))})
    return out


def main():
    rng = np.random.default_rng(20261204)
    doc = {"theil_sen": theil_cases(rng), "symmetric_kl": kl_cases(rng)}
    os.makedirs(os.path.dirname(OUT), exist_ok=True)
    with open(OUT, "w") as f:
        json.dump(doc, f, separators=(",", ":"))
        f.write("\n")


if __name__ == "__main__":
    main()
