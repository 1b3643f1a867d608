"""Evaluate statsmodels' exact Gaussian log-likelihood at OUR estimates (from dump-ours.ts) and
compare with the log-likelihood we report, for every fit where ours beats the fixture's target.

Usage: /usr/bin/python3 verify-ours.py ../fixtures/arma-grid.json OURS.jsonl [--all]
(--all: every fit, printing only those where the two disagree by more than 1e-6)
"""

import json
import sys
import warnings

import numpy as np
from statsmodels.tsa.arima.model import ARIMA


def poly_min_modulus(coefs):
    if len(coefs) == 0:
        return float("inf")
    return float(min(abs(np.roots(np.r_[-np.asarray(coefs)[::-1], 1.0]))))


def main():
    fixture = json.load(open(sys.argv[1]))
    ours = {o["id"]: o for o in map(json.loads, open(sys.argv[2]))}
    series = {s["name"]: np.array([np.nan if v is None else v for v in s["data"]], dtype=float) for s in fixture["series"]}
    every = "--all" in sys.argv[3:]
    worst = 0.0
    checked = 0
    for f in fixture["fits"]:
        o = ours[f["id"]]
        if not every and not o["loglik"] > f["target"] + 1e-3:
            continue
        p, d, q = f["order"]["p"], f["order"]["d"], f["order"]["q"]
        y = series[f["series"]]
        if d > 0:
            y = np.diff(y, n=d)
        trend = "c" if f["includeMean"] and d == 0 else "n"
        model = ARIMA(y, order=(p, 0, q), trend=trend)
        params = ([o["mean"]] if trend == "c" else []) + o["ar"] + [-m for m in o["ma"]] + [o["sigma2"]]
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            ll = float(model.loglike(np.asarray(params, dtype=float), transformed=True))
        checked += 1
        gap = abs(ll - o["loglik"])
        worst = max(worst, gap)
        if every and gap <= 1e-6:
            continue
        print(
            f"{f['id']:40s} ours {o['loglik']:.4f} statsmodels-at-ours {ll:.4f} target {f['target']:.4f} "
            f"min|AR root| {poly_min_modulus(o['ar']):.4f} min|MA root| {poly_min_modulus(o['ma']):.4f}"
        )
    what = "fits" if every else "fits where ours beats the target"
    print(f"checked {checked} {what}; largest |ours - statsmodels at ours| = {worst:.2e}")


if __name__ == "__main__":
    main()
