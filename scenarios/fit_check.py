#!/usr/bin/env python3
"""Sanity check of a generated league (not part of standfast): fits the generator's own model
to the played regulation games by maximum likelihood with scipy and compares the fit with the
hidden truth in truth.csv.

    python3 scenarios/fit_check.py scenarios/demo

Model: runs of a side ~ discretised Weibull (location -0.5, shape g) with mean
m * offence(batting) * defence(fielding) * run_factor(venue) * (home edge for the home side);
log offences and log defences sum to zero (the truth is centred the same way). Games that went
to extra innings or were shortened are left out, so this is a check, not the project's fit:
dropping the games tied after nine innings removes low scores and pushes the fitted mean up
slightly.
"""
import csv
import re
import sys

import numpy as np
from scipy.optimize import minimize
from scipy.special import gamma

folder = sys.argv[1]
truth = {r["team"]: (float(r["offence"]), float(r["defence"]))
         for r in csv.DictReader(open(folder + "/truth.csv"))}
ids = list(truth)
index = {t: i for i, t in enumerate(ids)}
n = len(ids)
yaml_text = open(folder + "/season.yaml").read()
run_factor = {m.group(1): float(m.group(2)) for m in re.finditer(
    r"- id: (\w+)\n\s+name: .*\n\s+venue: .*\n\s+run_factor: ([0-9.]+)", yaml_text)}
home, away, home_runs, away_runs = [], [], [], []
for r in csv.DictReader(open(folder + "/games.csv")):
    if r["home_runs"] == "" or r["innings"] != "9":
        continue
    home.append(index[r["home"]])
    away.append(index[r["away"]])
    home_runs.append(int(r["home_runs"]))
    away_runs.append(int(r["away_runs"]))
home, away = np.array(home), np.array(away)
home_runs, away_runs = np.array(home_runs), np.array(away_runs)
venue = np.array([run_factor[t] for t in ids])


def unpack(p):
    lo = np.concatenate([p[:n - 1], [-p[:n - 1].sum()]])
    ld = np.concatenate([p[n - 1:2 * n - 2], [-p[n - 1:2 * n - 2].sum()]])
    return lo, ld, p[-3], p[-2], p[-1]


def log_pmf(k, mean, g):
    a = (mean + 0.5) / gamma(1 + 1 / g)
    return np.log(np.exp(-(k / a) ** g) - np.exp(-((k + 1) / a) ** g))


def neg_log_lik(p):
    lo, ld, log_mean, log_edge, log_shape = unpack(p)
    g = np.exp(log_shape)
    mh = np.exp(log_mean + lo[home] + ld[away] + log_edge) * venue[home]
    ma = np.exp(log_mean + lo[away] + ld[home]) * venue[home]
    return -(log_pmf(home_runs, mh, g).sum() + log_pmf(away_runs, ma, g).sum())


p0 = np.zeros(2 * n + 1)
p0[-3], p0[-1] = np.log(4.5), np.log(1.8)
res = minimize(neg_log_lik, p0, method="L-BFGS-B")
lo, ld, log_mean, log_edge, log_shape = unpack(res.x)
true_lo = np.log([truth[t][0] for t in ids])
true_ld = np.log([truth[t][1] for t in ids])
print(f"regulation games used: {len(home)}, converged: {res.success}")
print(f"fitted mean {np.exp(log_mean):.3f} (truth 4.5), home edge {np.exp(log_edge):.4f} "
      f"(truth 1.03), shape {np.exp(log_shape):.3f} (truth 1.8)")
for name, fit, true in (("offence", lo, true_lo), ("defence", ld, true_ld)):
    rmse = np.sqrt(((fit - true) ** 2).mean())
    print(f"log {name}: correlation with truth {np.corrcoef(fit, true)[0, 1]:.3f}, "
          f"rms error {rmse:.4f} (truth sd {true.std():.4f})")
