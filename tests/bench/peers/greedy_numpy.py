"""Peer greedy planners in NumPy/SciPy for `npm run bench` (docs/engine.md sections 2 and 6).

Reads an edge list ("n m", then "i j w" per undirected tie), runs the greedy for k starters
and prints one JSON line: picks, total, compute time (median of the repeats, file reading
excluded), and the BLAS in use.

Modes:
  optimised  ergodic first pick: Z = (I - P + 1 pi^T)^-1 by LAPACK, every single-starter total
             F(j) = (n Z_jj - sum_i Z_ij) / pi_j (Aldous & Fill, Reversible Markov Chains, ch. 2),
             N of {j} in O(n^2) from Z, then per pick the gains h_j c_j / N_jj and an in-place
             rank-one Schur downdate (BLAS dger on a Fortran-ordered N).
  plain      the same algorithm written plainly: np.linalg.inv and np.outer per pick.
Tie-break: the first index among equal gains (the engine uses the same order).
"""
import json
import sys
import time

import numpy as np
from scipy.linalg import blas


def read_room(path):
    with open(path) as f:
        n, m = map(int, f.readline().split())
        data = np.loadtxt(f, ndmin=2) if m > 0 else np.zeros((0, 3))
    w = np.zeros((n, n))
    i = data[:, 0].astype(np.int64)
    j = data[:, 1].astype(np.int64)
    np.add.at(w, (i, j), data[:, 2])
    np.add.at(w, (j, i), data[:, 2])
    return w


def first_state(w):
    n = w.shape[0]
    d = w.sum(axis=1)
    p = w / d[:, None]
    pi = d / d.sum()
    z = np.linalg.inv(np.eye(n) - p + np.outer(np.ones(n), pi))
    single = (n * np.diag(z) - z.sum(axis=0)) / pi
    j = int(np.argmin(single))
    # N_il = Z_il - Z_jl + pi_l (Z_jj - Z_ij) / pi_j on T = V \ {j}.
    f = (z[j, j] - z[:, j]) / pi[j]
    big_n = z - z[j, :][None, :] + np.outer(f, pi)
    big_n[j, :] = 0.0
    big_n[:, j] = 0.0
    return big_n, j


def greedy_optimised(w, k):
    big_n, j = first_state(w)
    big_n = np.asfortranarray(big_n)
    inT = np.ones(w.shape[0], dtype=bool)
    inT[j] = False
    picks = [j]
    h = big_n.sum(axis=1)
    c = big_n.sum(axis=0)
    while len(picks) < k:
        diag = big_n.diagonal().copy()
        diag[~inT] = 1.0
        gain = np.where(inT, h * c / diag, -np.inf)
        j = int(np.argmax(gain))
        njj = big_n[j, j]
        col = big_n[:, j].copy()
        row = big_n[j, :].copy()
        h -= col * (h[j] / njj)
        c -= row * (c[j] / njj)
        big_n = blas.dger(-1.0 / njj, col, row, a=big_n, overwrite_a=1)
        inT[j] = False
        h[j] = c[j] = 0.0
        big_n[j, :] = 0.0
        big_n[:, j] = 0.0
        picks.append(j)
    return picks, float(h[inT].sum())


def greedy_plain(w, k):
    big_n, j = first_state(w)
    inT = np.ones(w.shape[0], dtype=bool)
    inT[j] = False
    picks = [j]
    while len(picks) < k:
        h = big_n.sum(axis=1)
        c = big_n.sum(axis=0)
        gains = [h[i] * c[i] / big_n[i, i] if inT[i] else -np.inf for i in range(len(h))]
        j = int(np.argmax(gains))
        big_n = big_n - np.outer(big_n[:, j], big_n[j, :]) / big_n[j, j]
        big_n[j, :] = 0.0
        big_n[:, j] = 0.0
        inT[j] = False
        picks.append(j)
    return picks, float(big_n.sum())


def blas_name():
    try:
        cfg = np.show_config(mode="dicts")
        return cfg["Build Dependencies"]["blas"]["name"]
    except Exception:  # older NumPy: no dict mode
        return "unknown"


def main():
    path, k, mode, repeats = sys.argv[1], int(sys.argv[2]), sys.argv[3], int(sys.argv[4])
    w = read_room(path)
    run = greedy_optimised if mode == "optimised" else greedy_plain
    times = []
    out = None
    for _ in range(repeats):
        t = time.perf_counter()
        out = run(w, k)
        times.append((time.perf_counter() - t) * 1000)
    times.sort()
    picks, total = out
    print(json.dumps({"picks": picks, "total": total, "ms": times[len(times) // 2], "blas": blas_name()}))


if __name__ == "__main__":
    main()
