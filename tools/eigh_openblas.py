#!/usr/bin/python3
"""Reference timing for BENCHMARKS.md: how long an optimised native LAPACK
takes for the dense symmetric eigendecompositions an exact spin simulation
needs, so that our pure-Go figures can be judged against it.

Not part of the tool or its tests. Needs Debian's python3-numpy and
libopenblas0-pthread (numpy then calls OpenBLAS's LAPACK, dsyevd):

    apt-get install python3-numpy libopenblas0-pthread
    /usr/bin/python3 tools/eigh_openblas.py

The sizes are the largest total-Mz blocks of 10, 12 and 14 distinct
spins-1/2 (binomial(n, n/2)): 252, 924, 3432; 2002 and 3003 are the other
large blocks of 14 spins. Matrices are random symmetric (the cost of a
dense eigendecomposition depends on the size, not on the entries); the
GEMM column is the matrix product V^T·B·V of the same size, the kind of
product that turns eigenvectors into transition intensities.
"""
import time

import numpy as np

rng = np.random.default_rng(1)
for n in (252, 924, 2002, 3003, 3432):
    a = rng.standard_normal((n, n))
    a = (a + a.T) / 2
    t = time.perf_counter()
    w, v = np.linalg.eigh(a)
    te = time.perf_counter() - t
    b = rng.standard_normal((n, n))
    t = time.perf_counter()
    c = v.T @ b @ v
    tg = time.perf_counter() - t
    print(f"n={n:5d}  eigh (dsyevd) {te:8.3f} s   V^T B V {tg:7.3f} s ({4 * n**3 / tg / 1e9:.1f} GFlop/s)", flush=True)
