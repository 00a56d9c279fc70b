#!/usr/bin/python3
# Independent reference for the maximum-likelihood fits of models/joint_fit.h and
# models/plain_fit.h: the same binned likelihoods written with SciPy's distributions and
# maximised with scipy.optimize.minimize (BFGS, numerical gradient), from a start of its own.
#
# Usage: fit_ref.py MODE FILE
#   FILE: first line "teams", then one side per line: "batting fielding at_home y offset".
#   MODE joint_weibull | joint_nbinom: the schedule-adjusted model
#       log E[y] = log M + a[batting] + b[fielding] + at_home * log H + offset,
#       sum a = sum b = 0; Weibull: P(y) = weibull_min(c=g, loc=-0.5, scale=s).sf(y - 0.5)
#       - .sf(y + 0.5) with the scale s solved so that the discretised mean equals E[y];
#       nbinom: scipy.stats.nbinom(r, r / (r + E[y])).
#       Prints "loglik L", "mean M", "home H", "shape G", then "offence i v" and "defence i v".
#   MODE plain: one Weibull scale per team for runs scored and one for runs allowed, shared
#       shape. Prints "loglik L" (runs-scored half), "shape G", "scored i s", "allowed i s",
#       then "free0 G0": team 0's own shape from its two samples alone.
import sys

import numpy as np
from scipy import optimize
from scipy.stats import nbinom, weibull_min

mode, path = sys.argv[1], sys.argv[2]
with open(path) as f:
    n = int(f.readline())
    rows = np.array([[float(v) for v in line.split()] for line in f if line.strip()])
bat = rows[:, 0].astype(int)
fld = rows[:, 1].astype(int)
home = rows[:, 2]
y = rows[:, 3]
off = rows[:, 4]
K = np.arange(1, 150, dtype=float)  # scales here stay below 10: exp(-(150/10)^1.2) < 1e-11


def weibull_binned(yv, scale, g):
    d = weibull_min(c=g, loc=-0.5, scale=scale)
    return d.sf(yv - 0.5) - d.sf(yv + 0.5)


def scale_for_mean(mu, g):
    # Newton on m(a) = sum_k exp(-(k/a)^g) = mu, vectorised.
    a = (mu + 0.5) / np.exp(np.math.lgamma(1 + 1 / g))
    for _ in range(8):  # quadratic convergence from the continuous start
        t = (K[None, :] / a[:, None]) ** g
        e = np.exp(-t)
        m = e.sum(axis=1)
        dm = (e * g * t / a[:, None]).sum(axis=1)
        a = a - (m - mu) / dm
    return a


def expand(x):
    a = np.append(x[2:n + 1], -np.sum(x[2:n + 1]))
    b = np.append(x[n + 1:2 * n], -np.sum(x[n + 1:2 * n]))
    return a, b


def joint_nll(x, family):
    a, b = expand(x)
    eta = x[0] + a[bat] + b[fld] + home * x[1] + off
    mu = np.exp(eta)
    shape = np.exp(x[2 * n])
    if family == "weibull":
        p = weibull_binned(y, scale_for_mean(mu, shape), shape)
        return -np.sum(np.log(p))
    return -np.sum(nbinom.logpmf(y, shape, shape / (shape + mu)))


def minimise(fun, x0):
    r = optimize.minimize(fun, x0, method="BFGS", options={"gtol": 1e-9, "maxiter": 5000})
    return r


if mode.startswith("joint"):
    family = "weibull" if mode == "joint_weibull" else "nbinom"
    x0 = np.zeros(2 * n + 1)
    x0[0] = np.log(4.0)
    x0[2 * n] = np.log(1.5 if family == "weibull" else 5.0)
    r = minimise(lambda x: joint_nll(x, family), x0)
    a, b = expand(r.x)
    print("loglik", repr(-r.fun))
    print("mean", repr(np.exp(r.x[0])))
    print("home", repr(np.exp(r.x[1])))
    print("shape", repr(np.exp(r.x[2 * n])))
    for i in range(n):
        print("offence", i, repr(np.exp(a[i])))
    for i in range(n):
        print("defence", i, repr(np.exp(b[i])))
elif mode == "plain":
    samples = [y[bat == i] for i in range(n)] + [y[fld == i] for i in range(n)]

    def nll(x, idx):
        g = np.exp(x[-1])
        return -sum(np.sum(np.log(weibull_binned(samples[j], np.exp(x[k]), g)))
                    for k, j in enumerate(idx))

    idx = list(range(2 * n))
    x0 = np.append(np.full(2 * n, np.log(5.0)), np.log(1.5))
    r = minimise(lambda x: nll(x, idx), x0)
    g = np.exp(r.x[-1])
    half = -sum(np.sum(np.log(weibull_binned(samples[j], np.exp(r.x[j]), g))) for j in range(n))
    print("loglik", repr(-half))
    print("shape", repr(g))
    for i in range(n):
        print("scored", i, repr(np.exp(r.x[i])))
    for i in range(n):
        print("allowed", i, repr(np.exp(r.x[n + i])))
    r0 = minimise(lambda x: nll(x, [0, n]), np.array([np.log(5.0), np.log(5.0), np.log(1.5)]))
    print("free0", repr(np.exp(r0.x[-1])))
else:
    sys.exit("unknown mode " + mode)
