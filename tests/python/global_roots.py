"""Checks natural frequencies of slender beams with many attachments against the classical global
formulation in high precision.

The engine eliminates the beam station by station with transfer matrices in double precision.
This reference does what the method's textbooks do instead: it assembles the global dynamic
stiffness K(w) from each member's closed-form stiffness (the functions F, F-bar, H, H-bar, A, B
of lambda; e.g. Williams & Wittrick's papers on the algorithm), factors the banded matrix by
LDL^T in MPFR (through gmpy2) at 30+ significant digits, and counts natural frequencies below w
as J(w) = J0(w) + (negative pivots), with J0 the members' clamped-clamped frequencies from
J_m = i - (1 - (-1)^i sgn(1 - cosh(l) cos(l)))/2, i = floor(l/pi).

For each model it is given the engine's frequencies (rad/s). For each one it checks that the
count steps from k-1 to k between (1 - p) and (1 + p) times it, which proves the engine's value
right to a relative p (1e-10 unless the input says otherwise) and the mode's index right, and
that the count at the midpoint between consecutive frequencies is exactly their index (no mode
missed or duplicated). Where a check fails it says how far off the engine is, from the count's
step found by bisection. Precision is raised with the shortest member, whose closed forms cancel
like lambda^4.

Input (stdin): JSON {"models": [{"id", "segments": [[length, EI, m], ...], "left", "right",
"attachments": [...], "omegas": [...], "rigid": r}], "proven": p} in the format of
beam_roots.py. Output (stdout): JSON {id: {"problems": [...]}}.
"""
import json
import math
import sys

import gmpy2
from gmpy2 import mpfr


def stations(model):
    """Sorted station positions, the segment of each span, and what sits at each station."""
    total = sum(s[0] for s in model["segments"])
    xs = {0.0, total}
    x = 0.0
    for s in model["segments"][:-1]:
        x += s[0]
        xs.add(x)
    for a in model["attachments"]:
        xs.add(a["x"])
    xs = sorted(xs)
    bounds = []
    x = 0.0
    for s in model["segments"]:
        bounds.append((x, x + s[0], s))
        x += s[0]

    def segment_at(mid):
        for lo, hi, s in bounds:
            if mid <= hi:
                return s
        return bounds[-1][2]

    spans = [(xs[i + 1] - xs[i], segment_at(0.5 * (xs[i] + xs[i + 1]))) for i in range(len(xs) - 1)]
    return xs, spans


def member(length, ei, m, w2):
    """Closed-form dynamic stiffness (4x4, [w1, t1, w2, t2]) and clamped-clamped count."""
    L, ei, m = mpfr(length), mpfr(ei), mpfr(m)
    lam = L * gmpy2.root(m * w2 / ei, 4)
    s, c, S, C = gmpy2.sin(lam), gmpy2.cos(lam), gmpy2.sinh(lam), gmpy2.cosh(lam)
    D = 1 - C * c
    F = lam ** 3 * (S * c + C * s) / D
    Fb = lam ** 3 * (S + s) / D
    H = lam ** 2 * S * s / D
    Hb = lam ** 2 * (C - c) / D
    A = lam * (C * s - S * c) / D
    B = lam * (S - s) / D
    k = ei / L ** 3
    K = [
        [F * k, H * k * L, -Fb * k, Hb * k * L],
        [H * k * L, A * k * L * L, -Hb * k * L, B * k * L * L],
        [-Fb * k, -Hb * k * L, F * k, -H * k * L],
        [Hb * k * L, B * k * L * L, -H * k * L, A * k * L * L],
    ]
    i = int(gmpy2.floor(lam / gmpy2.const_pi()))
    sign = 1 if D > 0 else (-1 if D < 0 else 0)
    count = i - (1 - (-1) ** i * sign) // 2
    return K, int(count)


def evaluate(model, omega):
    """(J, sign of det) at omega: the Wittrick-Williams count and the determinant's sign."""
    xs, spans = stations(model)
    w2 = mpfr(omega) ** 2
    n_st = len(xs)
    zero = mpfr(0)
    held = [[False, False] for _ in xs]
    diag = [[zero, zero] for _ in xs]
    sprung = [[] for _ in xs]

    def end(e, i):
        named = {"free": (0, 0), "pinned": (1, 0), "clamped": (1, 1), "guided": (0, 1)}
        if isinstance(e, str):
            hw, ht = named[e]
            held[i][0] |= bool(hw)
            held[i][1] |= bool(ht)
        else:
            for j, key in enumerate(["kt", "kr"]):
                v = e[key]
                if v is None or (isinstance(v, float) and math.isinf(v)):
                    held[i][j] = True
                else:
                    diag[i][j] += mpfr(v)

    end(model["left"], 0)
    end(model["right"], n_st - 1)
    index = {x: i for i, x in enumerate(xs)}
    for a in model["attachments"]:
        i = index[a["x"]]
        t = a["type"]
        if t == "mass":
            diag[i][0] -= mpfr(a["m"]) * w2
            diag[i][1] -= mpfr(a.get("j", 0)) * w2
        elif t == "spring":
            if a["k"] is None:
                held[i][0] = True
            else:
                diag[i][0] += mpfr(a["k"])
        elif t == "rotational-spring":
            if a["k"] is None:
                held[i][1] = True
            else:
                diag[i][1] += mpfr(a["k"])
        elif t == "support":
            held[i][0] = True
        elif t == "sprung-mass":
            sprung[i].append((mpfr(a["m"]), mpfr(a["k"])))
    # Number the unknowns station by station, each sprung mass right after its station.
    dof = 0
    ids = []
    sp_ids = []
    for i in range(n_st):
        w = None if held[i][0] else dof
        dof += 0 if held[i][0] else 1
        t = None if held[i][1] else dof
        dof += 0 if held[i][1] else 1
        ids.append((w, t))
        sp = []
        for _ in sprung[i]:
            sp.append(dof)
            dof += 1
        sp_ids.append(sp)
    n = dof
    band = 3 + max([len(s) for s in sprung] + [0])
    # rows[i][k] holds A[i][i - k] for k = 0..band.
    rows = [[zero] * (band + 1) for _ in range(n)]

    def add(a, b, v):
        if a is None or b is None:
            return
        if a < b:
            a, b = b, a
        rows[a][a - b] += v

    j0 = 0
    cache = {}
    for i, (length, seg) in enumerate(spans):
        key = (length, seg[1], seg[2])
        if key not in cache:
            cache[key] = member(length, seg[1], seg[2], w2)
        Km, cnt = cache[key]
        j0 += cnt
        d = [ids[i][0], ids[i][1], ids[i + 1][0], ids[i + 1][1]]
        for a in range(4):
            for b in range(a + 1):
                add(d[a], d[b], Km[a][b])
    for i in range(n_st):
        add(ids[i][0], ids[i][0], diag[i][0])
        add(ids[i][1], ids[i][1], diag[i][1])
        for (m, k), s in zip(sprung[i], sp_ids[i]):
            add(s, s, k - m * w2)
            if ids[i][0] is not None:
                add(ids[i][0], ids[i][0], k)
                add(s, ids[i][0], -k)
    # Banded LDL^T without interchanges, right-looking: rows[i][k] becomes L[i][i - k].
    neg = 0
    sign = 1
    for j in range(n):
        p = rows[j][0]
        if p < 0:
            neg += 1
            sign = -sign
        elif p == 0:
            sign = 0
            p = mpfr("1e-300")
        below = [(i, rows[i][i - j]) for i in range(j + 1, min(n, j + band + 1)) if rows[i][i - j] != 0]
        for i, v in below:
            li = v / p
            for r, u in below:
                if r <= i:
                    rows[i][i - r] -= li * u
            rows[i][i - j] = li
    return j0 + neg, sign


def check(model, proven):
    """Checks that each engine frequency lies within a relative `proven` of a natural frequency
    of the right index, and that no natural frequency lies between neighbouring ones."""
    xs, spans = stations(model)
    top = max(model["omegas"])
    # Enough digits that the shortest member's closed forms keep 25 of them.
    lam_min = min(l * (s[2] * top ** 2 / s[1]) ** 0.25 for l, s in spans)
    digits = 30 + 4 * max(0, int(math.ceil(-math.log10(max(float(lam_min), 1e-300)))))
    gmpy2.get_context().precision = int(digits * 3.33) + 8
    omegas = [mpfr(w) for w in model["omegas"]]
    rigid = model.get("rigid", 0)
    problems = []
    for k, w in enumerate(omegas, start=rigid + 1):
        lo, hi = w * (1 - proven), w * (1 + proven)
        below_lo = evaluate(model, lo)[0]
        below_hi = evaluate(model, hi)[0]
        if below_lo == k - 1 and below_hi == k:
            continue
        # Say how far off the engine is: the count's step, found by bisection.
        a, b = w * (1 - mpfr("1e-4")), w * (1 + mpfr("1e-4"))
        if evaluate(model, a)[0] >= k or evaluate(model, b)[0] < k:
            problems.append(f"mode {k}: no natural frequency of that index within 1e-4 of {float(w)!r}")
            continue
        for _ in range(80):
            m = (a + b) / 2
            if evaluate(model, m)[0] >= k:
                b = m
            else:
                a = m
        true = (a + b) / 2
        problems.append(f"mode {k}: the engine's {float(w)!r} is {float(abs(w - true) / true):.3e} from {true:.20g}")
    for k in range(len(omegas) - 1):
        mid = (omegas[k] + omegas[k + 1]) / 2
        j = evaluate(model, mid)[0]
        if j != rigid + k + 1:
            problems.append(f"between modes {rigid + k + 1} and {rigid + k + 2}: the count is {j}")
    return {"problems": problems}


def main():
    data = json.load(sys.stdin)
    proven = mpfr(data.get("proven", 1e-10))
    out = {m["id"]: check(m, proven) for m in data["models"]}
    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main()
