"""Replay the glass cutting sequence of every cut sheet with shapely (a
general-purpose geometry library from Debian's python3-shapely), written
independently of pqfab's nesting code.

For each sheets/*.dxf (read with Debian's python3-ezdxf) whose stock cuts
edge to edge: start from the sheet; take the cuts in their numbered order
(circled numbers on layer PQ-CUT-NUMBER, the cut lines on PQ-CUT-ORDER,
drawn only where they leave the parts' outlines: each cut's drawn spans
and the part outline edges along it must cover it, and no drawn span may
run along a part's outline edge); each cut must split a piece that exists and has not
been split before (nothing is cut twice) into exactly two pieces, running
from edge to edge of it (both ends on its boundary), and must not enter a
part. At the end every part (layer PQ-CUT) must lie inside one final
piece, alone (every part released whole). The cuts must also be the ones
report.json lists, with the same pieces, and the rows of the schedule's
Cuts sheet (read with Debian's python3-openpyxl).

Usage: replay_cuts.py OUTPUT_FOLDER
"""
import glob
import json
import os
import sys

import ezdxf
import openpyxl
from shapely.geometry import LineString, Polygon
from shapely.ops import split, unary_union

TOL = 1e-3  # mm
# Part outlines are written to 0.01 mm and a cut may run along a part's
# edge (glass is scored on the edge): a part's inside is taken 0.02 mm in.
PART_TOL = 0.02  # mm
# A cut may take off a thin piece (pqfab skips only cuts that would take
# off 0.01 mm or less): a half counts when its area is above this (mm²).
SLIVER_AREA = 1e-5


def fail(msg):
    print("FAIL:", msg)
    sys.exit(1)


def along(span, edge):
    """Length over which edge runs along span: 0 unless both ends of edge
    lie within PART_TOL of span's line."""
    (ax, ay), (bx, by) = span.coords
    n = span.length
    ux, uy = (bx - ax) / n, (by - ay) / n
    ts = []
    for x, y in edge.coords:
        if abs(-(x - ax) * uy + (y - ay) * ux) > PART_TOL:
            return 0.0
        ts.append((x - ax) * ux + (y - ay) * uy)
    return max(0.0, min(n, max(ts)) - max(0.0, min(ts)))


def doc_layers(path):
    return ezdxf.readfile(path).layers


def main(out):
    with open(os.path.join(out, "report.json")) as f:
        rep = json.load(f)
    files = sorted(glob.glob(os.path.join(out, "sheets", "sheet-*.dxf")))
    checked = 0
    ws = openpyxl.load_workbook(os.path.join(out, "schedule.xlsx"), read_only=True)["Cuts"]
    rows = [r for r in ws.iter_rows(min_row=2, values_only=True)]
    want = [(s["name"], i + 1, c["piece"], 2 * i + 1, 2 * i + 2) + tuple(c["from_mm"]) + tuple(c["to_mm"])
            for s in rep["sheets"] for i, c in enumerate(s.get("cuts") or [])]
    if [tuple(r[:9]) for r in rows] != want:
        fail("schedule Cuts rows differ from report.json's cuts (%d rows, %d cuts)" % (len(rows), len(want)))
    for r in rows:
        if abs(r[9] - ((r[7] - r[5]) ** 2 + (r[8] - r[6]) ** 2) ** 0.5) > 0.01:
            fail("schedule Cuts: sheet %s cut %d: length %s" % (r[0], r[1], r[9]))
    for path, sheet in zip(files, rep["sheets"]):
        msp = ezdxf.readfile(path).modelspace()
        spans = [LineString([(ln.dxf.start.x, ln.dxf.start.y), (ln.dxf.end.x, ln.dxf.end.y)]) for ln in msp.query('LINE[layer=="PQ-CUT-ORDER"]')]
        if not sheet.get("cuts"):
            if spans:
                fail("%s: cut lines on a sheet without cuts" % path)
            continue
        if msp.query('TEXT[layer=="PQ-CUT-ORDER"]'):
            fail("%s: cut numbers on the cut line layer" % path)
        numbers = [t.dxf.text for t in msp.query('TEXT[layer=="PQ-CUT-NUMBER"]')]
        if numbers != [str(i + 1) for i in range(len(sheet["cuts"]))]:
            fail("%s: cuts are not numbered 1 to %d in order" % (path, len(sheet["cuts"])))
        if len(msp.query('CIRCLE[layer=="PQ-CUT-NUMBER"]')) != len(numbers):
            fail("%s: cut numbers are not circled" % path)
        layers = {l.dxf.name: l.dxf.color for l in doc_layers(path)}
        marks = [t.dxf.height for t in msp.query('TEXT[layer=="PQ-PART-MARK"]')]
        nums = [t.dxf.height for t in msp.query('TEXT[layer=="PQ-CUT-NUMBER"]')]
        if layers["PQ-CUT-NUMBER"] in (layers["PQ-PART-MARK"], layers["PQ-CUT"]) or (marks and min(nums) <= max(marks)):
            fail("%s: cut numbers look like the edge numbers (colour %s, heights %s..%s vs %s)" % (path, layers["PQ-CUT-NUMBER"], min(nums), max(nums), max(marks)))
        edge = msp.query('LWPOLYLINE[layer=="PQ-SHEET-EDGE"]')[0]
        pieces = {0: Polygon([p[:2] for p in edge.get_points("xy")])}
        parts = [Polygon([p[:2] for p in e.get_points("xy")]) for e in msp.query('LWPOLYLINE[layer=="PQ-CUT"]')]
        inner = [p.buffer(-PART_TOL) for p in parts]
        outline = unary_union([p.exterior for p in parts])
        edges = [LineString([q.exterior.coords[j], q.exterior.coords[j + 1]]) for q in parts for j in range(len(q.exterior.coords) - 1)]
        for sp in spans:
            for e in edges:
                # An outline edge along the span: both its ends on the
                # span's line, overlapping it.
                if along(sp, e) > 10 * PART_TOL:
                    fail("%s: a cut line is drawn %.3f mm along a part's outline" % (path, along(sp, e)))
        for i, c in enumerate(sheet["cuts"]):
            a, b = tuple(c["from_mm"]), tuple(c["to_mm"])
            seg = LineString([a, b])
            near = seg.buffer(PART_TOL)
            cover = unary_union([s for s in spans if near.contains(s)] + [outline.intersection(near)])
            if seg.difference(cover.buffer(PART_TOL)).length > 10 * PART_TOL:
                fail("%s: cut %d is drawn on %.2f of %.2f mm" % (path, i + 1, seg.length - seg.difference(cover.buffer(PART_TOL)).length, seg.length))
            k = c["piece"]
            if k not in pieces:
                fail("%s: cut %d splits piece %d, which does not exist or was cut before" % (path, i + 1, k))
            piece = pieces.pop(k)
            seg = LineString([a, b])
            if piece.exterior.distance(LineString([a, a])) > TOL or piece.exterior.distance(LineString([b, b])) > TOL:
                fail("%s: cut %d does not run from edge to edge of piece %d" % (path, i + 1, k))
            for j, p in enumerate(inner):
                if seg.intersects(p):
                    fail("%s: cut %d crosses part %d" % (path, i + 1, j + 1))
            # Extend the cut a little past the piece so that it splits it
            # cleanly despite rounding of its ends.
            dx, dy = b[0] - a[0], b[1] - a[1]
            n = (dx * dx + dy * dy) ** 0.5
            ext = LineString([(a[0] - dx / n * 0.01, a[1] - dy / n * 0.01), (b[0] + dx / n * 0.01, b[1] + dy / n * 0.01)])
            halves = [g for g in split(piece, ext).geoms if g.area > SLIVER_AREA]
            if len(halves) != 2:
                fail("%s: cut %d splits piece %d into %d pieces" % (path, i + 1, k, len(halves)))
            left = [h for h in halves if (dx * (h.representative_point().y - a[1]) - dy * (h.representative_point().x - a[0])) > 0]
            right = [h for h in halves if h not in left]
            if len(left) != 1 or len(right) != 1:
                fail("%s: cut %d: cannot tell its sides" % (path, i + 1))
            pieces[2 * i + 1], pieces[2 * i + 2] = left[0], right[0]
        for j, p in enumerate(parts):
            homes = [k for k, q in pieces.items() if q.buffer(PART_TOL).contains(p)]
            if len(homes) != 1:
                fail("%s: part %d lies in %d final pieces" % (path, j + 1, len(homes)))
            others = [m for m, o in enumerate(parts) if m != j and pieces[homes[0]].buffer(PART_TOL).contains(o)]
            if others:
                fail("%s: parts %d and %d come free together" % (path, j + 1, others[0] + 1))
        checked += 1
    if checked == 0:
        fail("no sheet with cuts")
    print("%d sheets replayed" % checked)
    print("ok")


if __name__ == "__main__":
    main(sys.argv[1])
