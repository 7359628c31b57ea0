#!/usr/bin/python3
"""Peer of `npm run bench -- ingest`: the same job done the usual scientific-Python way.

pandas.read_csv, the same steady-state filter, then scipy.stats.binned_statistic_2d of the
correction ratio on the table's cells (nearest cell; the peer has no bilinear splatting and no
delay alignment, so it does strictly less work than Cellsmith). Prints one JSON line:
{"seconds": s, "peakMiB": m, "kept": n, "cells": k}.

Usage: ingest_peer.py CSV AXES_JSON   (AXES_JSON holds {"rpmAxis": [...], "mapAxisKpa": [...]})
Needs Debian's python3-pandas and python3-scipy (`npm run bench` installs them when missing).
"""
import json
import resource
import sys
import time

import numpy as np
import pandas as pd
from scipy.stats import binned_statistic_2d


def edges(axis):
    """Cell edges halfway between breakpoints, open at both ends (nearest-breakpoint cells)."""
    a = np.asarray(axis, dtype=float)
    mid = (a[1:] + a[:-1]) / 2
    return np.concatenate(([-np.inf], mid, [np.inf]))


def main():
    csv_path, axes_path = sys.argv[1], sys.argv[2]
    with open(axes_path) as f:
        axes = json.load(f)
    start = time.perf_counter()
    df = pd.read_csv(csv_path)
    t = df["time_s"].to_numpy()
    rpm = df["engine_rpm"].to_numpy()
    map_kpa = df["map_kpa"].to_numpy()
    lam = df["lambda_measured"].to_numpy()
    target = df["lambda_target"].to_numpy()
    tps = df["throttle_pct"].to_numpy()
    stft = df["stft_pct"].to_numpy()
    ltft = df["ltft_pct"].to_numpy()
    ect = df["ect_c"].to_numpy()
    cut = df["fuel_cut"].to_numpy()
    # The same rules, thresholds and order as the Cellsmith side of the benchmark.
    dt_tps = np.gradient(tps, t)
    dt_rpm = np.gradient(rpm, t)
    dt_map = np.gradient(map_kpa, t)
    keep = (
        (ect >= 70)
        & (cut < 0.5)
        & (np.abs(dt_tps) <= 10)
        & (np.abs(dt_rpm) <= 300)
        & (np.abs(dt_map) <= 20)
        & (lam >= 0.65)
        & (lam <= 1.3)
    )
    ratio = lam / target * (1 + stft / 100) * (1 + ltft / 100)
    stat = binned_statistic_2d(
        map_kpa[keep],
        rpm[keep],
        ratio[keep],
        statistic="mean",
        bins=[edges(axes["mapAxisKpa"]), edges(axes["rpmAxis"])],
    )
    seconds = time.perf_counter() - start
    peak_mib = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024
    cells = int(np.count_nonzero(~np.isnan(stat.statistic)))
    print(json.dumps({"seconds": seconds, "peakMiB": peak_mib, "kept": int(keep.sum()), "cells": cells}))


if __name__ == "__main__":
    main()
