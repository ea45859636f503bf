"""Times a whole `segmask build` of every demo against a reference made of general
geometry libraries doing a small part of the same work, alternating the two.

The reference (gdstk and shapely from PyPI, the readers the test suite checks the GDSII
with) reads the GDSII segmask wrote for the demo and does only four things with the ITO
of the two design structures (FRONT and BACK):
1. offsets every polygon inward by the etch undercut (gdstk.offset, round joins);
2. unions what is left per structure and layer (shapely.union_all);
3. finds the smallest gap between the parts of each union (shapely.STRtree, pairs
   within the rules' minimum gap, then their distance);
4. writes the unions as a new GDSII file (gdstk).
segmask does all of its pipeline: reading the layout, glyphs, assignment, electrodes,
routing, every check, the plan and every output file.

Each round times one `segmask build` (a fresh process, wall time) and then the reference
(in this process, after the imports: Python's start-up is not counted against it), in
turn, so that both see the same state of the machine. The ratio is segmask's median over
the reference's median: below 1, the whole segmask build takes less time than the
reference's four steps.

Usage (the venv is the one the test suite makes; any Python with gdstk and shapely will
do):
    target/tmp/reference-venv/bin/python examples/reference_timing.py \
        target/release/segmask [--rounds 5] [--write docs/performance.md]
With --write the table replaces the text between the markers
`<!-- reference-timing:start -->` and `<!-- reference-timing:end -->` in that file.
"""
import argparse
import json
import pathlib
import statistics
import subprocess
import sys
import tempfile
import time

import gdstk
import shapely
from shapely.geometry import Polygon

ROOT = pathlib.Path(__file__).resolve().parent.parent
START = "<!-- reference-timing:start -->"
END = "<!-- reference-timing:end -->"


def build(segmask, layout, out):
    t = time.perf_counter()
    done = subprocess.run([segmask, "build", str(layout), "--out", str(out)], capture_output=True, text=True)
    elapsed = time.perf_counter() - t
    if done.returncode != 0:
        sys.exit(f"segmask build {layout} failed:\n{done.stderr}")
    return elapsed


def reference(gds, undercut_um, min_gap_um, scratch):
    """The four steps on one GDSII file; returns (seconds, smallest gap found in um)."""
    t = time.perf_counter()
    lib = gdstk.read_gds(str(gds))
    unions = []
    for cell in lib.cells:
        if cell.name not in ("FRONT", "BACK"):
            continue
        by_layer = {}
        for p in cell.polygons:
            by_layer.setdefault(p.layer, []).append(p)
        for layer, polys in sorted(by_layer.items()):
            shrunk = gdstk.offset(polys, -undercut_um, join="round", tolerance=0.01, use_union=False)
            shapes = [Polygon(p.points) for p in shrunk if len(p.points) >= 3]
            unions.append((cell.name, layer, shapely.union_all(shapes)))
    smallest = float("inf")
    for _, _, u in unions:
        parts = list(getattr(u, "geoms", [u]))
        tree = shapely.STRtree(parts)
        left, right = tree.query(parts, predicate="dwithin", distance=min_gap_um)
        for i, j in zip(left, right):
            if i < j:
                smallest = min(smallest, parts[i].distance(parts[j]))
    out = gdstk.Library(unit=1e-6, precision=1e-9)
    for name, layer, u in unions:
        cell = out.new_cell(f"{name}_{layer}")
        for part in getattr(u, "geoms", [u]):
            if part.is_empty:
                continue
            cell.add(gdstk.Polygon(list(part.exterior.coords)[:-1], layer=layer))
    out.write_gds(str(scratch / "reference.gds"))
    return time.perf_counter() - t, smallest


def table(rows, rounds):
    lines = [
        f"| demo | segmask build, median of {rounds} (s) | reference, median of {rounds} (s) | ratio |",
        "|---|---:|---:|---:|",
    ]
    for name, ours, theirs in rows:
        lines.append(f"| {name} | {ours:.3f} | {theirs:.3f} | {ours / theirs:.2f}× |")
    return "\n".join(lines)


def main():
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("segmask")
    ap.add_argument("--rounds", type=int, default=5)
    ap.add_argument("--write", type=pathlib.Path)
    args = ap.parse_args()
    rows = []
    with tempfile.TemporaryDirectory() as tmp:
        tmp = pathlib.Path(tmp)
        for layout in sorted((ROOT / "demo-layouts").glob("*.yaml")):
            name = layout.stem
            out = tmp / name
            build(args.segmask, layout, out)
            gds = next(out.glob("*.gds"), None)
            if gds is None:
                print(f"{name}: no GDSII written (rule errors?), left out", file=sys.stderr)
                continue
            rules = json.loads(next(out.glob("*.report.json")).read_text())["rules"]
            undercut, gap = 1000 * rules["undercut_mm"], 1000 * rules["min_gap_mm"]
            ours, theirs = [], []
            for _ in range(args.rounds):
                ours.append(build(args.segmask, layout, out))
                theirs.append(reference(gds, undercut, gap, tmp)[0])
            rows.append((name, statistics.median(ours), statistics.median(theirs)))
            print(f"{name}: segmask {rows[-1][1]:.3f} s, reference {rows[-1][2]:.3f} s", file=sys.stderr)
    text = table(rows, args.rounds)
    print(text)
    if args.write:
        doc = args.write.read_text()
        if START not in doc or END not in doc:
            sys.exit(f"{args.write}: no {START} … {END} markers")
        head, rest = doc.split(START, 1)
        _, tail = rest.split(END, 1)
        args.write.write_text(f"{head}{START}\n{text}\n{END}{tail}")


if __name__ == "__main__":
    main()
