#!/usr/bin/env python3
"""Reference values for whole families: predictive distributions, log marginal
likelihoods, highest-density intervals and prior-data conflict tails.

Writes tests/reference/fixtures/families.json. mpmath at 40 digits does the
arithmetic: marginal likelihoods from their integrals (mpmath.quad over the
unknown, not from our closed forms) where one dimension suffices, predictive
counts as exact sums of their pmf, highest-density intervals by solving
f(L) = f(U), F(U) - F(L) = level with mpmath.findroot. Run from the
repository root:

    pip install mpmath scipy
    python3 tests/reference/generate_families.py
"""
import json
import os

import mpmath as mp

mp.mp.dps = 40
PROBS = [1e-10, 0.025, 0.5, 0.975, 1 - 1e-10]


def f(x):
    v = float(x)
    return None if v != v or abs(v) == float("inf") else v


# ---- count predictives: pmf and exact cdf sums --------------------------------

def bb_pmf(n, a, b, k):
    a, b = mp.mpf(a), mp.mpf(b)
    return mp.binomial(n, k) * mp.beta(k + a, n - k + b) / mp.beta(a, b)


def nb_pmf(r, p, k):
    r, p = mp.mpf(r), mp.mpf(p)
    return mp.exp(mp.loggamma(r + k) - mp.loggamma(r) - mp.loggamma(k + 1)) * p**r * (1 - p)**k


def count_case(pmf, upper_limit):
    cum, out, k = mp.mpf(0), [], 0
    cdf = {}
    while k <= upper_limit:
        cum += pmf(k)
        cdf[k] = cum
        if cum > 1 - mp.mpf(10) ** -14 and k > 5:
            break
        k += 1
    quant = []
    for p in PROBS:
        kk = next((j for j in sorted(cdf) if cdf[j] >= mp.mpf(p)), None)
        if kk is not None and (1 - cdf[kk]) > mp.mpf(10) ** -12:
            quant.append({"p": p, "value": kk})
    pts = [j for j in sorted(cdf) if j in (0, 1, 2, 5, 10, 20, 50) or j == max(cdf)]
    at = [{"x": j, "density": f(pmf(j)), "cdf": f(cdf[j])} for j in pts if j < max(cdf)]
    return quant, at


# ---- continuous predictives ----------------------------------------------------

def t_cdf(df, loc, scale, x):
    t = (mp.mpf(x) - loc) / scale
    df = mp.mpf(df)
    tail = mp.betainc(df / 2, mp.mpf(1) / 2, 0, df / (df + t * t), regularized=True) / 2
    return tail if t < 0 else 1 - tail


def t_pdf(df, loc, scale, x):
    t = (mp.mpf(x) - loc) / scale
    df = mp.mpf(df)
    return mp.gamma((df + 1) / 2) / (mp.gamma(df / 2) * mp.sqrt(df * mp.pi) * scale) * (1 + t * t / df) ** (-(df + 1) / 2)


def continuous_case(cdf, pdf, points):
    return [{"x": x, "density": f(pdf(x)), "cdf": f(cdf(x))} for x in points]


CASES = []

# beta-binomial: prior Beta(2, 8), 20 future trials; posterior after 3/20.
for prior, data, future, (n, a, b) in [
    ("alpha=2,beta=8", None, "trials=20", (20, 2, 8)),
    ("alpha=2,beta=8", "successes=3,trials=20", "trials=20", (20, 5, 25)),
    ("alpha=0.001,beta=0.001", None, "trials=30", (30, 0.001, 0.001)),
    ("alpha=1e7,beta=3e7", None, "trials=50", (50, 1e7, 3e7)),
]:
    q, at = count_case(lambda k: bb_pmf(n, a, b, k), n)
    CASES.append({"kind": "predictive", "family": "beta-binomial", "prior": prior, "data": data,
                  "future": future, "quantiles": q, "at": at})

# gamma-poisson: events in exposure t; gamma-exponential failures in time T.
for fam, prior, data, future, (r, beta, t) in [
    ("gamma-poisson", "alpha=3,beta=5", None, "exposure=2", (3, 5, 2)),
    ("gamma-poisson", "alpha=3,beta=5", "events=3,exposure=2", "exposure=10", (6, 7, 10)),
    ("gamma-poisson", "alpha=0.5,beta=1e-3", None, "exposure=1", (0.5, 1e-3, 1)),
    ("gamma-exponential", "alpha=2,beta=1000", None, "time=500", (2, 1000, 500)),
]:
    p = mp.mpf(beta) / (mp.mpf(beta) + t)
    q, at = count_case(lambda k: nb_pmf(r, p, k), 10**6)
    CASES.append({"kind": "predictive", "family": fam, "prior": prior, "data": data,
                  "future": future, "quantiles": q, "at": at})

# Lomax: next waiting time.
sh, sc = mp.mpf(3), mp.mpf(1500)
lcdf = lambda x: 1 - (1 + mp.mpf(x) / sc) ** (-sh)
lpdf = lambda x: sh / sc * (1 + mp.mpf(x) / sc) ** (-sh - 1)
CASES.append({"kind": "predictive", "family": "gamma-exponential", "prior": "alpha=3,beta=1500",
              "data": None, "future": "n=1",
              "quantiles": [{"p": p, "value": f(sc * ((1 - mp.mpf(p)) ** (-1 / sh) - 1))} for p in PROBS],
              "at": continuous_case(lcdf, lpdf, [0.0, 100.0, 1500.0, 1e5])})

# Normal predictive (known variance) and Student-t (NIG, known-mean variance).
mu0, k0, s = mp.mpf(10), mp.mpf(4), mp.mpf(2)
m = 5
sd = s * mp.sqrt(mp.mpf(1) / m + 1 / k0)
ncdf = lambda x: mp.ncdf(x, mu0, sd)
npdf = lambda x: mp.npdf(x, mu0, sd)
CASES.append({"kind": "predictive", "family": "normal-known-variance", "prior": "mu0=10,kappa0=4,sigma=2",
              "data": None, "future": "n=5",
              "quantiles": [{"p": p, "value": f(mu0 + sd * mp.sqrt(2) * mp.erfinv(2 * mp.mpf(p) - 1))} for p in PROBS],
              "at": continuous_case(ncdf, npdf, [5.0, 10.0, 12.5])})

for fam, prior, future, (df, loc, scale) in [
    ("normal-inverse-gamma", "mu0=1.9,kappa0=1,alpha0=0.5,beta0=0.005", "n=1",
     (1, 1.9, mp.sqrt(mp.mpf(0.005) * 2 / (mp.mpf(0.5) * 1)))),
    ("normal-inverse-gamma", "mu0=0,kappa0=2,alpha0=3,beta0=4", "n=10",
     (6, 0, mp.sqrt(mp.mpf(4) * 12 / (3 * 2 * 10)))),
    ("inverse-gamma-variance", "alpha=2.5,beta=3,mu=1", "n=1", (5, 1, mp.sqrt(mp.mpf(3) / 2.5))),
]:
    cdf = lambda x, df=df, loc=loc, scale=scale: t_cdf(df, loc, scale, x)
    pdf = lambda x, df=df, loc=loc, scale=scale: t_pdf(df, loc, scale, x)
    qs = []
    for p in [0.025, 0.5, 0.975]:
        qs.append({"p": p, "value": f(mp.findroot(lambda x: cdf(x) - mp.mpf(p), mp.mpf(loc) + 0.1 * (p - 0.5)))})
    CASES.append({"kind": "predictive", "family": fam, "prior": prior, "data": None, "future": future,
                  "quantiles": qs, "at": continuous_case(cdf, pdf, [float(loc) - 1.0, float(loc), float(loc) + 2.5])})

# ---- log marginal likelihoods -------------------------------------------------

def lml_bb(a, b, s, n):
    return mp.log(mp.quad(lambda th: mp.binomial(n, s) * th**s * (1 - th)**(n - s)
                          * th**(a - 1) * (1 - th)**(b - 1) / mp.beta(a, b), [0, 0.5, 1]))


def gamma_pdf(a, b, x):
    return mp.exp(a * mp.log(b) + (a - 1) * mp.log(x) - b * x - mp.loggamma(a))


def lml_pois(a, b, y, t):
    return mp.log(mp.quad(lambda l: mp.exp(y * mp.log(l * t) - l * t - mp.loggamma(y + 1)) * gamma_pdf(a, b, l),
                          [0, mp.mpf(a) / b, mp.inf]))


def lml_exp(a, b, d, t):
    return mp.log(mp.quad(lambda l: l**d * mp.exp(-l * t) * gamma_pdf(a, b, l), [0, mp.mpf(a) / b, mp.inf]))


def lml_nkv(mu0, k0, sigma, ys):
    s2 = mp.mpf(sigma) ** 2
    lik = lambda mu: mp.fprod(mp.npdf(y, mu, sigma) for y in ys)
    return mp.log(mp.quad(lambda mu: lik(mu) * mp.npdf(mu, mu0, sigma / mp.sqrt(k0)), [-mp.inf, mu0, mp.inf]))


def lml_igv(a, b, mu, ys):
    ig = lambda s2: mp.exp(a * mp.log(b) - (a + 1) * mp.log(s2) - b / s2 - mp.loggamma(a))
    lik = lambda s2: mp.fprod(mp.npdf(y, mu, mp.sqrt(s2)) for y in ys)
    return mp.log(mp.quad(lambda s2: lik(s2) * ig(s2), [0, 1, mp.inf]))


def lml_nig(mu0, k0, a0, b0, ys):
    # Inner integral over mu in closed form is not used: 2-D quadrature.
    ig = lambda s2: mp.exp(a0 * mp.log(b0) - (a0 + 1) * mp.log(s2) - b0 / s2 - mp.loggamma(a0))
    def inner(s2):
        sd = mp.sqrt(s2)
        return mp.quad(lambda mu: mp.fprod(mp.npdf(y, mu, sd) for y in ys) * mp.npdf(mu, mu0, sd / mp.sqrt(k0)),
                       [-mp.inf, sum(ys) / len(ys), mp.inf])
    return mp.log(mp.quad(lambda s2: inner(s2) * ig(s2), [0, 0.5, 1, mp.inf]))


def lml_dir(alpha, counts):
    n = sum(counts)
    A = sum(alpha)
    v = mp.loggamma(n + 1) - sum(mp.loggamma(c + 1) for c in counts) + mp.loggamma(A) - mp.loggamma(A + n)
    return v + sum(mp.loggamma(a + c) - mp.loggamma(a) for a, c in zip(alpha, counts))


ys = [1.2, 0.7, 2.1, 1.6, 0.9]
ybar = sum(ys) / len(ys)
var = sum((y - ybar) ** 2 for y in ys) / (len(ys) - 1)
ss1 = sum((y - 1.0) ** 2 for y in ys)
mp.mp.dps = 25
LML = [
    ("beta-binomial", "alpha=2,beta=8", "successes=3,trials=20", lml_bb(2, 8, 3, 20)),
    ("gamma-poisson", "alpha=3,beta=5", "events=3,exposure=2", lml_pois(3, 5, 3, 2)),
    ("gamma-exponential", "alpha=2,beta=1000", "failures=4,time=3000", lml_exp(2, 1000, 4, 3000)),
    ("normal-known-variance", "mu0=1,kappa0=2,sigma=0.5", f"n=5,mean={ybar!r},variance={var!r}",
     lml_nkv(1, 2, 0.5, ys)),
    ("normal-inverse-gamma", "mu0=1,kappa0=2,alpha0=3,beta0=1", f"n=5,mean={ybar!r},variance={var!r}",
     lml_nig(1, 2, 3, 1, ys)),
    ("inverse-gamma-variance", "alpha=3,beta=1,mu=1", f"n=5,ss={ss1!r}", lml_igv(3, 1, 1.0, ys)),
    ("dirichlet-multinomial", "alpha=1;2;3", "counts=4;0;7", lml_dir([1, 2, 3], [4, 0, 7])),
]
for fam, prior, data, v in LML:
    CASES.append({"kind": "ln_ml", "family": fam, "prior": prior, "data": data, "value": f(v)})
mp.mp.dps = 40

# ---- highest-density intervals -----------------------------------------------

def hpd(cdf, pdf, level, lo_guess, hi_guess):
    level = mp.mpf(level)
    L, U = mp.findroot([lambda l, u: cdf(u) - cdf(l) - level, lambda l, u: pdf(l) - pdf(u)],
                       (mp.mpf(lo_guess), mp.mpf(hi_guess)))
    return L, U


def beta_fns(a, b):
    a, b = mp.mpf(a), mp.mpf(b)
    return (lambda x: mp.betainc(a, b, 0, x, regularized=True),
            lambda x: x ** (a - 1) * (1 - x) ** (b - 1) / mp.beta(a, b))


def gamma_fns(a, r):
    a, r = mp.mpf(a), mp.mpf(r)
    return (lambda x: mp.gammainc(a, 0, r * x, regularized=True), lambda x: gamma_pdf(a, r, x))


def ig_fns(a, s):
    a, s = mp.mpf(a), mp.mpf(s)
    return (lambda x: mp.gammainc(a, s / x, mp.inf, regularized=True),
            lambda x: mp.exp(a * mp.log(s) - (a + 1) * mp.log(x) - s / x - mp.loggamma(a)))


for fam, prior, param, fns, guess in [
    ("beta-binomial", "alpha=2,beta=8", "theta", beta_fns(2, 8), (0.01, 0.43)),
    ("beta-binomial", "alpha=438,beta=544", "theta", beta_fns(438, 544), (0.41, 0.48)),
    ("gamma-poisson", "alpha=3,beta=5", "lambda", gamma_fns(3, 5), (0.05, 1.3)),
    ("gamma-exponential", "alpha=3,beta=1500", "mean_time", ig_fns(3, 1500), (130, 1850)),
    ("inverse-gamma-variance", "alpha=5,beta=10", "sigma2", ig_fns(5, 10), (0.8, 5.0)),
]:
    L, U = hpd(*fns, 0.95, *guess)
    CASES.append({"kind": "hpd", "family": fam, "prior": prior, "parameter": param, "level": 0.95,
                  "lower": f(L), "upper": f(U)})

# ---- conflict tails (mid-p for counts) -----------------------------------------

def mid_p(pmf, k, n_max):
    le = mp.fsum(pmf(j) for j in range(0, k + 1))
    ge = 1 - le + pmf(k)
    half = pmf(k) / 2
    return le - half, ge - half


for fam, prior, data, pmf, k in [
    ("beta-binomial", "alpha=2,beta=8", "successes=12,trials=20", lambda j: bb_pmf(20, 2, 8, j), 12),
    ("gamma-poisson", "alpha=3,beta=5", "events=9,exposure=2",
     lambda j: nb_pmf(3, mp.mpf(5) / 7, j), 9),
    ("gamma-exponential", "alpha=2,beta=1000", "failures=0,time=3000",
     lambda j: nb_pmf(2, mp.mpf(1000) / 4000, j), 0),
]:
    lo, up = mid_p(pmf, k, 10**5)
    CASES.append({"kind": "conflict", "family": fam, "prior": prior, "data": data,
                  "lower_tail": f(lo), "upper_tail": f(up)})

# Sample mean against its prior predictive: normal and Student-t; F for the variance.
sd = mp.mpf(0.5) * mp.sqrt(mp.mpf(1) / 2 + mp.mpf(1) / 5)
lo = mp.ncdf(ybar, 1, sd)
CASES.append({"kind": "conflict", "family": "normal-known-variance", "prior": "mu0=1,kappa0=2,sigma=0.5",
              "data": f"n=5,mean={ybar!r}", "lower_tail": f(lo), "upper_tail": f(1 - lo)})
scale = mp.sqrt(mp.mpf(1) / 3 * (mp.mpf(1) / 2 + mp.mpf(1) / 5))
lo = t_cdf(6, 1, scale, ybar)
CASES.append({"kind": "conflict", "family": "normal-inverse-gamma", "prior": "mu0=1,kappa0=2,alpha0=3,beta0=1",
              "data": f"n=5,mean={ybar!r},variance={var!r}", "lower_tail": f(lo), "upper_tail": f(1 - lo)})
fstat = mp.mpf(ss1) / 5 * 3 / 1
lo = mp.betainc(mp.mpf(5) / 2, mp.mpf(6) / 2, 0, 5 * fstat / (5 * fstat + 6), regularized=True)
CASES.append({"kind": "conflict", "family": "inverse-gamma-variance", "prior": "alpha=3,beta=1,mu=1",
              "data": f"n=5,ss={ss1!r}", "lower_tail": f(lo), "upper_tail": f(1 - lo)})

if __name__ == "__main__":
    here = os.path.dirname(os.path.abspath(__file__))
    path = os.path.join(here, "fixtures", "families.json")
    with open(path, "w") as fh:
        json.dump({"generator": "tests/reference/generate_families.py", "cases": CASES}, fh, indent=1)
    print("wrote", path, len(CASES), "cases")
