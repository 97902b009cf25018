#!/usr/bin/python3
"""Native dense reference on this machine, for the README's performance table.

Not part of `npm run bench` (it needs Python): Debian's packages only,
    apt-get install python3-numpy libopenblas0-pthread
    OPENBLAS_NUM_THREADS=1 /usr/bin/python3 bench/native-reference.py
(unset OPENBLAS_CORETYPE / OPENBLAS_L2_SIZE together in that command alone if
the environment sets them). Reports one-core GF/s of the update C -= A·Aᵀ
(2n³ flops counted as for a GEMM, the convention of bench/kernels.mjs) and of
dense Cholesky (n³/3 flops), medians of 5 runs.
"""
import time
import numpy as np

def median(xs):
    s = sorted(xs)
    return s[len(s) // 2]

def gemm_rate(n, runs=5):
    rng = np.random.default_rng(1)
    a = rng.standard_normal((n, n))
    c = np.zeros((n, n))
    times = []
    for _ in range(runs):
        t0 = time.perf_counter()
        c -= a @ a.T
        times.append(time.perf_counter() - t0)
    return 2 * n**3 / median(times) / 1e9

def cholesky_rate(n, runs=5):
    rng = np.random.default_rng(2)
    b = rng.standard_normal((n, n))
    a = b @ b.T + n * np.eye(n)
    times = []
    for _ in range(runs):
        t0 = time.perf_counter()
        np.linalg.cholesky(a)
        times.append(time.perf_counter() - t0)
    return n**3 / 3 / median(times) / 1e9

print("numpy", np.__version__)
for n in (256, 512, 2000):
    print(f"n={n:5d}  C-=A*A^T {gemm_rate(n):6.1f} GF/s   cholesky {cholesky_rate(n):6.1f} GF/s")
