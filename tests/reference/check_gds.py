"""Reads a segmask GDSII file with gdstk (an independent GDSII reader from PyPI) and
compares it with the build's report.json.

Checks, each against an outside reference:
- gdstk reads the file (GDSII Stream Format Manual 6.0 as implemented by gdstk);
- library units: 1 um user unit, 1 nm database unit (as segmask documents);
- every layer that holds polygons is in the report's layer map, and every ITO layer
  the report lists holds polygons;
- per plate ITO layer, the polygon count equals the report's `gds_polygons` for it;
- the summed polygon area of both ITO layers equals the summed net areas in the report
  within 1e-6 relative (areas computed by gdstk, independently of segmask; a common's
  area in the report includes its front-plate pad and lead);
- no boundary has a hole-free violation (gdstk polygons are simple rings) and no more
  than 8191 points (the format's XY record limit);
- every net's name stands on its plate's ITO layer once, as a text whose position lies
  on a polygon of that layer (shapely, within 1 nm), so a viewer shows each name on
  the net's own ITO.
The net checks read the design structures FRONT, BACK and CELL; the mask structures
(FRONT_MASK, BACK_MASK) hold the same ITO again, possibly mirrored and compensated, and
are compared with these by check_masks.py.
Prints one line per check; exits 1 on the first failure.
"""
import json
import sys

import gdstk
from shapely.geometry import Point, Polygon


def fail(msg):
    print("FAIL:", msg)
    sys.exit(1)


def main(gds_path, report_path):
    report = json.load(open(report_path))
    lib = gdstk.read_gds(gds_path)
    if abs(lib.unit - 1e-6) > 1e-18 or abs(lib.precision - 1e-9) > 1e-21:
        fail(f"units {lib.unit} {lib.precision}")
    print(f"ok units user={lib.unit} db={lib.precision}")
    polys = {}
    names = sorted(c.name for c in lib.cells)
    if names != ["BACK", "BACK_MASK", "CELL", "FRONT", "FRONT_MASK", "TOP"]:
        fail(f"structures {names}")
    for cell in lib.cells:
        if cell.name.endswith("_MASK"):
            for p in cell.polygons:
                if len(p.points) > 8191:
                    fail(f"boundary with {len(p.points)} points")
            continue
        for p in cell.polygons:
            polys.setdefault((p.layer, p.datatype), []).append(p)
            if len(p.points) > 8191:
                fail(f"boundary with {len(p.points)} points")
    layer_by_num = {(l["gds_layer"], l["gds_datatype"]): l for l in report["layers"]}
    for key in polys:
        if key not in layer_by_num:
            fail(f"layer {key} not in report layer map")
    print(f"ok {len(polys)} layers, all in the layer map")
    total_gds = 0.0
    for plate in ("front", "back"):
        entry = next(l for l in report["layers"] if l["name"] == f"{plate}_ito")
        key = (entry["gds_layer"], entry["gds_datatype"])
        got = polys.get(key, [])
        if not got:
            fail(f"{plate}_ito holds no polygons")
        if "gds_polygons" in entry and entry["gds_polygons"] != len(got):
            fail(f"{plate}_ito: {len(got)} polygons in GDSII, report says {entry['gds_polygons']}")
        # gdstk areas are in user units (um^2); the report's in mm^2.
        total_gds += sum(p.area() for p in got) * 1e-6
        print(f"ok {plate}_ito: {len(got)} polygons")
    rep_area = sum(n["area_mm2"] for n in report["nets"])
    rel = abs(total_gds - rep_area) / max(rep_area, 1e-12)
    if rel > 1e-6:
        fail(f"ITO area {total_gds:.9f} mm2 in GDSII vs report {rep_area:.9f} mm2 (rel {rel:.2e})")
    print(f"ok ITO area {total_gds:.6f} mm2 = report (rel {rel:.1e})")
    check_net_names(lib, report, polys)


def check_net_names(lib, report, polys):
    cells = {c.name: c for c in lib.cells}
    for plate, cell in (("front", "FRONT"), ("back", "BACK")):
        entry = next(l for l in report["layers"] if l["name"] == f"{plate}_ito")
        key = (entry["gds_layer"], entry["gds_datatype"])
        shapes = [Polygon(p.points) for p in polys.get(key, [])]
        texts = [t for t in cells[cell].labels if (t.layer, t.texttype) == key]
        want = sorted(n["name"] for n in report["nets"] if n["plate"] == plate)
        got = sorted(t.text for t in texts)
        if got != want:
            fail(f"{plate}_ito names {got}, report's nets on that plate {want}")
        for t in texts:
            at = Point(t.origin)
            if not any(s.distance(at) <= 1e-3 for s in shapes):
                fail(f"name {t.text} at {t.origin} lies on no {plate}_ito polygon")
        print(f"ok {len(texts)} net names on {plate}_ito polygons")


if __name__ == "__main__":
    main(sys.argv[1], sys.argv[2])
