#!/usr/bin/env python3
"""Reference fits recomputed with scipy, and mixture posteriors with mpmath.

Writes tests/reference/fixtures/fits.json:
- "fits": least-squares fits of stated probabilities, minimising the plain sum
  sum_i (F(x_i) - p_i)^2 over log-hyperparameters with
  scipy.optimize.least_squares (tolerances at machine precision, several
  starts, best kept); with as many judgments as hyperparameters the exact
  root from scipy.optimize.fsolve.
- "mixtures": posterior weights, mean and central 95% interval of two-component
  mixture priors after data, by mpmath quadrature of prior x likelihood at
  30 digits (no conjugate formulas used).

    pip install mpmath scipy
    python3 tests/reference/generate_fits.py
"""
import json
import os

import mpmath as mp
import numpy as np
from scipy import optimize, stats

def cdf_fn(family, target, theta, fixed, observable):
    e = np.exp
    if family == "beta-binomial":
        a, b = e(theta[0]), e(theta[1])
        if observable:
            return lambda x: stats.betabinom.cdf(x, observable, a, b)
        return lambda x: stats.beta.cdf(x, a, b)
    if family == "gamma-poisson":
        a, b = e(theta[0]), e(theta[1])
        if observable:
            return lambda x: stats.nbinom.cdf(x, a, b / (b + observable))
        return lambda x: stats.gamma.cdf(x, a, scale=1 / b)
    if family == "gamma-exponential":
        a, b = e(theta[0]), e(theta[1])
        if target == "mean_time":
            return lambda x: stats.invgamma.cdf(x, a, scale=b)
        return lambda x: stats.gamma.cdf(x, a, scale=1 / b)
    if family == "normal-known-variance":
        mu0, k0 = theta[0], e(theta[1])
        return lambda x: stats.norm.cdf(x, mu0, fixed["sigma"] / np.sqrt(k0))
    if family == "inverse-gamma-variance":
        a, b = e(theta[0]), e(theta[1])
        if target == "sigma":
            return lambda x: stats.invgamma.cdf(x * x, a, scale=b)
        return lambda x: stats.invgamma.cdf(x, a, scale=b)
    if family == "normal-inverse-gamma":
        mu0, k0, a, b = theta[0], e(theta[1]), e(theta[2]), e(theta[3])
        if target == "mu":
            return lambda x: stats.t.cdf(x, 2 * a, loc=mu0, scale=np.sqrt(b / (a * k0)))
        if target == "sigma":
            return lambda x: stats.invgamma.cdf(x * x, a, scale=b)
        return lambda x: stats.invgamma.cdf(x, a, scale=b)
    raise ValueError(family)


def residuals(case):
    def r(theta):
        out = []
        for j in case["judgments"]:
            f = cdf_fn(case["family"], j["parameter"], theta, case.get("fixed", {}), case.get("observable"))
            out.append(f(j["value"]) - j["p"])
        return np.array(out)
    return r


def hyper(case, theta):
    e = np.exp
    fam = case["family"]
    if fam in ("beta-binomial", "gamma-poisson", "gamma-exponential", "inverse-gamma-variance"):
        return {"alpha": float(e(theta[0])), "beta": float(e(theta[1]))}
    if fam == "normal-known-variance":
        return {"mu0": float(theta[0]), "kappa0": float(e(theta[1]))}
    return {"mu0": float(theta[0]), "kappa0": float(e(theta[1])), "alpha0": float(e(theta[2])), "beta0": float(e(theta[3]))}


def solve(case, starts):
    r = residuals(case)
    best = None
    for s in starts:
        s = np.array(s, dtype=float)
        if len(case["judgments"]) == len(s):
            sol, info, ier, _ = optimize.fsolve(r, s, full_output=True, xtol=1e-15)
            cand = sol
        else:
            res = optimize.least_squares(r, s, xtol=1e-15, ftol=1e-15, gtol=1e-15, max_nfev=20000, method="lm")
            cand = res.x
        val = float(np.sum(r(cand) ** 2))
        if np.isfinite(val) and (best is None or val < best[1]):
            best = (cand, val)
    return best


def J(p, v, name=None):
    return {"parameter": name, "p": p, "value": v}


FITS = [
    {"family": "beta-binomial", "judgments": [J(0.5, 0.3, "theta"), J(0.9, 0.5, "theta")], "starts": [[1, 2], [0, 0]]},
    {"family": "beta-binomial", "judgments": [J(0.1, 0.1, "theta"), J(0.5, 0.3, "theta"), J(0.9, 0.5, "theta")], "starts": [[1, 2], [0, 0]]},
    {"family": "beta-binomial", "judgments": [J(0.05, 0.02, "theta"), J(0.25, 0.05, "theta"), J(0.75, 0.12, "theta"), J(0.95, 0.3, "theta")], "starts": [[0, 2], [1, 3]]},
    {"family": "gamma-poisson", "judgments": [J(0.25, 0.8, "lambda"), J(0.75, 2.0, "lambda")], "starts": [[1, 0], [0, 0]]},
    {"family": "gamma-poisson", "judgments": [J(0.1, 0.5, "lambda"), J(0.5, 1.2, "lambda"), J(0.9, 3.0, "lambda")], "starts": [[1, 0], [0, 0]]},
    {"family": "gamma-exponential", "judgments": [J(0.5, 600.0, "mean_time"), J(0.95, 2000.0, "mean_time")], "starts": [[1, 7], [0, 6]]},
    {"family": "gamma-exponential", "judgments": [J(0.05, 200.0, "mean_time"), J(0.5, 600.0, "mean_time"), J(0.95, 2000.0, "mean_time")], "starts": [[1, 7], [0, 6]]},
    {"family": "normal-known-variance", "fixed": {"sigma": 40.0}, "judgments": [J(0.05, 850.0, "mu"), J(0.5, 900.0, "mu"), J(0.95, 960.0, "mu")], "starts": [[900, 0], [880, 1]]},
    {"family": "inverse-gamma-variance", "judgments": [J(0.1, 0.8, "sigma"), J(0.5, 1.2, "sigma"), J(0.9, 2.0, "sigma")], "starts": [[1, 0.5], [0.5, 0]]},
    {"family": "normal-inverse-gamma", "judgments": [J(0.05, 1.7, "mu"), J(0.5, 1.88, "mu"), J(0.95, 2.1, "mu"), J(0.25, 0.09, "sigma"), J(0.75, 0.16, "sigma")], "starts": [[1.9, 0, 1, -3], [1.9, 1, 0.5, -4]]},
    {"family": "beta-binomial", "observable": 20, "judgments": [J(0.25, 2.0), J(0.5, 4.0), J(0.9, 8.0)], "starts": [[1, 2], [0, 1]]},
    {"family": "gamma-poisson", "observable": 500.0, "judgments": [J(0.1, 1.0), J(0.5, 4.0), J(0.9, 10.0)], "starts": [[1, 5], [0, 4]]},
]

out_fits = []
for case in FITS:
    theta, val = solve(case, case["starts"])
    out_fits.append({
        "family": case["family"], "fixed": case.get("fixed"), "observable": case.get("observable"),
        "judgments": case["judgments"], "objective": val, "hyperparameters": hyper(case, theta),
    })
    print(case["family"], val, hyper(case, theta), flush=True)

# ---- mixture posteriors by quadrature -----------------------------------------
mp.mp.dps = 30


def beta_pdf(a, b):
    return lambda t: t ** (a - 1) * (1 - t) ** (b - 1) / mp.beta(a, b)


def gamma_pdf(a, b):
    return lambda l: mp.exp(a * mp.log(b) + (a - 1) * mp.log(l) - b * l - mp.loggamma(a))


def mixture_case(name, comps, lik, interval, pdfs):
    w = [mp.mpf(c[0]) for c in comps]
    dens = [pdfs(*c[1]) for c in comps]
    ml = [mp.quad(lambda t, d=d: d(t) * lik(t), interval) for d in dens]
    tot = sum(wi * m for wi, m in zip(w, ml))
    post_w = [wi * m / tot for wi, m in zip(w, ml)]
    post = lambda t: sum(wi * d(t) for wi, d in zip(w, dens)) * lik(t) / tot
    mean = mp.quad(lambda t: t * post(t), interval)
    cdf = lambda x: mp.quad(post, [interval[0], x])
    lo_guess = mean * 0.5
    q = lambda p: mp.findroot(lambda x: cdf(x) - p, (interval[0] + mp.mpf(10) ** -20, interval[1] if interval[1] != mp.inf else mean * 20), solver="bisect", tol=mp.mpf(10) ** -25)
    return {"name": name, "weights": [float(x) for x in post_w], "mean": float(mean),
            "central_95": [float(q(mp.mpf("0.025"))), float(q(mp.mpf("0.975")))], "ln_marginal": float(mp.log(tot))}


MIX = []
# Two experts on a success probability, data 7 of 20 (a sceptic and an enthusiast).
MIX.append(dict(family="beta-binomial", components=[[0.6, "alpha=2,beta=18"], [0.4, "alpha=6,beta=6"]], data="successes=7,trials=20",
                **mixture_case("beta", [[0.6, (2, 18)], [0.4, (6, 6)]], lambda t: mp.binomial(20, 7) * t**7 * (1 - t) ** 13, [0, 1], beta_pdf)))
# Robust mixture for a Poisson rate, data 12 events in exposure 4.
MIX.append(dict(family="gamma-poisson", components=[[0.8, "alpha=10,beta=10"], [0.2, "alpha=1,beta=1"]], data="events=12,exposure=4",
                **mixture_case("gamma", [[0.8, (10, 10)], [0.2, (1, 1)]], lambda l: mp.exp(12 * mp.log(4 * l) - 4 * l - mp.loggamma(13)), [0, mp.inf], gamma_pdf)))

here = os.path.dirname(os.path.abspath(__file__))
path = os.path.join(here, "fixtures", "fits.json")
with open(path, "w") as f:
    json.dump({"generator": "tests/reference/generate_fits.py", "fits": out_fits, "mixtures": MIX}, f, indent=1)
print("wrote", path)
