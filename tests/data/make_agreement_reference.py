#!/usr/bin/python3
"""Writes the reference values the inter-rater agreement statistics are checked against.

Run with the system Python (Debian python3-sklearn, python3-statsmodels, python3-nltk):
    /usr/bin/python3 tests/data/make_agreement_reference.py

Rating tables: invented nominal ratings drawn from a fixed numpy seed (one
row per unit, one column per rater, -1 = missing). Every expected value comes
from a general-purpose library, computed independently of Earmark's C++ code:
- Cohen's kappa: sklearn.metrics.cohen_kappa_score on the units both raters rated;
- Fleiss' kappa: statsmodels.stats.inter_rater.fleiss_kappa(method="fleiss") on
  the count table of aggregate_raters (complete tables only: statsmodels
  assumes the same number of ratings on every unit);
- Krippendorff's alpha (nominal): nltk.metrics.agreement.AnnotationTask.alpha,
  missing ratings left out of the task.

Output: tests/data/agreement/reference.json (deterministic).
"""

import json
import os

import numpy as np
from nltk.metrics.agreement import AnnotationTask
from sklearn.metrics import cohen_kappa_score
from statsmodels.stats.inter_rater import aggregate_raters, fleiss_kappa

HERE = os.path.dirname(os.path.abspath(__file__))
OUT = os.path.join(HERE, "agreement", "reference.json")


def invented_table(rng, units, raters, categories, missing_share, agree_share):
    """Ratings that agree more often than chance: each unit has a 'true'
    category that a rater copies with probability agree_share."""
    truth = rng.integers(0, categories, size=units)
    table = np.where(rng.random((units, raters)) < agree_share, truth[:, None],
                     rng.integers(0, categories, size=(units, raters)))
    table[rng.random((units, raters)) < missing_share] = -1
    return table


def alpha_nltk(table):
    data = [(str(r), str(u), str(int(v))) for u, row in enumerate(table) for r, v in enumerate(row) if v >= 0]
    # nltk counts units with one rating in the coincidences' margins; Krippendorff
    # leaves them out (they hold no pairable value), so drop them first.
    rated = {}
    for r, u, v in data:
        rated[u] = rated.get(u, 0) + 1
    return AnnotationTask([d for d in data if rated[d[1]] >= 2]).alpha()


def case(name, table):
    table = np.asarray(table)
    raters = table.shape[1]
    out = {"name": name, "table": table.tolist()}
    pairs = []
    for a in range(raters):
        for b in range(a + 1, raters):
            both = (table[:, a] >= 0) & (table[:, b] >= 0)
            pairs.append({"a": a, "b": b, "units": int(both.sum()),
                          "cohen": float(cohen_kappa_score(table[both, a], table[both, b]))})
    out["cohen"] = pairs
    if (table >= 0).all():
        counts, _ = aggregate_raters(table)
        out["fleiss"] = float(fleiss_kappa(counts, method="fleiss"))
    out["alpha"] = float(alpha_nltk(table))
    return out


def main():
    rng = np.random.default_rng(20261204)
    cases = [
        case("two raters, three categories, complete", invented_table(rng, 40, 2, 3, 0.0, 0.6)),
        case("two raters, present/absent, complete", invented_table(rng, 60, 2, 2, 0.0, 0.5)),
        case("four raters, five categories, complete", invented_table(rng, 30, 4, 5, 0.0, 0.55)),
        case("six raters, present/absent, complete", invented_table(rng, 25, 6, 2, 0.0, 0.7)),
        case("three raters, four categories, 25 % missing", invented_table(rng, 50, 3, 4, 0.25, 0.6)),
        case("five raters, present/absent, 40 % missing", invented_table(rng, 45, 5, 2, 0.4, 0.5)),
    ]
    os.makedirs(os.path.dirname(OUT), exist_ok=True)
    with open(OUT, "w", encoding="utf-8") as f:
        f.write('{"generator": "tests/data/make_agreement_reference.py",\n "cases": [\n  ')
        f.write(",\n  ".join(json.dumps(c) for c in cases))
        f.write("\n ]\n}\n")


if __name__ == "__main__":
    main()
