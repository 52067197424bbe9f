"""Natural frequencies of a stepped Euler-Bernoulli beam with point attachments, found as roots of
the boundary-value determinant with mpmath.

This is the reference the engine's exact method is checked against: a different formulation
(the classical characteristic determinant of the beam equation, solved segment by segment with
continuity and jump conditions) in a different arithmetic (mpmath, 30 significant digits).

Input (stdin): JSON {"models": [{"id", "segments": [[length, EI, m], ...], "left", "right",
"attachments": [{"type", "x", ...}], "count"}]} with ends "free" | "pinned" | "clamped" |
"guided" | {"kt": k, "kr": k}. Output (stdout): JSON {id: [omega_1, ..., omega_count]} of the
elastic modes (zero roots excluded).

Conditions are the natural and essential ones from the variation of
    U - w^2 T = 1/2 Int EI w''^2 - w^2/2 Int m w^2 + point terms:
interior point: EI w''(-) - EI w''(+) + (kr - J w^2) w' = 0, -EI w'''(-) + EI w'''(+) + (k - M w^2) w = 0;
left end: -EI w'' + kr w' = 0, EI w''' + kt w = 0;  right end: EI w'' + kr w' = 0, -EI w''' + kt w = 0.
"""
import json
import sys

import math

import mpmath as mp
import numpy as np

mp.mp.dps = 30


class Float:
    """Double precision: fast enough to scan for sign changes with the well-scaled basis."""

    mpf = float
    cos, sin, exp = math.cos, math.sin, math.exp

    @staticmethod
    def root4(x):
        return x ** 0.25

    @staticmethod
    def det(rows):
        return float(np.linalg.det(np.array(rows, dtype=float)))


class Multi:
    """mpmath at 30 digits, for the roots themselves."""

    mpf = mp.mpf
    cos, sin, exp = mp.cos, mp.sin, mp.exp

    @staticmethod
    def root4(x):
        return mp.root(x, 4)

    @staticmethod
    def det(rows):
        return mp.det(mp.matrix(rows))


def basis(M, beta, length, s):
    """Values and first three derivatives of cos, sin, exp(-beta s), exp(-beta (l - s)).

    The decaying exponentials in place of cosh and sinh keep the determinant well scaled."""
    c, sn = M.cos(beta * s), M.sin(beta * s)
    e1, e2 = M.exp(-beta * s), M.exp(-beta * (length - s))
    b = beta
    return [
        [c, sn, e1, e2],
        [-b * sn, b * c, -b * e1, b * e2],
        [-b * b * c, -b * b * sn, b * b * e1, b * b * e2],
        [b ** 3 * sn, -b ** 3 * c, -b ** 3 * e1, b ** 3 * e2],
    ]


def pieces(model):
    """Split the segments at attachment points: list of (x0, length, EI, m)."""
    cuts = sorted({a["x"] for a in model["attachments"]})
    out = []
    x = 0.0
    for length, ei, m in model["segments"]:
        start, end = x, x + length
        points = [start] + [c for c in cuts if start < c < end] + [end]
        for a, b in zip(points, points[1:]):
            out.append((a, b - a, ei, m))
        x = end
    return out


def sprung_terms(M, k_plain, sprung, w2):
    """(scale, scaled stiffness): scale = prod(k_s - m_s w^2) and the point stiffness
    k_plain + sum k_eff multiplied by it."""
    scale = M.mpf(1)
    for a in sprung:
        scale *= M.mpf(a["k"]) - M.mpf(a["m"]) * w2
    total = k_plain * scale
    for a in sprung:
        others = M.mpf(1)
        for b in sprung:
            if b is not a:
                others *= M.mpf(b["k"]) - M.mpf(b["m"]) * w2
        total += -M.mpf(a["k"]) * M.mpf(a["m"]) * w2 * others
    return scale, total


def determinant(M, model, omega):
    ps = pieces(model)
    n = 4 * len(ps)
    rows = []
    w2 = omega * omega

    def at(i, s):
        x0, length, ei, m = ps[i]
        beta = M.root4(m * w2 / ei)
        return basis(M, beta, length, s), ei

    def row(entries):
        r = [M.mpf(0)] * n
        for (i, coeffs) in entries:
            for j in range(4):
                r[4 * i + j] += coeffs[j]
        return r

    def end_rows(end, i, s, sign, x):
        """Two rows for an end; attachments at the end add to its springs."""
        f, ei = at(i, s)
        named = {
            "free": (False, False, 0, 0),
            "pinned": (True, False, 0, 0),
            "clamped": (True, True, 0, 0),
            "guided": (False, True, 0, 0),
        }
        if isinstance(end, str):
            held_w, held_t, kt, kr = named[end]
        else:
            held_w, held_t, kt, kr = False, False, end["kt"], end["kr"]
        kt, kr = M.mpf(kt), M.mpf(kr)
        sprung = []
        for a in model["attachments"]:
            if abs(a["x"] - x) > 1e-12:
                continue
            kind = a["type"]
            if kind == "support":
                held_w = True
            elif kind == "mass":
                kt -= M.mpf(a.get("m", 0)) * w2
                kr -= M.mpf(a.get("j", 0)) * w2
            elif kind == "spring":
                kt += M.mpf(a["k"])
            elif kind == "rotational-spring":
                kr += M.mpf(a["k"])
            elif kind == "sprung-mass":
                sprung.append(a)
        # Each sprung mass acts as k_eff = -k m w^2 / (k - m w^2); multiply the row through by
        # the product of the (k - m w^2) so that it has no poles.
        scale, kt = sprung_terms(M, kt, sprung, w2)
        out = []
        if held_w:
            out.append(row([(i, f[0])]))
        else:
            out.append(row([(i, [-sign * ei * f[3][j] * scale + kt * f[0][j] for j in range(4)])]))
        if held_t:
            out.append(row([(i, f[1])]))
        else:
            out.append(row([(i, [sign * ei * f[2][j] + kr * f[1][j] for j in range(4)])]))
        return out

    total = sum(seg[0] for seg in model["segments"])
    rows += end_rows(model["left"], 0, 0, -1, 0.0)
    last = len(ps) - 1
    rows += end_rows(model["right"], last, ps[last][1], +1, total)
    for i in range(len(ps) - 1):
        x = ps[i][0] + ps[i][1]
        fl, eil = at(i, ps[i][1])
        fr, eir = at(i + 1, 0)
        here = [a for a in model["attachments"] if abs(a["x"] - x) < 1e-12]
        k = sum(M.mpf(a.get("k", 0)) for a in here if a["type"] == "spring")
        kr = sum(M.mpf(a.get("k", 0)) for a in here if a["type"] == "rotational-spring")
        mass = sum(M.mpf(a.get("m", 0)) for a in here if a["type"] == "mass")
        inertia = sum(M.mpf(a.get("j", 0)) for a in here if a["type"] == "mass")
        sprung = [a for a in here if a["type"] == "sprung-mass"]
        supported = any(a["type"] == "support" for a in here)
        neg = lambda v: [-t for t in v]
        rows.append(row([(i, fl[1]), (i + 1, neg(fr[1]))]))  # slope continuous
        moment = row([(i, [eil * t for t in fl[2]]), (i + 1, [-eir * t for t in fr[2]])])
        moment = [a + b for a, b in zip(moment, row([(i, [(kr - inertia * w2) * t for t in fl[1]])]))]
        rows.append(moment)
        if supported:
            rows.append(row([(i, fl[0])]))
            rows.append(row([(i + 1, fr[0])]))
            continue
        rows.append(row([(i, fl[0]), (i + 1, neg(fr[0]))]))  # deflection continuous
        # Shear jump, multiplied through by each sprung mass's (k_s - m_s w^2) to stay pole-free.
        scale, point = sprung_terms(M, k - mass * w2, sprung, w2)
        shear = row([(i, [-eil * t * scale for t in fl[3]]), (i + 1, [eir * t * scale for t in fr[3]])])
        shear = [a + b for a, b in zip(shear, row([(i, [point * t for t in fl[0]])]))]
        rows.append(shear)
    return M.det(rows)


def illinois(f, a, b, fa, fb):
    """The Illinois variant of regula falsi on a sign-changing bracket, to ~25 digits."""
    side = 0
    for _ in range(200):
        c = (a * fb - b * fa) / (fb - fa)
        fc = f(c)
        if fc == 0 or abs(b - a) < mp.mpf(10) ** -25 * abs(c):
            return c
        if mp.sign(fc) == mp.sign(fb):
            b, fb = c, fc
            if side == -1:
                fa /= 2
            side = -1
        else:
            a, fa = c, fc
            if side == 1:
                fb /= 2
            side = 1
    return c


def roots(model):
    total = sum(s[0] for s in model["segments"])
    _, ei, m = model["segments"][0]
    # Scan in the frequency parameter of the first segment's properties over the whole length,
    # in double precision; refine each sign change with mpmath.
    omega_of = lambda lam: (lam / total) ** 2 * (ei / m) ** 0.5
    found = []
    lam, step = 0.05, 0.004
    previous = determinant(Float, model, omega_of(lam))
    while len(found) < model["count"] and lam < 200:
        nxt = lam + step
        value = determinant(Float, model, omega_of(nxt))
        if value == 0 or np.sign(value) != np.sign(previous):
            f = lambda l: determinant(Multi, model, (l / total) ** 2 * mp.sqrt(mp.mpf(ei) / m))
            a, b = mp.mpf(lam), mp.mpf(nxt)
            fa, fb = f(a), f(b)
            if fa == 0:
                found.append(a)
            elif mp.sign(fa) != mp.sign(fb):
                found.append(illinois(f, a, b, fa, fb))
        previous, lam = value, nxt
    return [float((r / total) ** 2 * mp.sqrt(mp.mpf(ei) / m)) for r in found]


def main():
    data = json.load(sys.stdin)
    out = {m["id"]: roots(m) for m in data["models"]}
    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main()
