"""Reads a build's mask files with independent readers from PyPI and compares them.

Usage: check_masks.py OUT_DIR NAME

Checks, each against an outside reference:
- Gerber (Ucamco Gerber Layer Format Specification 2022.02, read by gerbonara): each
  plate's file is in mm with format 4.6, carries .FileFunction, .FilePolarity and
  .GenerationSoftware, and its dark area (dark regions united, clear regions cut out, in
  file order, by shapely) equals the ITO area of the plate's GDSII mask structure (read by
  gdstk) within 0.1 %; on a dark-field file (negative resist) the dark area is the field
  minus that ITO, and the field covers the glass with margin.
- GDSII (read by gdstk): each mask structure holds only the plate's ITO layer and its
  glass layer; its ITO is the design structure's ITO and marks, mirrored about the glass
  centre where the mask order says so (centroids compared), with the same area where no
  compensation is applied and a larger one where it is.
- Panels (when NAME.panel.gds exists): each plate's panel structure (gdstk, flattened)
  holds the cell's mask ITO once per cell reference plus the panel's own marks; the
  panel Gerber's dark area (gerbonara) equals that ITO (or the field minus it) within
  0.1 %; panel.pdf pages equal the panel SVG films in size and path points; the cut-line
  DXF (read by ezdxf) is in millimetres ($INSUNITS 4), each cut line spans the
  substrate, and the cut lines of each plate lie exactly on the edges of that plate's
  cell glass outlines in the panel GDSII (mirrored about the substrate centre where the
  DXF and the GDSII differ in mirroring: the DXF always as the films).
- PDF (ISO 32000-1, read by pypdf): films.pdf has one page per plate, each MediaBox equal
  to the SVG film's size within 0.01 mm, and the path points of each page equal the SVG
  film's path points in order within 0.001 mm; sheet.pdf pages are A4 or Letter or
  larger.
Prints one line per check; exits 1 on the first failure.
"""
import json
import re
import sys

import os

import ezdxf
import gdstk
import pypdf
import shapely
import shapely.affinity
from gerbonara import GerberFile
from shapely.geometry import Polygon

PT_PER_MM = 72 / 25.4


def fail(msg):
    print("FAIL:", msg)
    sys.exit(1)


def union_of(polys):
    return shapely.unary_union([Polygon(p).buffer(0) for p in polys if len(p) >= 3])


def gds_layer_polys(cell, key, scale=1e-3):
    # gdstk gives user units (um); * 1e-3 gives mm.
    return [p.points * scale for p in cell.polygons if (p.layer, p.datatype) == key]


def gerber_dark(path):
    g = GerberFile.open(path)
    if g.import_settings.number_format != (4, 6):
        fail(f"{path}: number format {g.import_settings.number_format}")
    dark = shapely.Polygon()
    # Objects in file order; clear polarity removes what earlier objects darkened
    # (Gerber specification 2022.02, polarity).
    for o in g.objects:
        if type(o).__name__ != "Region":
            fail(f"{path}: unexpected object {type(o).__name__}")
        if str(o.unit) not in ("mm", "MM") and getattr(o.unit, "shorthand", "mm") != "mm":
            fail(f"{path}: unit {o.unit}")
        poly = Polygon([(x, y) for x, y in o.outline]).buffer(0)
        dark = dark.union(poly) if o.polarity_dark else dark.difference(poly)
    return g, dark


def svg_points(svg_text):
    pts = []
    for d in re.findall(r' d="([^"]*)"', svg_text):
        nums = [float(v) for v in re.findall(r"-?\d+(?:\.\d+)?", d)]
        pts.extend(zip(nums[0::2], nums[1::2]))
    return pts


def pdf_points(page, height_mm):
    pts = []
    ops = pypdf.generic.ContentStream(page.get_contents(), page.pdf).operations
    for operands, op in ops:
        if op in (b"m", b"l"):
            x, y = float(operands[0]), float(operands[1])
            pts.append((x / PT_PER_MM, height_mm - y / PT_PER_MM))
    return pts


def main(out, name):
    report = json.load(open(f"{out}/{name}.report.json"))
    order = json.load(open(f"{out}/{name}.masks.json"))
    lib = gdstk.read_gds(f"{out}/{name}.gds")
    cells = {c.name: c for c in lib.cells}
    layer = {l["name"]: (l["gds_layer"], l["gds_datatype"]) for l in report["layers"]}
    negative = report["resist"] == "negative"
    for plate in order["plates"]:
        pname = plate["plate"]
        key = (plate["gds_layer"], plate["gds_datatype"])
        glass_key = tuple(plate["glass_layer"])
        if key != layer[f"{pname}_ito"]:
            fail(f"{pname}: mask layer {key} is not {pname}_ito {layer[pname + '_ito']}")
        mask = cells[plate["gdsii_structure"]]
        held = {(p.layer, p.datatype) for p in mask.polygons}
        if held != {key, glass_key}:
            fail(f"{pname}: mask structure holds layers {held}, want only {key} and {glass_key}")
        ito = union_of(gds_layer_polys(mask, key))
        design_cell = cells["FRONT" if pname == "front" else "BACK"]
        design = union_of(gds_layer_polys(design_cell, layer[f"{pname}_ito"]) + gds_layer_polys(design_cell, layer[f"{pname}_marks"]))
        gx0, gy0, gx1, gy1 = union_of(gds_layer_polys(design_cell, layer[f"{pname}_glass"])).bounds
        cx = ito.centroid.x
        want_cx = (gx0 + gx1) - design.centroid.x if plate["mirrored"] else design.centroid.x
        if abs(cx - want_cx) > 0.05:
            fail(f"{pname}: mask centroid x {cx:.4f}, want {want_cx:.4f} (mirrored={plate['mirrored']})")
        if plate["compensated"]:
            if not ito.area > design.area:
                fail(f"{pname}: compensated mask area {ito.area:.6f} not above drawn {design.area:.6f}")
        elif abs(ito.area - design.area) > 1e-6 * design.area:
            fail(f"{pname}: mask area {ito.area:.6f} != drawn {design.area:.6f}")
        print(f"ok {pname} GDSII {plate['gdsii_structure']}: {ito.area:.4f} mm2 ITO, mirrored={plate['mirrored']}, compensated={plate['compensated']}")

        gbr = f"{out}/{plate['gerber_file']}"
        text = open(gbr).read()
        for need in ("%MOMM*%", "%FSLAX46Y46*%", "%TF.FileFunction,", "%TF.GenerationSoftware,segmask", "%TF.CreationDate,"):
            if need not in text:
                fail(f"{gbr}: no {need}")
        want_pol = "Negative" if negative else "Positive"
        if f"%TF.FilePolarity,{want_pol}*%" not in text or not text.rstrip().endswith("M02*"):
            fail(f"{gbr}: polarity attribute or M02 missing")
        check_gerber_area(gbr, ito, negative, (gx0, gy0, gx1, gy1), f"{pname} Gerber")

    check_pdf(f"{out}/{name}.films.pdf", [f"{out}/{name}.{p}.svg" for p in ("front", "back")])
    if os.path.exists(f"{out}/{name}.panel.gds"):
        check_panel(out, name, order, report, layer, negative)
    sheet = pypdf.PdfReader(f"{out}/{name}.sheet.pdf")
    for i, page in enumerate(sheet.pages):
        pw, ph = float(page.mediabox.width) / PT_PER_MM, float(page.mediabox.height) / PT_PER_MM
        if not (pw >= 209.99 and ph >= 279.39):
            fail(f"sheet.pdf page {i + 1}: {pw:.2f} x {ph:.2f} mm is smaller than A4/Letter")
    print(f"ok sheet.pdf: {len(sheet.pages)} page(s)")


def check_gerber_area(gbr, ito, negative, glass, what):
    """The Gerber file's dark area equals the ITO (positive) or the dark field minus the
    ITO (negative; the field, the first region, must reach 2.9 mm past the glass box)."""
    _, dark = gerber_dark(gbr)
    if negative:
        field = Polygon(GerberFile.open(gbr).objects[0].outline)
        fx0, fy0, fx1, fy1 = field.bounds
        gx0, gy0, gx1, gy1 = glass
        if not (fx0 <= gx0 - 2.9 and fy0 <= gy0 - 2.9 and fx1 >= gx1 + 2.9 and fy1 >= gy1 + 2.9):
            fail(f"{gbr}: dark field {field.bounds} does not reach past the glass {glass}")
        want = field.area - ito.area
    else:
        want = ito.area
    rel = abs(dark.area - want) / want
    if rel > 1e-3:
        fail(f"{gbr}: dark area {dark.area:.6f} mm2, want {want:.6f} (rel {rel:.2e})")
    print(f"ok {what}: dark {dark.area:.4f} mm2 = {'field - ' if negative else ''}ITO (rel {rel:.1e})")


def check_panel(out, name, order, report, layer, negative):
    lib = gdstk.read_gds(f"{out}/{name}.panel.gds")
    cells = {c.name: c for c in lib.cells}
    dxf = ezdxf.readfile(f"{out}/{name}.panel.cuts.dxf")
    # $INSUNITS 4 = millimetres (DXF header variables; ezdxf.units).
    if dxf.header.get("$INSUNITS") != 4:
        fail(f"panel.cuts.dxf: $INSUNITS {dxf.header.get('$INSUNITS')}, want 4 (mm)")
    lines = list(dxf.modelspace().query("LINE"))
    # The mask order names the panel's structures and every cell's place.
    po = order.get("panel")
    if not po or po["gdsii_structures"] != ["FRONT_PANEL", "BACK_PANEL"] or po["cut_lines_dxf"] != f"{name}.panel.cuts.dxf":
        fail(f"masks.json: panel entry {po}")
    flat_ito = {}
    for plate in order["plates"]:
        pname = plate["plate"]
        key = (plate["gds_layer"], plate["gds_datatype"])
        glass_key = tuple(plate["glass_layer"])
        panel = cells[f"{pname.upper()}_PANEL"]
        refs = list(panel.references)
        if len(refs) != po["rows"] * po["columns"] or len(po["cell_origins_mm"]) != len(refs) or any(r.cell.name != plate["gdsii_structure"] for r in refs):
            fail(f"{pname} panel: references {[r.cell.name for r in refs]}, want {plate['gdsii_structure']}")
        marks = union_of(gds_layer_polys(panel, key))
        cell_ito = union_of(gds_layer_polys(cells[plate["gdsii_structure"]], key))
        substrate = union_of(gds_layer_polys(panel, glass_key))
        sx0, sy0, sx1, sy1 = substrate.bounds
        flat = panel.copy(f"{pname}_FLAT").flatten()
        ito = union_of(gds_layer_polys(flat, key))
        want = len(refs) * cell_ito.area + marks.area
        if abs(ito.area - want) > 1e-6 * want or marks.area <= 0:
            fail(f"{pname} panel: ITO {ito.area:.6f} mm2, want {len(refs)} cells x {cell_ito.area:.6f} + marks {marks.area:.6f}")
        print(f"ok {pname} panel GDSII: {len(refs)} cells, {ito.area:.4f} mm2 ITO = cells + marks")
        flat_ito[pname] = (ito, cell_ito, plate, (sx0 + sx1) / 2, len(refs))
        gbr = f"{out}/{name}.panel.{pname}.gbr"
        check_gerber_area(gbr, ito, negative, (sx0, sy0, sx1, sy1), f"{pname} panel Gerber")
        # Cut lines against the cell glass edges of the panel GDSII.
        glass_polys = [p for p in gds_layer_polys(flat, glass_key)]
        edges_x, edges_y = set(), set()
        for pts in glass_polys:
            b = Polygon(pts).bounds
            if abs((b[2] - b[0]) - (sx1 - sx0)) < 1e-6 and abs((b[3] - b[1]) - (sy1 - sy0)) < 1e-6:
                continue  # the substrate itself
            edges_x.update((round(b[0], 5), round(b[2], 5)))
            edges_y.update((round(b[1], 5), round(b[3], 5)))
        # The DXF draws every plate as its film (back mirrored); the GDSII as the order says.
        dxf_mirrored = pname == "back"
        flip = dxf_mirrored != plate["mirrored"]
        xs, ys = set(), set()
        for ln in (l for l in lines if l.dxf.layer == f"{pname.upper()}_CUTS"):
            (ax, ay), (bx, by) = (ln.dxf.start.x, ln.dxf.start.y), (ln.dxf.end.x, ln.dxf.end.y)
            if abs(ax - bx) < 1e-9:
                if abs(min(ay, by) - sy0) > 1e-6 or abs(max(ay, by) - sy1) > 1e-6:
                    fail(f"{pname} cut x={ax} does not span the substrate")
                xs.add(round(sx0 + sx1 - ax if flip else ax, 5))
            else:
                if abs(min(ax, bx) - sx0) > 1e-6 or abs(max(ax, bx) - sx1) > 1e-6:
                    fail(f"{pname} cut y={ay} does not span the substrate")
                ys.add(round(ay, 5))
        if xs != edges_x or ys != edges_y:
            fail(f"{pname} cuts x {sorted(xs)} y {sorted(ys)} != glass edges x {sorted(edges_x)} y {sorted(edges_y)}")
        print(f"ok {pname} panel.cuts.dxf: {len(xs)} + {len(ys)} cut lines on the cell glass edges, mm")
    # Register: with the back plate turned back to the viewer's frame (about the
    # substrate centre for the panel, the glass centre for the cell), front and back ITO
    # of the panel overlap exactly as much as one cell's, once per cell; a cell placed
    # at the wrong mirrored position would change this.
    (f_ito, f_cell, _, _, n), (b_ito, b_cell, b_plate, s_cx, _) = flat_ito["front"], flat_ito["back"]
    if b_plate["mirrored"]:
        gx0, _, gx1, _ = union_of(gds_layer_polys(cells[b_plate["gdsii_structure"]], tuple(b_plate["glass_layer"]))).bounds
        b_cell = shapely.affinity.scale(b_cell, xfact=-1, yfact=1, origin=((gx0 + gx1) / 2, 0))
        b_ito = shapely.affinity.scale(b_ito, xfact=-1, yfact=1, origin=(s_cx, 0))
    one = f_cell.intersection(b_cell).area
    whole = f_ito.intersection(b_ito).area
    if one <= 0 or abs(whole - n * one) > 1e-6 * n * one:
        fail(f"panel: front/back ITO overlap {whole:.6f} mm2, want {n} x {one:.6f} (cells out of register)")
    print(f"ok panel register: front/back overlap {whole:.4f} mm2 = {n} x one cell's")
    check_pdf(f"{out}/{name}.panel.pdf", [f"{out}/{name}.panel.{p}.svg" for p in ("front", "back")])


def check_pdf(path, svgs):
    pdf = pypdf.PdfReader(path)
    if len(pdf.pages) != len(svgs):
        fail(f"{path} has {len(pdf.pages)} pages")
    for page, svg_path in zip(pdf.pages, svgs):
        pname = svg_path
        svg = open(svg_path).read()
        w = float(re.search(r'width="([\d.]+)mm"', svg).group(1))
        h = float(re.search(r'height="([\d.]+)mm"', svg).group(1))
        box = page.mediabox
        pw, ph = float(box.width) / PT_PER_MM, float(box.height) / PT_PER_MM
        if abs(pw - w) > 0.01 or abs(ph - h) > 0.01:
            fail(f"{path} {pname}: page {pw:.4f} x {ph:.4f} mm, film {w} x {h} mm")
        a, b = svg_points(svg), pdf_points(page, ph)
        if len(a) != len(b):
            fail(f"{path} {pname}: {len(b)} path points, SVG film has {len(a)}")
        worst = max((max(abs(p[0] - q[0]), abs(p[1] - q[1])) for p, q in zip(a, b)), default=0.0)
        if worst > 1e-3:
            fail(f"{path} {pname}: a path point differs from the SVG film by {worst:.6f} mm")
        print(f"ok {path} page of {pname}: {pw:.3f} x {ph:.3f} mm, {len(b)} points = SVG (worst {worst:.1e} mm)")


if __name__ == "__main__":
    main(sys.argv[1], sys.argv[2])
