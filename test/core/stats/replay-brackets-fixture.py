# Generates test/core/stats/replay-brackets.reference.json: chi-square quantiles on the grid the Wilson–Hilferty
# bracket is checked on (src/stats/chi-square-quantile-bracket.ts). scipy.stats.chi2.ppf gives the start; it
# drifts by ~5e-8 relative at 4e6 df, so each value is polished by Newton steps on mpmath's regularised
# incomplete gamma at 40 digits. Run: python3 test/core/stats/replay-brackets-fixture.py
import json
import mpmath as mp
import numpy as np
import scipy
from scipy import stats

mp.mp.dps = 40
ps = sorted(set([1e-6, 1e-5, 1e-4, 5e-4, 0.001, 0.0025, 0.005, 0.01, 0.025, 0.05, 0.1, 0.2, 0.3, 0.5, 0.7,
                 0.8, 0.9, 0.95, 0.975, 0.99, 0.995, 0.9975, 0.999, 0.9995, 0.9999, 0.99999, 1 - 1e-6]))
dfs = [1, 2, 3, 5, 8, 13, 20, 35, 60, 99, 250, 600, 1500, 4000, 10000, 30000, 100000, 1000000, 4000000]


def quantile(p, df):
    k = mp.mpf(df) / 2
    target = mp.mpf(p)
    x = mp.mpf(float(stats.chi2.ppf(p, df)))
    for _ in range(20):
        try:
            f = mp.gammainc(k, 0, x / 2, regularized=True) - target
        except mp.libmp.libhyper.NoConvergence:  # the lower series is slow there: the upper tail instead
            f = (1 - target) - mp.gammainc(k, x / 2, mp.inf, regularized=True)
        dens = mp.exp((k - 1) * mp.log(x / 2) - x / 2 - mp.loggamma(k)) / 2
        step = f / dens
        x -= step
        if abs(step) < mp.mpf(10) ** -25 * max(1, abs(x)):
            break
    return float(x)


cases = [{"p": p, "df": df, "value": quantile(p, df)} for df in dfs for p in ps]
with open("test/core/stats/replay-brackets.reference.json", "w") as f:
    json.dump({"source": "scipy.stats.chi2.ppf polished by Newton on mpmath.gammainc (40 digits)",
               "command": "python3 test/core/stats/replay-brackets-fixture.py", "scipy": scipy.__version__,
               "mpmath": mp.__version__, "numpy": np.__version__, "cases": cases}, f, indent=1)
    f.write("\n")
