#!/usr/bin/python3
"""Writes the reference values the listening-test statistics are checked against.

Run with the system Python that has scipy (Debian python3-scipy):
    /usr/bin/python3 tests/data/make_listening_reference.py

The data sets are small invented rating sets (fixed below, nothing random).
Every expected value comes from scipy.stats, computed independently of
Earmark's C++ code:
- Student t CDF, survival and quantile: scipy.stats.t (the quantile is
  scipy.stats.t.ppf polished by Newton steps on scipy.stats.t.sf and .pdf:
  ppf in scipy 1.10 is off by up to ~1e-9 for some degrees of freedom, e.g.
  0.975 at 59, while sf is accurate to ~1e-15);
- mean with a t-based 95 % interval: numpy mean/std and scipy.stats.t.ppf;
- paired t test: scipy.stats.ttest_rel;
- Wilcoxon signed-rank: scipy.stats.wilcoxon(zero_method="wilcox",
  correction=False), method "exact" for untied, zero-free sets of n <= 50 and
  "approx" otherwise (the rule Earmark documents);
- exact binomial test and Clopper-Pearson interval: scipy.stats.binomtest;
- Holm's step-down adjustment: written here from Holm (1979, Scand. J.
  Statist. 6:65-70), since this scipy has no Holm function.

Output: tests/data/listening/stats_reference.json (deterministic).
"""

import json
import os
import warnings

import numpy as np
from scipy import stats

HERE = os.path.dirname(os.path.abspath(__file__))
OUT = os.path.join(HERE, "listening", "stats_reference.json")

# Invented per-cell ratings (rater x line) of a few systems.
MOS_A = [4, 5, 3, 4, 4, 5, 2, 4, 3, 4, 5, 4, 3, 3, 4, 4, 5, 4, 2, 3]
MOS_B = [3, 4, 3, 3, 2, 4, 2, 3, 3, 3, 4, 4, 2, 3, 3, 2, 4, 3, 2, 2]
MUSHRA_A = [88.5, 72.0, 95.0, 64.5, 80.0, 77.5, 91.0, 69.0, 84.0, 73.5, 58.0, 90.5]
MUSHRA_B = [81.0, 70.5, 96.5, 52.0, 71.0, 79.0, 84.5, 61.5, 80.0, 60.5, 49.0, 85.5]
CMOS = [1, 2, 0, 1, -1, 2, 1, 0, 3, 1, 1, -2, 0, 2, 1]
# Untied, zero-free differences for the exact Wilcoxon distribution.
EXACT_SETS = [
    [1.5, -0.25, 3.0, 2.25, -4.5, 6.0, 0.75, 5.5],
    [0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9, 1.0, 1.1, -1.2],
    [-3.1, 2.2, -1.3, 4.4, 5.05, -6.6, 7.7, 8.8, 9.9, -10.1, 11.1, 12.2, 13.3, -14.4, 15.5,
     16.6, 17.7, -18.8, 19.9, 20.5, 21.1, 22.2, 23.3],
    [-2.0],
]
# Ties and zeros (ratings on a 5-point scale), and one longer than 50.
APPROX_SETS = [
    [a - b for a, b in zip(MOS_A, MOS_B)],
    [1, 1, 2, -1, 0, 0, 1, 2, 2, -1, 1, 3, 0, 1],
    [(i * 7) % 11 - 4.5 for i in range(61)],
    CMOS,
]
BINOMIAL = [(14, 20), (3, 17), (50, 100), (0, 9), (9, 9), (61, 96), (1, 1), (27, 40)]
HOLM = [
    [0.01, 0.04, 0.03, 0.005],
    [0.2, 0.0001, 0.049, 0.049, 0.8, 0.012],
    [0.5],
    [0.03, 0.03, 0.03],
]
T_POINTS = [(-3.2, 1), (0.7, 2), (2.1, 5), (-1.4, 9.5), (2.86, 19), (0.01, 29), (4.5, 60), (-0.3, 400),
            (12.0, 3), (-7.5, 14)]
T_QUANTILES = [(0.975, 1), (0.975, 2), (0.975, 4), (0.975, 11), (0.975, 19), (0.975, 59), (0.995, 7),
               (0.025, 30), (0.6, 3), (0.999, 250)]


def t_quantile(p, nu):
    q = stats.t.ppf(p, nu)
    for _ in range(3):
        q = q + (stats.t.sf(q, nu) - (1.0 - p)) / stats.t.pdf(q, nu)
    return float(q)


def mean_interval(x):
    x = np.asarray(x, dtype=float)
    n = len(x)
    m = float(np.mean(x))
    sd = float(np.std(x, ddof=1))
    half = float(t_quantile(0.975, n - 1) * sd / np.sqrt(n))
    return {"values": list(map(float, x)), "mean": m, "sd": sd, "low": m - half, "high": m + half}


def paired_t(x, y):
    r = stats.ttest_rel(x, y)
    d = np.asarray(x, float) - np.asarray(y, float)
    return {"x": list(map(float, x)), "y": list(map(float, y)), "statistic": float(r.statistic),
            "p": float(r.pvalue), "dz": float(np.mean(d) / np.std(d, ddof=1))}


def wilcoxon(d, method):
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        r = stats.wilcoxon(d, zero_method="wilcox", correction=False, method=method)
    return {"d": list(map(float, d)), "method": method, "statistic": float(r.statistic), "p": float(r.pvalue)}


def binomial(k, n):
    r = stats.binomtest(k, n, 0.5)
    ci = r.proportion_ci(confidence_level=0.95, method="exact")
    return {"k": k, "n": n, "p": float(r.pvalue), "low": float(ci.low), "high": float(ci.high)}


def holm(p):
    p = np.asarray(p, float)
    order = np.argsort(p, kind="stable")
    m = len(p)
    adjusted = np.empty(m)
    running = 0.0
    for j, i in enumerate(order):
        running = max(running, min(1.0, (m - j) * p[i]))
        adjusted[i] = running
    return {"p": list(map(float, p)), "adjusted": list(map(float, adjusted))}


def chosen_test(d, balanced):
    """Earmark's rule: paired t when balanced; Wilcoxon (exact when n <= 50 with
    no zeros and no ties, else approx) otherwise."""
    if balanced:
        return float(stats.ttest_rel(d, np.zeros(len(d))).pvalue)
    nz = [x for x in d if x != 0]
    exact = len(nz) <= 50 and len(nz) == len(d) and len(set(abs(x) for x in nz)) == len(nz)
    return wilcoxon(d, "exact" if exact else "approx")["p"]


def mos_round():
    """A complete MOS round: 4 raters x 5 lines x 3 systems, scores from a fixed formula."""
    raters, lines, systems = ["r1", "r2", "r3", "r4"], ["l1", "l2", "l3", "l4", "l5"], ["north", "south", "west"]
    score = {}
    for ri, r in enumerate(raters):
        for li, l in enumerate(lines):
            for si, s in enumerate(systems):
                score[(r, l, s)] = min(5, 1 + (ri * 3 + li * 2 + si * si + ri * li * si) % 5 + (si == 0 and li % 2 == 0))
    answers = [{"rater": r, "line": l, "system": s, "score": score[(r, l, s)]}
               for r in raters for l in lines for s in systems]
    summaries = {s: mean_interval([score[(r, l, s)] for r in raters for l in lines]) for s in systems}
    pairs = []
    for i in range(3):
        for j in range(i + 1, 3):
            a, b = systems[i], systems[j]
            d = [score[(r, l, a)] - score[(r, l, b)] for r in raters for l in lines]
            pairs.append({"a": a, "b": b, "p_t": float(stats.ttest_rel(
                [score[(r, l, a)] for r in raters for l in lines],
                [score[(r, l, b)] for r in raters for l in lines]).pvalue),
                "p_wilcoxon": chosen_test(d, False), "p": chosen_test(d, True)})
    adjusted = holm([x["p"] for x in pairs])["adjusted"]
    for x, h in zip(pairs, adjusted):
        x["p_holm"] = h
    return {"systems": systems, "lines": lines, "answers": answers,
            "summaries": [dict(system=s, **summaries[s]) for s in systems], "pairs": pairs}


def ab_round():
    """A/B counts of three pairs; preferences only (no ties in the binomial)."""
    pairs = [("a", "b", 31, 17, 4), ("a", "c", 12, 12, 0), ("b", "c", 5, 20, 3)]
    out = []
    for a, b, wa, wb, none in pairs:
        r = binomial(wa, wa + wb)
        out.append({"a": a, "b": b, "a_preferred": wa, "b_preferred": wb, "none": none, **r})
    adjusted = holm([x["p"] for x in out])["adjusted"]
    for x, h in zip(out, adjusted):
        x["p_holm"] = h
    return out


def main():
    out = {
        "generator": "tests/data/make_listening_reference.py",
        "t_points": [{"t": t, "nu": nu, "cdf": float(stats.t.cdf(t, nu)), "sf": float(stats.t.sf(t, nu))}
                     for t, nu in T_POINTS],
        "t_quantiles": [{"p": p, "nu": nu, "q": t_quantile(p, nu)} for p, nu in T_QUANTILES],
        "mean_intervals": [mean_interval(x) for x in (MOS_A, MOS_B, MUSHRA_A, MUSHRA_B, CMOS)],
        "paired_t": [paired_t(MOS_A, MOS_B), paired_t(MUSHRA_A, MUSHRA_B)],
        "wilcoxon": [wilcoxon(d, "exact") for d in EXACT_SETS] + [wilcoxon(d, "approx") for d in APPROX_SETS],
        "binomial": [binomial(k, n) for k, n in BINOMIAL],
        "holm": [holm(p) for p in HOLM],
        "mos_round": mos_round(),
        "ab_round": ab_round(),
    }
    os.makedirs(os.path.dirname(OUT), exist_ok=True)
    with open(OUT, "w") as f:
        json.dump(out, f, indent=1, sort_keys=True)
        f.write("\n")


if __name__ == "__main__":
    main()
