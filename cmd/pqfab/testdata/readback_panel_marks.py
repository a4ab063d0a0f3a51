"""Read back what a glazier and a board workshop act on, with general-purpose
readers, and check it against report.json, recomputed independently:

- site/tags.pdf (words and their boxes from poppler's pdftotext -bbox):
  every panel tag's "pane diagonals i-j D" equal the distances between
  the corners of the panel's cut outline in report.json (recomputed here),
  its "set-out diag." the set-out diagonals (node to node); where the
  edges are inset the two differ; its signed bevels equal report.json's.
- schedule.xlsx (Debian's python3-openpyxl): the Panels sheet's bevel
  headers define the sign, its bevels equal report.json's, its "Cut turned
  over" column names the panels cut turned over; the Panel types sheet's
  cut numbers, printed with the drawing's digits, equal the drawing's.
- panel-types/PT-*.dxf (Debian's python3-ezdxf): every text is in a
  colour that reads on white paper (contrast ratio at least 4.5:1 against
  white, WCAG 2 relative luminance, colours from ezdxf's own palette);
  every dimension text's box (width estimated at 0.9 of the height a
  character, the upper estimate pqfab uses) is clear of the cut and
  set-out outlines (shapely); the drawing defines the bevel sign; each
  "bevels of LABEL" line equals that panel's bevels by the type's edges
  (a panel cut turned over with signs reversed), and agrees in sign with
  its tag and its schedule row.

Usage: readback_panel_marks.py OUTPUT_FOLDER
"""
import json
import math
import os
import re
import subprocess
import sys
import xml.etree.ElementTree as ET

import ezdxf
import openpyxl
from ezdxf.colors import aci2rgb
from shapely.geometry import LineString, Polygon

MM = 25.4 / 72  # mm per PDF point
TAG_W, TAG_H, TAG_TOP = 105.0, 74.0, 0.5  # the office label sheet's cells (mm): export.TagOffice
CHAR_W = 0.9  # DXF text width per character, as a share of its height
NUM = r"([+-]?[0-9]+(?:\.[0-9]+)?)"


def fail(msg):
    print("FAIL:", msg)
    sys.exit(1)


def tag_lines(path):
    """Returns {label: [line text, ...]} for every tag of tags.pdf."""
    out = subprocess.run(["pdftotext", "-bbox", path, "-"], check=True, capture_output=True).stdout
    root = ET.fromstring(out)
    ns = {"h": "http://www.w3.org/1999/xhtml"}
    tags = {}
    for page in root.iter("{http://www.w3.org/1999/xhtml}page"):
        cells = {}
        for w in page.findall("h:word", ns):
            x, y = float(w.get("xMin")) * MM, float(w.get("yMin")) * MM
            cell = (int(x // TAG_W), int((y - TAG_TOP) // TAG_H))
            cells.setdefault(cell, []).append((round(float(w.get("yMax")), 1), x, w.text or ""))
        for words in cells.values():
            lines = {}
            for y, x, t in words:
                key = next((k for k in lines if abs(k - y) < 0.6), y)
                lines.setdefault(key, []).append((x, t))
            text = [" ".join(t for _, t in sorted(ws)) for _, ws in sorted(lines.items())]
            label = next((l for l in text if re.fullmatch(r"[A-Z]+[0-9]+-P[0-9]+", l)), None)
            if label:
                tags[label] = text
    return tags


def pairs(s):
    return {(int(a), int(b)): float(v) for a, b, v in re.findall(r"([0-9]+)-([0-9]+) " + NUM, s)}


def signed_list(s):
    return [float(v) for v in re.findall(NUM, s)]


def check_tags(out, rep):
    tags = tag_lines(os.path.join(out, "site", "tags.pdf"))
    inset = rep["panel_material"]["edge_inset_mm"]
    for p in rep["panels"]:
        lines = tags.get(p["label"])
        if lines is None:
            fail("tags.pdf: no tag for %s" % p["label"])
        pane = next((l for l in lines if l.startswith("pane diagonals ")), None)
        setout = next((l for l in lines if l.startswith("set-out diag. (nodes) ")), None)
        bev = next((l for l in lines if l.startswith("bevels 1-")), None)
        if not pane or not setout or not bev:
            fail("tag %s: lines missing: %s" % (p["label"], lines))
        # The kind, type and bay sit beside the small print, so a line may
        # hold a word of theirs between the sign's words.
        if not re.search(r"Bevel \+:.*outside face larger", " ".join(lines)):
            fail("tag %s: the bevel sign is not defined" % p["label"])
        cut = p["cut_outline_mm"]
        k = len(cut)
        got = pairs(pane)
        if len(got) != k * (k - 3) // 2:
            fail("tag %s: %d pane diagonals for %d corners" % (p["label"], len(got), k))
        corner = {c: i + 1 for i, c in enumerate(p["corners"])}
        want_setout = {tuple(sorted((corner[d["from"]], corner[d["to"]]))): d["length_mm"] for d in p["diagonals"]}
        for (i, j), v in got.items():
            # Corners to 0.01 mm: the distance to 0.015 mm, printed to 0.1.
            d = math.dist(cut[i - 1], cut[j - 1])
            if abs(v - d) > 0.05 + 0.015:
                fail("tag %s: pane diagonal %d-%d says %.1f, the cut outline has %.3f" % (p["label"], i, j, v, d))
            if inset > 0 and abs(v - want_setout[(i, j)]) < 0.1:
                fail("tag %s: pane diagonal %d-%d equals the set-out one" % (p["label"], i, j))
        for (i, j), v in pairs(setout).items():
            if abs(v - want_setout[(i, j)]) > 0.051:
                fail("tag %s: set-out diagonal %d-%d says %.1f, report %.2f" % (p["label"], i, j, v, want_setout[(i, j)]))
        tb = signed_list(bev.split(":", 1)[1])
        for e, (b, row) in enumerate(zip(tb, p["edges"])):
            if abs(b - row["bevel_deg"]) > 0.051:
                fail("tag %s: bevel %d says %+.1f, report %+.3f" % (p["label"], e + 1, b, row["bevel_deg"]))
    return tags


def check_schedule(out, rep):
    wb = openpyxl.load_workbook(os.path.join(out, "schedule.xlsx"), read_only=True)
    rows = list(wb["Panels"].iter_rows(values_only=True))
    head, data = rows[0], rows[1:]
    col = {h: i for i, h in enumerate(head)}
    turned = {l for t in rep["panel_types"] for l in t["turned_over"]}
    by_label = {p["label"]: p for p in rep["panels"]}
    bevel_cols = [h for h in head if h and h.startswith("Bevel ")]
    if not bevel_cols or not all("+ outside face larger" in h for h in bevel_cols):
        fail("Panels: bevel headers do not define the sign: %s" % bevel_cols)
    for row in data:
        p = by_label[row[0]]
        if row[col["Cut turned over (inside face up)"]] != ("yes" if p["label"] in turned else "no"):
            fail("Panels: %s turned over says %r" % (p["label"], row[col["Cut turned over (inside face up)"]]))
        for e, edge in enumerate(p["edges"]):
            v = row[col["Bevel %d (°, + outside face larger)" % (e + 1)]]
            if abs(v - edge["bevel_deg"]) > 1e-9:
                fail("Panels: %s bevel %d %r, report %r" % (p["label"], e + 1, v, edge["bevel_deg"]))
    rows = list(wb["Panel types"].iter_rows(values_only=True))
    return {r[0]: dict(zip(rows[0], r)) for r in rows[1:]}


def contrast_on_white(rgb):
    """WCAG 2 contrast ratio of a colour against white."""
    def lin(c):
        c /= 255
        return c / 12.92 if c <= 0.03928 else ((c + 0.055) / 1.055) ** 2.4
    r, g, b = (lin(c) for c in rgb)
    lum = 0.2126 * r + 0.7152 * g + 0.0722 * b
    return 1.05 / (lum + 0.05)


def text_box(t):
    """The box of a centred DXF TEXT as a shapely polygon."""
    h = t.dxf.height
    w = CHAR_W * h * len(ezdxf.decode_dxf_unicode(t.dxf.text))
    c = t.dxf.align_point if t.dxf.hasattr("align_point") else t.dxf.insert
    a = math.radians(t.dxf.rotation)
    ux, uy, vx, vy = math.cos(a), math.sin(a), -math.sin(a), math.cos(a)
    pts = []
    for sx, sy in ((-1, -1), (1, -1), (1, 1), (-1, 1)):
        pts.append((c.x + sx * w / 2 * ux + sy * h / 2 * vx, c.y + sx * w / 2 * uy + sy * h / 2 * vy))
    return Polygon(pts)


def check_type_drawings(out, rep, sched, tags):
    by_label = {p["label"]: p for p in rep["panels"]}
    for t in rep["panel_types"]:
        path = os.path.join(out, "panel-types", t["name"] + ".dxf")
        doc = ezdxf.readfile(path)
        msp = doc.modelspace()
        layer_colour = {l.dxf.name: l.dxf.color for l in doc.layers}
        for tx in msp.query("TEXT"):
            aci = tx.dxf.color if tx.dxf.hasattr("color") and tx.dxf.color not in (0, 256) else layer_colour[tx.dxf.layer]
            if contrast_on_white(aci2rgb(aci)) < 4.5:
                fail("%s: text %r in colour %d reads poorly on white (%.2f:1)" % (path, tx.dxf.text, aci, contrast_on_white(aci2rgb(aci))))
        rings = [Polygon(p[:2] for p in e.get_points("xy")).exterior for e in msp.query("LWPOLYLINE")]
        for tx in msp.query('TEXT[layer=="PQ-DIM"]'):
            box = text_box(tx)
            for ring in rings:
                if box.intersects(ring):
                    fail("%s: text %r overlaps an outline" % (path, tx.dxf.text))
        dims = [ezdxf.decode_dxf_unicode(x.dxf.text) for x in msp.query('TEXT[layer=="PQ-DIM"]')]
        notes = [ezdxf.decode_dxf_unicode(x.dxf.text) for x in msp.query('TEXT[layer=="PQ-NOTE"]')]
        if not any(n.startswith("Bevel sign: + = ") for n in notes):
            fail("%s: the bevel sign is not defined" % path)
        row = sched[t["name"]]
        k = len(t["edges_mm"])
        for s in dims:
            m = re.fullmatch(r"edge ([0-9]+) " + NUM, s)
            if m and m.group(2) != "%.2f" % row["Cut edge %s (mm)" % m.group(1)]:
                fail("%s: %s, schedule %.2f" % (path, s, row["Cut edge %s (mm)" % m.group(1)]))
            m = re.fullmatch(r"angle ([0-9]+) " + NUM + "°", s)
            if m and m.group(2) != "%.3f" % row["Cut angle %s (°)" % m.group(1)]:
                fail("%s: %s, schedule %.3f" % (path, s, row["Cut angle %s (°)" % m.group(1)]))
            m = re.fullmatch(r"diagonal ([0-9]+)-([0-9]+) " + NUM, s)
            if m and m.group(3) != "%.2f" % row["Cut diagonal %s-%s (mm)" % (m.group(1), m.group(2))]:
                fail("%s: %s, schedule %.2f" % (path, s, row["Cut diagonal %s-%s (mm)" % (m.group(1), m.group(2))]))
            m = re.fullmatch(r"bevel ([0-9]+) " + NUM + "°(?: to " + NUM + "°)?", s)
            if m:
                lo, hi = float(m.group(2)), float(m.group(3) or m.group(2))
                least = row["Bevel %s least (°, + outside face larger)" % m.group(1)]
                most = row["Bevel %s most (°)" % m.group(1)]
                if [round(least, 2), round(most, 2)] != [lo, hi]:
                    fail("%s: %s, schedule %r to %r" % (path, s, least, most))
        seen = 0
        for s in notes:
            m = re.fullmatch(r"bevels of (\S+) \(edges 1-([0-9]+)\): (.*?)( \(turned over.*\))?", s)
            if not m:
                continue
            seen += 1
            p = by_label[m.group(1)]
            turned = p["label"] in t["turned_over"]
            if bool(m.group(4)) != turned:
                fail("%s: %s: turned over %s" % (path, p["label"], turned))
            got = signed_list(m.group(3))
            tag = signed_list(next(l for l in tags[p["label"]] if l.startswith("bevels 1-")).split(":", 1)[1])
            for i in range(k):
                e = (k - 1 - i) % k if turned else i
                own = p["edges"][e]["bevel_deg"]
                want = -own if turned else own
                if abs(got[i] - want) > 0.0051:
                    fail("%s: %s bevel %d says %+.2f, the panel's edge %d has %+.3f" % (path, p["label"], i + 1, got[i], e + 1, own))
                # The same sign on the tag (for the panel's own faces).
                st = -got[i] if turned else got[i]
                if abs(st) >= 0.06 and (st > 0) != (tag[e] > 0):
                    fail("%s: %s edge %d: drawing %+.2f, tag %+.1f disagree in sign" % (path, p["label"], e + 1, got[i], tag[e]))
        if seen != t["count"]:
            fail("%s: bevels of %d panels listed, the type has %d" % (path, seen, t["count"]))


def main(out):
    with open(os.path.join(out, "report.json")) as f:
        rep = json.load(f)
    tags = check_tags(out, rep)
    sched = check_schedule(out, rep)
    check_type_drawings(out, rep, sched, tags)
    print("%d panel tags, %d panel types" % (len(rep["panels"]), len(rep["panel_types"])))
    print("ok")


if __name__ == "__main__":
    main(sys.argv[1])
