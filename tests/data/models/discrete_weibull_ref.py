#!/usr/bin/python3
# Independent reference for models/score_dist.h: discretised Weibull probabilities from SciPy.
# Usage: discrete_weibull_ref.py SCALE SHAPE KMAX
# Prints one line per k = 0..KMAX: "k pmf cdf" with
#   pmf = weibull_min(c=SHAPE, loc=-0.5, scale=SCALE).cdf(k + 0.5) - .cdf(k - 0.5)
#   cdf = weibull_min(...).cdf(k + 0.5)
# and a last line "mean M var V" of the discretised distribution (sum over k = 0..5000).
import sys

import numpy as np

from scipy.stats import weibull_min

scale, shape, kmax = float(sys.argv[1]), float(sys.argv[2]), int(sys.argv[3])
d = weibull_min(c=shape, loc=-0.5, scale=scale)
for k in range(kmax + 1):
    print(k, repr(float(d.cdf(k + 0.5) - d.cdf(k - 0.5))), repr(float(d.cdf(k + 0.5))))
k = np.arange(0, 5001, dtype=float)
p = d.sf(k - 0.5) - d.sf(k + 0.5)
m = float(np.sum(k * p))
s2 = float(np.sum(k * k * p))
print("mean", repr(m), "var", repr(s2 - m * m))
