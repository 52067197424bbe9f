"""Natural frequencies of a stepped beam of Timoshenko (or slender) segments with point
attachments, as roots of the boundary-value determinant of the transfer-matrix formulation in
high precision (mpmath, 40 significant digits; 20 already lose the sign on
the models checked).

This is an independent reference for the engine's exact method on shear-flexible models: the
engine carries a 2x2 end stiffness across pieces in double precision, this carries the whole
state (w, psi, M, V) from the left end by the matrix exponential of each span's first-order
system, computed by mpmath's own expm, adds the point attachments as jumps, and asks for the
determinant of the end conditions. Timoshenko's equations (Timoshenko 1921; in first-order form
e.g. Meirovitch, *Fundamentals of Vibrations*, from memory), with V = kGA (w' - psi), M = EI psi':

    w' = psi + V/kGA    psi' = M/EI    M' = -V - rhoI w^2 psi    V' = -m w^2 w

and for a slender segment (no kGA) w' = psi, M' = -V. The conditions come from the variation of
U - w^2 T: at an interior point with stiffness k (mass: k = -M w^2; sprung mass k_s, M:
k = -k_s M w^2 / (k_s - M w^2)), V(+) = V(-) + k w; with rotational stiffness kr (rotary inertia:
-J w^2), M(+) = M(-) + kr psi; a support adds an unknown reaction to V and the condition w = 0;
left end: kt w - V = 0, kr psi - M = 0; right end: kt w + V = 0, kr psi + M = 0 (free, pinned,
clamped, guided as the limits).

The determinant is multiplied by (k_s - M w^2) for each sprung mass, which removes its pole, so
what is left is an entire function of w whose simple roots are the natural frequencies. The
roots are found by scanning a grid fine enough to separate them (refined where the sign pattern
is unclear) and bisecting each sign change.

Given the engine's frequencies ("omegas"), it checks them instead of searching: the determinant
must change sign between (1 - p) and (1 + p) times each one (p = "proven", 1e-9 unless given),
which proves the value right to p, and must keep its sign between each bracket and the next at
"between" evenly spaced points (6 unless given) and below the first from "floor" (default 1e-3
of the first) up: a mode missed between two found ones would change the sign once more or
show in that scan.

Input (stdin): JSON {"models": [{"id", "segments": [[length, EI, m, kGA or null, rhoI], ...],
"left", "right", "attachments": [{"type", "x", ...}], "top": w_max, "grid": n}]} with ends
"free" | "pinned" | "clamped" | "guided" | {"kt": k, "kr": k} (null stiffness: rigid).
Output (stdout): JSON {id: [omega, ...]} of the roots in (0, top], rad/s, ascending; with
"omegas" given, JSON {id: {"problems": [...]}}.
"""
import json
import sys

import mpmath as mp

mp.mp.dps = 40


def system(seg, w2):
    """The span's first-order system in the state (w, psi, M, V)."""
    _, ei, m, kga, rhoi = seg
    shear = 0 if kga is None else 1 / mp.mpf(kga)
    rot = 0 if kga is None else mp.mpf(rhoi) * w2
    return mp.matrix(
        [
            [0, 1, 0, shear],
            [0, 0, 1 / mp.mpf(ei), 0],
            [0, -rot, 0, -1],
            [-mp.mpf(m) * w2, 0, 0, 0],
        ]
    )


def stations(model):
    """Sorted station positions with the segment of each span."""
    segs = model["segments"]
    joints, x = [0.0], 0.0
    for s in segs:
        x += s[0]
        joints.append(x)
    total = joints[-1]
    xs = sorted(set(joints) | {min(max(a["x"], 0.0), total) for a in model["attachments"]})

    def segment_at(mid):
        for i, s in enumerate(segs):
            if mid <= joints[i + 1]:
                return s
        return segs[-1]

    return xs, [(xs[i + 1] - xs[i], segment_at(0.5 * (xs[i] + xs[i + 1]))) for i in range(len(xs) - 1)]


def end_rows(end, sign):
    """Rows of the end's two conditions on the state (w, psi, M, V); sign -1 left, +1 right."""
    if end == "free":
        return [[0, 0, 1, 0], [0, 0, 0, 1]]
    if end == "pinned":
        return [[1, 0, 0, 0], [0, 0, 1, 0]]
    if end == "clamped":
        return [[1, 0, 0, 0], [0, 1, 0, 0]]
    if end == "guided":
        return [[0, 1, 0, 0], [0, 0, 0, 1]]
    kt, kr = end["kt"], end["kr"]
    t = [1, 0, 0, 0] if kt is None else [mp.mpf(kt), 0, 0, sign]
    r = [0, 1, 0, 0] if kr is None else [0, mp.mpf(kr), sign, 0]
    return [t, r]


def determinant(model, omega):
    w = mp.mpf(omega)
    w2 = w * w
    xs, spans = stations(model)
    at = {}
    for a in model["attachments"]:
        at.setdefault(min(max(a["x"], 0.0), xs[-1]), []).append(a)
    # Y maps the unknowns (left state, then reactions) to the state; conditions collect rows.
    Y = mp.eye(4)
    conditions = [row + [] for row in end_rows(model["left"], -1)]
    scale = mp.mpf(1)

    def widen(Y):
        Z = mp.zeros(4, Y.cols + 1)
        for i in range(4):
            for j in range(Y.cols):
                Z[i, j] = Y[i, j]
        return Z

    def point(Y, x):
        nonlocal scale
        for a in at.get(x, []):
            kind = a["type"]
            if kind in ("mass", "spring", "sprung-mass"):
                if kind == "mass":
                    k = -mp.mpf(a["m"]) * w2
                elif kind == "spring":
                    k = None if a["k"] is None else mp.mpf(a["k"])
                else:
                    ks, m = mp.mpf(a["k"]), mp.mpf(a["m"])
                    # The determinant is affine in k, so (ks - m w2) times it is entire.
                    k = -ks * m * w2 / (ks - m * w2)
                    scale *= ks - m * w2
                if k is None:
                    Y = support(Y, 0, 3)
                else:
                    for j in range(Y.cols):
                        Y[3, j] += k * Y[0, j]
                if kind == "mass" and a.get("j"):
                    kr = -mp.mpf(a["j"]) * w2
                    for j in range(Y.cols):
                        Y[2, j] += kr * Y[1, j]
            elif kind == "rotational-spring":
                if a["k"] is None:
                    Y = support(Y, 1, 2)
                else:
                    for j in range(Y.cols):
                        Y[2, j] += mp.mpf(a["k"]) * Y[1, j]
            elif kind == "support":
                Y = support(Y, 0, 3)
        return Y

    def support(Y, held, force):
        conditions.append([Y[held, j] for j in range(Y.cols)])
        for c in conditions:
            c.append(0)
        Y = widen(Y)
        Y[force, Y.cols - 1] = 1
        return Y

    Y = point(Y, xs[0])
    for (h, seg), x in zip(spans, xs[1:]):
        if h > 0:
            Y = mp.expm(system(seg, w2) * h) * Y
        Y = point(Y, x)
    for row in end_rows(model["right"], 1):
        conditions.append([sum(row[i] * Y[i, j] for i in range(4)) for j in range(Y.cols)])
    n = Y.cols
    rows = [c[:n] + [0] * (n - len(c)) for c in conditions]
    # Each row scaled to unit size: only the sign and the zeros matter, not the magnitude.
    rows = [[v / max(mp.mpf(1e-300), max(abs(u) for u in r)) for v in r] for r in rows]
    return mp.det(mp.matrix(rows)) * scale


def roots(model):
    top = float(model["top"])
    n = int(model.get("grid", 4000))
    # A grid in omega uniform in sqrt(omega): modes of a beam crowd like n^2 in frequency.
    grid = [top * ((i + 1) / n) ** 2 for i in range(n)]
    found = []
    prev_x, prev = None, None
    for x in grid:
        v = determinant(model, x)
        if prev is not None and mp.sign(v) != mp.sign(prev):
            lo, hi, flo = prev_x, x, prev
            for _ in range(200):
                mid = 0.5 * (lo + hi)
                fm = determinant(model, mid)
                if mp.sign(fm) == mp.sign(flo):
                    lo, flo = mid, fm
                else:
                    hi = mid
                if hi - lo < 1e-16 * hi:
                    break
            found.append(0.5 * (lo + hi))
        prev_x, prev = x, v
    return found


def check(model):
    omegas = [float(w) for w in model["omegas"]]
    p = float(model.get("proven", 1e-9))
    between = int(model.get("between", 6))
    problems = []
    # The points in ascending order, each with the index of the mode just below it.
    points = [(omegas[0] * float(model.get("floor", 1e-3)), 0)]
    for i, w in enumerate(omegas):
        points += [(w * (1 - p), i), (w * (1 + p), i + 1)]
        if i + 1 < len(omegas):
            lo, hi = w * (1 + p), omegas[i + 1] * (1 - p)
            points += [(lo + (hi - lo) * (k + 1) / (between + 1), i + 1) for k in range(between)]
    points.sort()
    signs = [(x, below, mp.sign(determinant(model, x))) for x, below in points]
    for (x0, b0, s0), (x1, b1, s1) in zip(signs, signs[1:]):
        changes = s0 != s1
        if b1 != b0 and not changes:
            problems.append(f"no sign change within {p:g} of mode {b1} at {omegas[b1 - 1]!r} rad/s")
        if b1 == b0 and changes:
            problems.append(f"a root between {x0!r} and {x1!r} rad/s that the engine does not list")
    return {"problems": problems}


def main():
    data = json.load(sys.stdin)
    out = {m["id"]: (check(m) if "omegas" in m else roots(m)) for m in data["models"]}
    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main()
