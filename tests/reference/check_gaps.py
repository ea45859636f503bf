"""Confirms with shapely (GEOS) that no two nets on a plate come closer than the minimum
gap, reading the polygons back from the GDSII file with gdstk.

Polygons of one plate's ITO layer are united (shapely.unary_union) so pieces of one net
merge; every pair of the resulting connected parts must then be at least
`rules.min_gap_mm` apart (GEOS distance), with 2 nm of slack for the 1 nm database grid.
A spatial index (shapely.STRtree) finds the candidate pairs.
"""
import json
import sys

import gdstk
import shapely
from shapely.geometry import Polygon


def main(gds_path, report_path):
    report = json.load(open(report_path))
    min_gap = report["rules"]["min_gap_mm"]
    lib = gdstk.read_gds(gds_path)
    worst = None
    for plate in ("front", "back"):
        entry = next(l for l in report["layers"] if l["name"] == f"{plate}_ito")
        key = (entry["gds_layer"], entry["gds_datatype"])
        # The design structures only: the mask structures repeat the ITO (check_masks.py).
        rings = [p.points * 1e-3 for c in lib.cells if c.name in ("FRONT", "BACK") for p in c.polygons if (p.layer, p.datatype) == key]
        merged = shapely.unary_union([Polygon(r).buffer(0) for r in rings])
        parts = list(getattr(merged, "geoms", [merged]))
        # Each net is one connected piece of ITO; fewer pieces than nets means a short,
        # more means an open (a front-plate common is its transfer pad, lead and pad). A
        # common that comes out on two pins is two pieces on each plate, each with its own
        # transfer dot and pin (the two halves of a common split between two rows of
        # digits, joined on the board the glass plugs into).
        commons = sum(len(n["pins"]) for n in report["nets"] if n["kind"] == "common")
        others = sum(1 for n in report["nets"] if n["plate"] == plate and n["kind"] != "common")
        expected = others + commons
        if len(parts) != expected:
            print(f"FAIL: {plate} ITO has {len(parts)} connected parts, expected one per net: {expected}")
            sys.exit(1)
        tree = shapely.STRtree(parts)
        for i, a in enumerate(parts):
            for j in tree.query(a.buffer(min_gap)):
                if j <= i:
                    continue
                d = a.distance(parts[j])
                if worst is None or d < worst[0]:
                    worst = (d, plate)
                if d < min_gap - 2e-6:
                    print(f"FAIL: {plate} parts {i} and {j} are {d:.6f} mm apart < {min_gap} mm")
                    sys.exit(1)
        print(f"ok {plate}: {len(parts)} separate nets, none closer than {min_gap} mm")
    if worst:
        print(f"closest pair: {worst[0]:.6f} mm on the {worst[1]} plate")


if __name__ == "__main__":
    main(sys.argv[1], sys.argv[2])
