"""Natural frequencies of a uniform beam-column (a slender beam under an axial force) from its
characteristic determinant, in mpmath at 40 digits.

EI w'''' - P w'' - m w^2 w = 0 (P tension positive) has the solutions cosh(a x), sinh(a x),
cos(b x), sin(b x) with a^2 = (P + r) / (2 EI), b^2 = (-P + r) / (2 EI), r = sqrt(P^2 + 4 EI m w^2)
(e.g. Blevins, Formulas for Natural Frequency and Mode Shape, beam-column section; Timoshenko &
Gere for the static case - from memory). The four end conditions - clamped: w = w' = 0; pinned:
w = M = 0; free: M = 0 and the transverse force -EI w''' + P w' = 0 - make a 4x4 system whose
determinant vanishes at the natural frequencies. Each root is refined from the engine's value;
a root must lie within 1e-6 of it and the determinant must change sign across it.

Input (stdin): JSON {"cases": [{"id", "length", "ei", "m", "p", "left", "right", "omegas"}]}.
Output (stdout): JSON {id: [roots...]} as strings (null where no root was found near a value).
"""
import json
import sys

import mpmath as mp

mp.mp.dps = 40


def rows(end, x, a, b, ei, p):
    """The two condition rows at position x for coefficients of cosh, sinh, cos, sin."""
    ch, sh, c, s = mp.cosh(a * x), mp.sinh(a * x), mp.cos(b * x), mp.sin(b * x)
    w = [ch, sh, c, s]
    w1 = [a * sh, a * ch, -b * s, b * c]
    w2 = [a * a * ch, a * a * sh, -b * b * c, -b * b * s]
    w3 = [a ** 3 * sh, a ** 3 * ch, b ** 3 * s, -b ** 3 * c]
    moment = [ei * v for v in w2]
    force = [-ei * v3 + p * v1 for v1, v3 in zip(w1, w3)]
    return {"clamped": [w, w1], "pinned": [w, moment], "free": [moment, force]}[end]


def determinant(case, omega):
    ei, m, p, length = (mp.mpf(case[k]) for k in ("ei", "m", "p", "length"))
    r = mp.sqrt(p * p + 4 * ei * m * omega * omega)
    a = mp.sqrt((p + r) / (2 * ei))
    b = mp.sqrt((-p + r) / (2 * ei))
    # Scale the hyperbolic columns by exp(-a L) so the determinant stays well scaled.
    scale = mp.exp(-a * length)
    m4 = rows(case["left"], mp.mpf(0), a, b, ei, p) + rows(case["right"], length, a, b, ei, p)
    for row in m4:
        row[0] *= scale
        row[1] *= scale
    return mp.det(mp.matrix(m4))


def main():
    data = json.load(sys.stdin)
    out = {}
    for case in data["cases"]:
        found = []
        for w in case["omegas"]:
            w = mp.mpf(w)
            lo, hi = w * (1 - mp.mpf("1e-6")), w * (1 + mp.mpf("1e-6"))
            f = lambda x: determinant(case, x)
            if mp.sign(f(lo)) == mp.sign(f(hi)):
                found.append(None)
                continue
            root = mp.findroot(f, (lo, hi), solver="anderson")
            found.append(mp.nstr(root, 30))
        out[case["id"]] = found
    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main()
