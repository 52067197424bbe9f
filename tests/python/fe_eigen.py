"""Generalized symmetric eigenvalues of finite-element matrices with scipy.linalg.eigh, the
reference for the engine's banded Sturm-count solver.

Input (stdin): JSON {"problems": [{"id", "k": [[...]], "m": [[...]], "count"}]}.
Output: JSON {id: [omega_1, ..., omega_count]} with omega = sqrt(eigenvalue), ascending.
"""
import json
import sys

import numpy as np
from scipy.linalg import eigh


def main():
    data = json.load(sys.stdin)
    out = {}
    for p in data["problems"]:
        k = np.array(p["k"], dtype=float)
        m = np.array(p["m"], dtype=float)
        values = eigh(k, m, eigvals_only=True)
        out[p["id"]] = [float(np.sqrt(max(v, 0.0))) for v in sorted(values)[: p["count"]]]
    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main()
