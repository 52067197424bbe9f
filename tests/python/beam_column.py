"""Natural frequencies of a uniform beam-column (a slender beam under an axial force) from its
characteristic determinant, in mpmath at 40 digits.

EI w'''' - P w'' - m w^2 w = 0 (P tension positive) has the solutions cosh(a x), sinh(a x),
cos(b x), sin(b x) with a^2 = (P + r) / (2 EI), b^2 = (-P + r) / (2 EI), r = sqrt(P^2 + 4 EI m w^2)
(e.g. Blevins, Formulas for Natural Frequency and Mode Shape, beam-column section; Timoshenko &
Gere for the static case - from memory). The four end conditions - clamped: w = w' = 0; pinned:
w = M = 0; free: M = 0 and the transverse force -EI w''' + P w' = 0 - make a 4x4 system whose
determinant vanishes at the natural frequencies.

The roots are found here without the engine's values: the determinant is scanned for sign
changes on a grid even in sqrt(omega) (the frequencies of a uniform span are spaced about evenly
there, so each cell holds at most one), from nearly zero to 1.5 times the engine's highest
frequency, and each bracketed root is refined by the bisection-like Anderson method. The engine
is judged on its own list: a frequency it skipped or gave twice shifts every later one.

Input (stdin): JSON {"cases": [{"id", "length", "ei", "m", "p", "left", "right", "omegas"}]},
where only the largest of "omegas" is used, to set the end of the scan.
Output (stdout): JSON {id: [roots...]}, every root found below the scan's end, ascending, as
strings.
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


# Grid cells in sqrt(omega) up to the scan's end: a uniform span's roots lie about pi apart in
# lambda = L (m omega^2 / EI)^(1/4), some twenty cells apart at this density for the cases checked.
CELLS = 800


def roots(case):
    """Every root of the determinant between nearly zero and 1.5 times the largest engine value."""
    f = lambda x: determinant(case, x)
    top = mp.sqrt(mp.mpf(1.5) * max(mp.mpf(w) for w in case["omegas"]))
    grid = [(top * k / CELLS) ** 2 for k in range(1, CELLS + 1)]
    found = []
    before, f_before = grid[0], f(grid[0])
    for x in grid[1:]:
        f_x = f(x)
        if mp.sign(f_x) != mp.sign(f_before):
            found.append(mp.findroot(f, (before, x), solver="anderson"))
        before, f_before = x, f_x
    return found


def main():
    data = json.load(sys.stdin)
    out = {}
    for case in data["cases"]:
        out[case["id"]] = [mp.nstr(r, 30) for r in roots(case)]
    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main()
