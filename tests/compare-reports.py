#!/usr/bin/env python3
"""Solves every documented scenario, and variants of each with one field made wrong, with the
solve example, and compares the results with those of an earlier build: the reports must be
the same byte for byte, and the errors the same or better worded. A refactoring is checked so.

    cargo build -p modebench --example solve       # before the change
    python3 tests/compare-reports.py write target/debug/examples/solve build/reports-before
    ...                                            # make the change, build again
    python3 tests/compare-reports.py write target/debug/examples/solve build/reports-after
    python3 tests/compare-reports.py compare build/reports-before build/reports-after

`compare` prints, for the reports that differ, which keys changed and the largest relative
difference of a number, then each error whose wording changed, before and after.
"""
import copy
import glob
import json
import os
import subprocess
import sys

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
# Values put in place of each field in turn: wrong signs, wrong types, wrong units, extremes.
BAD = ["-1", "abc", "3 furlongs", 1e300, -5, 0, "0", "", "1 Hz", [1], {"a": 1}, True, "rigid", 21, 51, 2.5]


def leaves(v, path):
    if isinstance(v, dict):
        for k, x in v.items():
            yield from leaves(x, path + [k])
    elif isinstance(v, list):
        for i, x in enumerate(v):
            yield from leaves(x, path + [i])
    else:
        yield path


def put(doc, path, value):
    here = doc
    for p in path[:-1]:
        here = here[p]
    here[path[-1]] = value


def cases():
    for s in sorted(glob.glob(os.path.join(ROOT, "docs", "scenarios", "*.json"))):
        name = os.path.basename(s)[:-5]
        doc = json.load(open(s))
        yield name, doc
        extra = [["modes"], ["elements"], ["margin"], ["report_point"], ["theory"], ["units"]]
        for path in list(leaves(doc, [])) + extra:
            for i, bad in enumerate(BAD):
                d = copy.deepcopy(doc)
                try:
                    put(d, path, bad)
                except (KeyError, IndexError, TypeError):
                    continue
                yield name + "." + ".".join(map(str, path)) + f".{i}", d
        for key in ["left", "right", "segments", "title"]:
            d = copy.deepcopy(doc)
            d.pop(key, None)
            yield name + ".without." + key, d


def write(solve, out):
    os.makedirs(out, exist_ok=True)
    tmp = os.path.join(out, "case.json")
    count = 0
    for name, d in cases():
        with open(tmp, "w") as f:
            json.dump(d, f)
        r = subprocess.run([solve, tmp, "--full"], capture_output=True, text=True)
        with open(os.path.join(out, name + ".txt"), "w") as f:
            f.write(r.stdout + r.stderr.replace(tmp, "CASE"))
        count += 1
    os.remove(tmp)
    print(count, "cases written to", out)


def compare(before, after):
    worst, keys, messages = 0.0, set(), []

    def walk(x, y, path):
        nonlocal worst
        if isinstance(x, dict) and isinstance(y, dict):
            for k in set(x) | set(y):
                walk(x.get(k), y.get(k), path + [k])
        elif isinstance(x, list) and isinstance(y, list) and len(x) == len(y):
            for p, q in zip(x, y):
                walk(p, q, path)
        elif x != y:
            keys.add(str(path[-1]) if path else "(whole)")
            if isinstance(x, float) and isinstance(y, float) and x != 0:
                worst = max(worst, abs(x - y) / abs(x))

    for f in sorted(os.listdir(before)):
        a = open(os.path.join(before, f)).read()
        b = open(os.path.join(after, f)).read()
        if a == b:
            continue
        try:
            walk(json.loads(a), json.loads(b), [])
        except ValueError:
            messages.append((f, a.strip(), b.strip()))
    print("reports: keys that differ:", sorted(keys) or "none", "; largest relative difference:", worst)
    print("errors worded differently:", len(messages))
    for f, a, b in messages:
        print("---", f, "\n  before:", a, "\n  after: ", b)


if __name__ == "__main__":
    if len(sys.argv) == 4 and sys.argv[1] == "write":
        write(sys.argv[2], sys.argv[3])
    elif len(sys.argv) == 4 and sys.argv[1] == "compare":
        compare(sys.argv[2], sys.argv[3])
    else:
        sys.exit(__doc__)
