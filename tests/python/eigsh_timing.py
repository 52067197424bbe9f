"""Times scipy's sparse symmetric eigensolver on finite-element matrices, the yardstick for the
engine's banded solver (same matrices, same number of modes, one thread).

Input (stdin): JSON {"k": [[i, j, v], ...], "m": [[i, j, v], ...], "n": size, "count": modes,
"runs": r}. Output: JSON {"omegas": [...], "seconds": median seconds of the r runs, "fastest": the
fastest run's seconds}.

eigsh in shift-invert mode around zero (sigma = 0) finds the lowest eigenvalues of
K x = lambda M x; it factors K - sigma M once (sparse LU) and runs Lanczos on the inverse.
"""
import json
import os
import sys
import time

os.environ.setdefault("OMP_NUM_THREADS", "1")
os.environ.setdefault("OPENBLAS_NUM_THREADS", "1")

import numpy as np  # noqa: E402
from scipy.sparse import coo_matrix  # noqa: E402
from scipy.sparse.linalg import eigsh  # noqa: E402


def main():
    data = json.load(sys.stdin)
    n = data["n"]

    def matrix(entries):
        i, j, v = zip(*entries)
        return coo_matrix((v, (i, j)), shape=(n, n)).tocsc()

    k, m = matrix(data["k"]), matrix(data["m"])
    times = []
    values = None
    for _ in range(data["runs"]):
        start = time.perf_counter()
        values = eigsh(k, k=data["count"], M=m, sigma=0.0, which="LM", return_eigenvectors=False)
        times.append(time.perf_counter() - start)
    times.sort()
    omegas = sorted(float(np.sqrt(max(v, 0.0))) for v in values)
    json.dump({"omegas": omegas, "seconds": times[len(times) // 2], "fastest": times[0]}, sys.stdout)


if __name__ == "__main__":
    main()
