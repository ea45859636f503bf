#!/usr/bin/env python3
"""The position sweep of tests/cli/position_sweep.rs, by hand, for a layout too slow to sweep
in the test suite: every point key (origin, at, from, to, centre) moved in 0.5 mm steps,
-6 to +6 mm along x, then along y (49 positions), each checked with `segmask check` on two
threads. Prints every position that is neither clean nor refused as bad input, then the
counts and the median and longest check time.

Usage: python3 examples/position_sweep.py LAYOUT.yaml target/release/segmask
"""
import collections
import os
import re
import subprocess
import sys
import tempfile
import time
from concurrent.futures import ThreadPoolExecutor
src, binary = sys.argv[1], sys.argv[2]
text = open(src).read()
def shift(dx, dy):
    def pt(m):
        return f"{m.group(1)}[{float(m.group(2))+dx:.3f}, {float(m.group(3))+dy:.3f}]"
    return re.sub(r"((?<![A-Za-z0-9_])(?:origin|at|from|to|centre):\s*)\[\s*([-\d.]+)\s*,\s*([-\d.]+)\s*\]", pt, text)
def run(d):
    dx, dy = d
    fd, p = tempfile.mkstemp(suffix=".yaml"); os.write(fd, shift(dx, dy).encode()); os.close(fd)
    t = time.time()
    r = subprocess.run([binary, "check", p], capture_output=True, text=True)
    dt = time.time() - t
    os.unlink(p)
    out = r.stdout + r.stderr
    m = re.search(r"(\d+) error\(s\), (\d+) warning", out)
    if m: res = f"{m.group(1)}e/{m.group(2)}w"
    elif r.returncode == 2 and ": error in `" in out: res = "refused"
    else: res = "other"
    bad = [l for l in out.splitlines() if "error[" in l or "warning[" in l][:3]
    return d, res, dt, bad
pts = [(k*0.5, 0.0) for k in range(-12, 13)] + [(0.0, k*0.5) for k in range(-12, 13) if k != 0]
c = collections.Counter(); times = []
with ThreadPoolExecutor(2) as ex:
    for d, res, dt, bad in ex.map(run, pts):
        c[res] += 1; times.append(dt)
        if res not in ("0e/0w", "refused"):
            print(d, res, [b[:200] for b in bad], flush=True)
times.sort()
print(c, "median %.2f s, max %.2f s" % (times[len(times)//2], times[-1]))
