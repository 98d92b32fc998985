#!/usr/bin/env python3
"""Reference values for the prior-data conflict check, from scipy.stats.

Writes tests/reference/fixtures/checks.json. Each case is a prior, observed
data and the two tails of the observed statistic under the prior predictive,
computed with scipy's own distributions (not our formulas):

- beta-binomial successes: scipy.stats.betabinom, mid-p;
- gamma-poisson events and gamma-exponential failures in a time-terminated
  test: scipy.stats.nbinom with n = alpha, p = beta / (beta + exposure), mid-p;
- normal-inverse-gamma sample mean: scipy.stats.t with 2*alpha0 degrees of
  freedom, location mu0, scale sqrt(beta0/alpha0 * (1/kappa0 + 1/n));
- normal-known-variance sample mean: scipy.stats.norm;
- inverse-gamma-variance mean square: scipy.stats.f(n, 2*alpha) of
  (ss/n) * alpha / beta;
- dirichlet-multinomial counts: the Pearson-type distance from the prior's
  mean shares, its distribution by walking every count vector with
  scipy.stats.dirichlet_multinomial.pmf (mid-p), and for a large sample the
  scaled chi-square (scipy.stats.chi2 of T (1 + a0) / (n + a0), K - 1 df).

Run from the repository root:

    pip install scipy
    python3 tests/reference/generate_checks.py
"""
import itertools
import json
import os

import numpy as np
from scipy import stats

CASES = []


def mid_p(dist, k):
    at = dist.pmf(k)
    lower = dist.cdf(k) - at / 2
    upper = dist.sf(k) + at / 2
    return float(lower), float(upper)


def add(family, prior, data, lower, upper, mid):
    CASES.append({"family": family, "prior": prior, "data": data,
                  "lower_tail": lower, "upper_tail": upper, "mid_p": mid})


for a, b, k, n in [(2, 8, 12, 20), (3.26, 7.19, 2, 40), (30, 70, 55, 100), (0.5, 0.5, 0, 10)]:
    lo, up = mid_p(stats.betabinom(n, a, b), k)
    add("beta-binomial", f"alpha={a},beta={b}", f"successes={k},trials={n}", lo, up, True)

for a, b, k, t in [(3, 5, 9, 2), (12, 4, 2, 1.5), (2.5, 0.4, 40, 3)]:
    lo, up = mid_p(stats.nbinom(a, b / (b + t)), k)
    add("gamma-poisson", f"alpha={a},beta={b}", f"events={k},exposure={t}", lo, up, True)

for a, b, k, t in [(2, 1000, 0, 3000), (4, 20000, 9, 10000)]:
    lo, up = mid_p(stats.nbinom(a, b / (b + t)), k)
    add("gamma-exponential", f"alpha={a},beta={b}", f"failures={k},time={t}", lo, up, True)

for mu0, k0, a0, b0, n, ybar, var in [(1, 2, 3, 1, 5, 1.9, 0.4), (41, 0.9, 2.4, 4.7, 18, 44.5, 3.1),
                                      (0, 1, 1.5, 2, 3, -6.0, 1.0)]:
    scale = np.sqrt(b0 / a0 * (1 / k0 + 1 / n))
    d = stats.t(2 * a0, loc=mu0, scale=scale)
    add("normal-inverse-gamma", f"mu0={mu0},kappa0={k0},alpha0={a0},beta0={b0}",
        f"n={n},mean={ybar},variance={var}", float(d.cdf(ybar)), float(d.sf(ybar)), False)

for mu0, k0, s, n, ybar in [(1, 2, 0.5, 5, 1.3), (10, 4, 2, 25, 12.5)]:
    d = stats.norm(mu0, s * np.sqrt(1 / k0 + 1 / n))
    add("normal-known-variance", f"mu0={mu0},kappa0={k0},sigma={s}", f"n={n},mean={ybar}",
        float(d.cdf(ybar)), float(d.sf(ybar)), False)

for a, b, mu, n, ss in [(3, 1, 1, 5, 0.9), (6, 2.5, 0, 30, 40.0)]:
    fstat = ss / n * a / b
    d = stats.f(n, 2 * a)
    add("inverse-gamma-variance", f"alpha={a},beta={b},mu={mu}", f"n={n},ss={ss}",
        float(d.cdf(fstat)), float(d.sf(fstat)), False)


def pearson(x, m, n):
    return sum((xi - n * mi) ** 2 / (n * mi) for xi, mi in zip(x, m))


def dm_exact(alpha, counts):
    n, a0 = sum(counts), sum(alpha)
    m = [a / a0 for a in alpha]
    t = pearson(counts, m, n)
    tol = 1e-9 * max(abs(t), 1.0)
    dist = stats.dirichlet_multinomial(alpha, n)
    below = at = above = 0.0
    k = len(alpha)
    for cut in itertools.combinations(range(n + k - 1), k - 1):
        x, prev = [], -1
        for c in cut:
            x.append(c - prev - 1)
            prev = c
        x.append(n + k - 2 - prev)
        p = float(dist.pmf(x))
        s = pearson(x, m, n)
        if abs(s - t) <= tol:
            at += p
        elif s < t:
            below += p
        else:
            above += p
    return below + at / 2, above + at / 2


for alpha, counts in [([14.59, 10.21, 4.377], [38, 30, 12]), ([2, 2, 2], [5, 5, 5]),
                      ([1, 3, 6, 2], [9, 1, 2, 3]), ([5, 5], [0, 20])]:
    lo, up = dm_exact(alpha, counts)
    add("dirichlet-multinomial", "alpha=" + ";".join(str(a) for a in alpha),
        "counts=" + ";".join(str(c) for c in counts), lo, up, True)

for alpha, counts in [([20, 30, 25, 25], [520, 610, 430, 440])]:
    n, a0 = sum(counts), sum(alpha)
    t = pearson(counts, [a / a0 for a in alpha], n)
    d = stats.chi2(len(alpha) - 1)
    x = t * (1 + a0) / (n + a0)
    add("dirichlet-multinomial", "alpha=" + ";".join(str(a) for a in alpha),
        "counts=" + ";".join(str(c) for c in counts), float(d.cdf(x)), float(d.sf(x)), False)

if __name__ == "__main__":
    here = os.path.dirname(os.path.abspath(__file__))
    path = os.path.join(here, "fixtures", "checks.json")
    with open(path, "w") as fh:
        json.dump({"generator": "tests/reference/generate_checks.py",
                   "scipy": __import__("scipy").__version__, "cases": CASES}, fh, indent=1)
    print("wrote", path, len(CASES), "cases")
