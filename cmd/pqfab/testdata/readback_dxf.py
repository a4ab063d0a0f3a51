"""Read pqfab's DXF files back with ezdxf (a general-purpose DXF library
from Debian's python3-ezdxf) and compare them with report.json.

Usage: readback_dxf.py OUTPUT_FOLDER
Prints one line per file and 'ok'; exits non-zero on the first mismatch.
"""
import glob
import json
import os
import sys

import ezdxf
from shapely.geometry import LineString, Point, Polygon
from shapely.ops import unary_union

TOL = 0.01  # mm: report.json and the DXF both round to 0.01 mm or finer


def fail(msg):
    print("FAIL:", msg)
    sys.exit(1)


def load(path):
    doc = ezdxf.readfile(path)
    auditor = doc.audit()
    if auditor.has_errors:
        fail("%s: audit found %d errors: %s" % (path, len(auditor.errors), auditor.errors[:3]))
    return doc


def main(out):
    with open(os.path.join(out, "report.json")) as f:
        rep = json.load(f)
    files = sorted(glob.glob(os.path.join(out, "sheets", "sheet-*.dxf")))
    if len(files) != len(rep["sheets"]):
        fail("%d sheet files for %d sheets" % (len(files), len(rep["sheets"])))
    seen = {}
    for path, sheet in zip(files, rep["sheets"]):
        doc = load(path)
        msp = doc.modelspace()
        cuts = msp.query('LWPOLYLINE[layer=="PQ-CUT"]')
        labels = msp.query('TEXT[layer=="PQ-PART-TEXT"]')
        if msp.query('TEXT[layer=="PQ-ENGRAVE"]') or msp.query('MTEXT[layer=="PQ-ENGRAVE"]'):
            fail("%s: text on the engraving layer: engraving is in single strokes" % path)
        strokes = list(msp.query('LWPOLYLINE[layer=="PQ-ENGRAVE"]'))
        if any(e.closed for e in strokes) or (sheet["placements"] and not strokes):
            fail("%s: engraving strokes missing or closed" % path)
        # Every engraving stroke lies on a part (shapely, Debian's
        # python3-shapely).
        parts = unary_union([Polygon(p["outline_mm"]) for p in sheet["placements"]])
        for e in strokes:
            pts = [p[:2] for p in e.get_points("xy")]
            if not parts.contains(LineString(pts) if len(pts) > 1 else Point(pts[0])):
                fail("%s: an engraving stroke leaves the parts at %s" % (path, pts[0]))
        edge = msp.query('LWPOLYLINE[layer=="PQ-SHEET-EDGE"]')
        if len(cuts) != len(sheet["placements"]):
            fail("%s: %d cut outlines for %d placements" % (path, len(cuts), len(sheet["placements"])))
        if len(labels) != 2 * len(sheet["placements"]):
            fail("%s: %d labels for %d placements" % (path, len(labels), len(sheet["placements"])))
        if len(edge) != 1:
            fail("%s: %d sheet outlines" % (path, len(edge)))
        xs = [p[0] for p in edge[0].get_points("xy")]
        ys = [p[1] for p in edge[0].get_points("xy")]
        if abs(max(xs) - sheet["width_mm"]) > TOL or abs(max(ys) - sheet["height_mm"]) > TOL:
            fail("%s: sheet outline %g x %g" % (path, max(xs), max(ys)))
        if doc.header.get("$INSUNITS") != 4:
            fail("%s: units are not millimetres" % path)
        texts = {t.dxf.text for t in labels}
        for cut, pl in zip(cuts, sheet["placements"]):
            pts = [tuple(p) for p in cut.get_points("xy")]
            if not cut.closed or len(pts) != len(pl["outline_mm"]):
                fail("%s: panel %s outline has %d corners, want %d" % (path, pl["panel"], len(pts), len(pl["outline_mm"])))
            for (x, y), (wx, wy) in zip(pts, pl["outline_mm"]):
                if abs(x - wx) > TOL or abs(y - wy) > TOL:
                    fail("%s: panel %s corner (%g, %g) != report (%g, %g)" % (path, pl["panel"], x, y, wx, wy))
                if x < -TOL or y < -TOL or x > sheet["width_mm"] + TOL or y > sheet["height_mm"] + TOL:
                    fail("%s: panel %s corner off the sheet" % (path, pl["panel"]))
            if pl["panel"] not in texts:
                fail("%s: no label %s" % (path, pl["panel"]))
            seen[pl["panel"]] = seen.get(pl["panel"], 0) + 1
        print(path, "ok", len(cuts), "parts")
    for u in rep["unplaced"]:
        seen[u["panel"]] = seen.get(u["panel"], 0) + 1
    for p in rep["panels"]:
        if seen.get(p["label"]) != 1:
            fail("panel %s is on %s sheets/unplaced lists" % (p["label"], seen.get(p["label"])))

    path = os.path.join(out, "assembly-plan.dxf")
    doc = load(path)
    msp = doc.modelspace()
    want = {
        'LINE[layer=="PQ-PLAN-MEMBER"]': len(rep["members"]),
        'LINE[layer=="PQ-3D-MEMBER"]': len(rep["members"]),
        'LWPOLYLINE[layer=="PQ-PLAN-MEMBER-TOP"]': len(rep["members"]),
        'LWPOLYLINE[layer=="PQ-PLAN-PANEL"]': len(rep["panels"]),
        'TEXT[layer=="PQ-NODE-LABEL"]': len(rep["nodes"]),
        'TEXT[layer=="PQ-MEMBER-LABEL"]': len(rep["members"]),
        'TEXT[layer=="PQ-PANEL-LABEL"]': len(rep["panels"]),
    }
    for q, n in want.items():
        got = len(msp.query(q))
        if got != n:
            fail("%s: %s: %d entities, want %d" % (path, q, got, n))
    pos = {n["label"]: n["position_mm"] for n in rep["nodes"]}
    for line, m in zip(msp.query('LINE[layer=="PQ-3D-MEMBER"]'), rep["members"]):
        a, b = pos[m["node_a"]], pos[m["node_b"]]
        for got, w in ((line.dxf.start, a), (line.dxf.end, b)):
            if max(abs(got[i] - w[i]) for i in range(3)) > TOL:
                fail("%s: member %s end %s != %s" % (path, m["label"], tuple(got), w))
    labels = {t.dxf.text for t in msp.query('TEXT[layer=="PQ-NODE-LABEL"]')}
    if labels != set(pos):
        fail("%s: node labels differ from the report" % path)
    print(path, "ok")
    print("ok")


if __name__ == "__main__":
    main(sys.argv[1])
