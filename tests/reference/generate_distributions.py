#!/usr/bin/env python3
"""High-precision reference values for Priorwright's distributions.

Writes tests/reference/fixtures/distributions.json: quantiles and both tails
of every distribution the conjugate families use, over a grid that includes
extreme shapes (1e-3 ... 1e7) and tail probabilities 1e-10 and 1 - 1e-10.

Everything is computed with mpmath at 40 significant digits. Incomplete beta
and gamma come from their hypergeometric series (Abramowitz & Stegun 26.5.23,
6.5.29), summed by mpmath with a raised term limit so that shapes of 1e7
converge; each quantile is a root of F(x) - p polished by Newton steps at 40
digits, started from scipy's double-precision quantile (scipy only supplies the
start; the answer is mpmath's). Run from the repository root:

    pip install mpmath scipy
    python3 tests/reference/generate_distributions.py
"""
import json
import os

import mpmath as mp
from scipy import stats

mp.mp.dps = 40
MAXTERMS = 10**8
PROBS = [1e-10, 1e-6, 0.025, 0.3, 0.5, 0.7, 0.975, 1 - 1e-6, 1 - 1e-10]


def ibeta(a, b, x):
    """(I_x(a,b), 1 - I_x(a,b)) at 40 digits, series on the side that converges."""
    a, b, x = mp.mpf(a), mp.mpf(b), mp.mpf(x)
    if x <= 0:
        return mp.mpf(0), mp.mpf(1)
    if x >= 1:
        return mp.mpf(1), mp.mpf(0)
    y = 1 - x

    def lower(a, b, x, y):
        lnpref = a * mp.log(x) + b * mp.log(y) - mp.log(a) - mp.log(mp.beta(a, b))
        return mp.exp(lnpref) * mp.hyp2f1(a + b, 1, a + 1, x, maxterms=MAXTERMS)

    if x < a / (a + b):
        lo = lower(a, b, x, y)
        return lo, 1 - lo
    up = lower(b, a, y, x)
    return 1 - up, up


def igamma(a, x):
    """(P(a,x), Q(a,x)) at 40 digits."""
    a, x = mp.mpf(a), mp.mpf(x)
    if x <= 0:
        return mp.mpf(0), mp.mpf(1)
    if x < a + 1:
        p = mp.exp(a * mp.log(x) - x - mp.loggamma(a + 1)) * mp.hyp1f1(1, a + 1, x, maxterms=MAXTERMS)
        return p, 1 - p
    q = mp.gammainc(a, x, mp.inf, regularized=True)
    return 1 - q, q


class Dist:
    """A distribution given by its two tails and density at 40 digits."""

    def __init__(self, name, params, tails, pdf, start, positive=True, centre=None):
        self.name, self.params, self.tails, self.pdf = name, params, tails, pdf
        self.start, self.positive, self.centre = start, positive, centre

    def quantile(self, p):
        if self.centre is not None:
            return self.symmetric_quantile(p)
        return self.positive_quantile(p)

    def symmetric_quantile(self, p):
        """Symmetric law: x = centre ± w, w > 0 found on the upper half."""
        loc, _scale = self.centre
        if p == 0.5:
            return mp.mpf(loc)
        tail = min(p, 1 - p)
        sign = -1 if p < 0.5 else 1
        half = Dist(self.name, self.params,
                    lambda w: tuple(reversed(self.tails(loc - w))),
                    lambda w: self.pdf(loc - w),
                    lambda q: abs(self.start(q) - loc) if self.start(q) == self.start(q) else 1.0)
        # P(X <= loc - w) = tail is an upper tail in w.
        w = half.positive_quantile(tail, upper_target=True)
        return loc + sign * w

    def positive_quantile(self, p, upper_target=False):
        if upper_target:
            upper, target = True, mp.mpf(p)
            p = 1 - target
        else:
            p = mp.mpf(p)
            upper = p > 0.5
            target = 1 - p if upper else p
        x0 = self.start(float(target) if upper_target else float(p))
        x = mp.mpf(x0) if x0 and mp.isfinite(x0) else mp.mpf(1)

        def g(x):
            lo, up = self.tails(x)
            return (target - up) if upper else (lo - target)

        # Newton on the tail from scipy's start; bisection on log x if it misbehaves.
        for _ in range(60):
            f = self.pdf(x)
            step = g(x) / f if f != 0 else mp.mpf(0)
            if upper:
                step = step  # g increases with x in both forms
            nx = x - step
            if nx <= 0:
                nx = x / 2
            if abs(nx - x) <= abs(x) * mp.mpf(10) ** -34:
                x = nx
                break
            x = nx
        if abs(g(x)) > target * mp.mpf(10) ** -25:
            lo, hi = mp.mpf(10) ** -4000, mp.mpf(10) ** 4000
            for _ in range(20000):
                mid = mp.sqrt(lo * hi)
                if g(mid) < 0:
                    lo = mid
                else:
                    hi = mid
                if abs(hi - lo) <= abs(mid) * mp.mpf(10) ** -30:
                    break
            x = (lo + hi) / 2
        return x


def tofloat(v):
    f = float(v)
    if f != f or abs(f) == float("inf"):
        return None
    return f


def beta(a, b):
    return Dist("beta", {"a": a, "b": b}, lambda x: ibeta(a, b, x),
                lambda x: mp.exp((a - 1) * mp.log(x) + (b - 1) * mp.log(1 - x) - mp.log(mp.beta(a, b))),
                lambda p: stats.beta.ppf(p, a, b))


def gamma(shape, rate):
    return Dist("gamma", {"shape": shape, "rate": rate}, lambda x: igamma(shape, rate * x),
                lambda x: mp.exp(shape * mp.log(rate) + (shape - 1) * mp.log(x) - rate * x - mp.loggamma(shape)),
                lambda p: stats.gamma.ppf(p, shape, scale=1 / rate))


def inv_gamma(shape, scale):
    def tails(x):
        p, q = igamma(shape, scale / x)
        return q, p
    return Dist("inverse-gamma", {"shape": shape, "scale": scale}, tails,
                lambda x: mp.exp(shape * mp.log(scale) - (shape + 1) * mp.log(x) - scale / x - mp.loggamma(shape)),
                lambda p: stats.invgamma.ppf(p, shape, scale=scale))


def sqrt_inv_gamma(shape, scale):
    ig = inv_gamma(shape, scale)
    return Dist("square-root-inverse-gamma", {"shape": shape, "scale": scale},
                lambda s: ig.tails(s * s), lambda s: 2 * s * ig.pdf(s * s),
                lambda p: stats.invgamma.ppf(p, shape, scale=scale) ** 0.5)


def student_t(df, loc, scale):
    df_m, loc_m, scale_m = mp.mpf(df), mp.mpf(loc), mp.mpf(scale)

    def tails(x):
        t = (x - loc_m) / scale_m
        xx = df_m / (df_m + t * t)
        half, _ = ibeta(df_m / 2, mp.mpf(1) / 2, xx)
        half = half / 2
        return (half, 1 - half) if t < 0 else (1 - half, half)

    def pdf(x):
        t = (x - loc_m) / scale_m
        return mp.exp(mp.loggamma((df_m + 1) / 2) - mp.loggamma(df_m / 2) - mp.log(mp.sqrt(df_m * mp.pi) * scale_m)
                      - (df_m + 1) / 2 * mp.log1p(t * t / df_m))

    return Dist("student-t", {"df": df, "loc": loc, "scale": scale}, tails, pdf,
                lambda p: stats.t.ppf(p, df, loc=loc, scale=scale), positive=False, centre=(loc, scale))


def normal(mean, sd):
    m_, s_ = mp.mpf(mean), mp.mpf(sd)

    def tails(x):
        z = (x - m_) / s_
        lo = mp.erfc(-z / mp.sqrt(2)) / 2
        up = mp.erfc(z / mp.sqrt(2)) / 2
        return lo, up

    return Dist("normal", {"mean": mean, "sd": sd}, tails,
                lambda x: mp.npdf(x, m_, s_), lambda p: stats.norm.ppf(p, mean, sd), positive=False,
                centre=(mean, sd))


def lomax(shape, scale):
    sh, sc = mp.mpf(shape), mp.mpf(scale)

    def tails(x):
        up = mp.power(1 + x / sc, -sh)
        return 1 - up, up

    return Dist("lomax", {"shape": shape, "scale": scale}, tails,
                lambda x: sh / sc * mp.power(1 + x / sc, -sh - 1),
                lambda p: stats.lomax.ppf(p, shape, scale=scale))


CASES = [
    beta(2, 8), beta(0.5, 0.5), beta(1e-3, 1e-3), beta(1e-3, 2), beta(3, 1e-3), beta(1, 1),
    beta(1, 3), beta(1e7, 1e7), beta(1e-3, 1e7), beta(2.5, 1e7), beta(1e7, 3), beta(150, 450),
    beta(0.7, 30),
    gamma(2, 1), gamma(1e-3, 1), gamma(0.5, 2), gamma(1e7, 1e7), gamma(1e7, 1e-3), gamma(1e-3, 1e7),
    gamma(30.5, 0.01), gamma(1, 1),
    inv_gamma(3, 2), inv_gamma(1e-3, 1), inv_gamma(1e7, 1e7), inv_gamma(0.5, 1e-3), inv_gamma(50, 1e5),
    sqrt_inv_gamma(3, 2), sqrt_inv_gamma(1e7, 1e7), sqrt_inv_gamma(1e-3, 1.0),
    student_t(1, 0, 1), student_t(0.5, 0, 1), student_t(3, 10, 2), student_t(2e7, 0, 1),
    student_t(30, -5, 0.1), student_t(2e-3, 0, 1), student_t(2e-3, 4, 1e7),
    normal(0, 1), normal(100, 1e-3), normal(-1e7, 1e7),
    lomax(2, 100), lomax(1e-3, 1), lomax(1e7, 1e7),
]


def build():
    out = []
    for d in CASES:
        qs, cdfs = [], []
        for p in PROBS:
            x = d.quantile(p)
            qs.append({"p": p, "value": tofloat(x)})
            xf = tofloat(x)
            if xf is not None and (not d.positive or xf > 0):
                lo, up = d.tails(mp.mpf(xf))
                cdfs.append({"x": xf, "cdf": tofloat(lo), "sf": tofloat(up)})
        out.append({"distribution": d.name, "parameters": d.params, "quantiles": qs, "cdf": cdfs})
        print(d.name, d.params, "done", flush=True)
    return out


if __name__ == "__main__":
    here = os.path.dirname(os.path.abspath(__file__))
    path = os.path.join(here, "fixtures", "distributions.json")
    with open(path, "w") as f:
        json.dump({"generator": "tests/reference/generate_distributions.py", "digits": 40,
                   "cases": build()}, f, indent=1)
    print("wrote", path)
