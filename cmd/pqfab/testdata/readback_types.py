"""Read the type drawings back with ezdxf (Debian's python3-ezdxf) and
check their numbers against report.json, recomputed independently:

- panel-types/PT-*.dxf: the cut outline on layer PQ-PART equals the
  type's drawing outline in report.json; every "edge k L", "angle k A" and
  "diagonal i-j D" text on layer PQ-DIM equals the length, inner angle and
  distance recomputed here from those coordinates (0.01 mm, 0.01°); the
  corner angles sum to (k-2)*180° (elementary geometry).
- member-types/MT-*.dxf: the "cut length", "blank length", "end A/B:
  mitre/bevel/setback", "twist", "top face", "bottom face", "side" and
  "system length" texts equal report.json's member type; the face
  lengths equal those recomputed here from the cut length, the section
  and the end cuts (a cut plane through the end's axis point with normal
  (cos b cos m, cos b sin m, sin b)-direction meets the line through
  section point (y, z) at x = -y tan m - z tan b from it; elementary
  geometry), the longer of top and bottom is marked long point, and the
  system length is the cut length plus both setbacks; the set-out line
  on layer PQ-SET-OUT is as long as the system length; the end A tag note
  is there; and no two TEXT boxes overlap (boxes as check_plan_dxf.py
  estimates them).

Usage: readback_types.py OUTPUT_FOLDER
"""
import json
import math
import os
import re
import sys

import ezdxf

from check_plan_dxf import text_box


def fail(msg):
    print("FAIL:", msg)
    sys.exit(1)


NUM = r"(-?[0-9]+(?:\.[0-9]+)?)"


def texts(doc, layer):
    out = []
    for t in doc.modelspace().query('TEXT[layer=="%s"]' % layer):
        out.append(ezdxf.decode_dxf_unicode(t.dxf.text))
    return out


def panel_types(out, rep):
    for t in rep["panel_types"]:
        path = os.path.join(out, "panel-types", t["name"] + ".dxf")
        doc = ezdxf.readfile(path)
        if doc.audit().has_errors:
            fail("%s: audit errors" % path)
        pts = t["drawing"]["cut_outline_mm"]
        k = len(pts)
        polys = doc.modelspace().query('LWPOLYLINE[layer=="PQ-PART"]')
        if len(polys) != 1:
            fail("%s: %d cut outlines" % (path, len(polys)))
        got = [p[:2] for p in polys[0].get_points("xy")]
        if len(got) != k or any(math.dist(a, b) > 0.01 for a, b in zip(got, pts)):
            fail("%s: cut outline differs from report.json" % path)
        dims = texts(doc, "PQ-DIM")
        edges = {}
        angles = {}
        diags = {}
        for s in dims:
            m = re.fullmatch(r"edge ([0-9]+) " + NUM, s)
            if m:
                edges[int(m.group(1))] = float(m.group(2))
            m = re.fullmatch(r"angle ([0-9]+) " + NUM + "°", s)
            if m:
                angles[int(m.group(1))] = float(m.group(2))
            m = re.fullmatch(r"diagonal ([0-9]+)-([0-9]+) " + NUM, s)
            if m:
                diags[(int(m.group(1)), int(m.group(2)))] = float(m.group(3))
        if sorted(edges) != list(range(1, k + 1)) or sorted(angles) != list(range(1, k + 1)) or len(diags) != k * (k - 3) // 2:
            fail("%s: %d edges, %d angles, %d diagonals written for %d corners" % (path, len(edges), len(angles), len(diags), k))
        for i in range(k):
            a, b, c = pts[i - 1], pts[i], pts[(i + 1) % k]
            e = math.dist(b, c)
            if abs(edges[i + 1] - e) > 0.01:
                fail("%s: edge %d says %.2f, the outline has %.4f" % (path, i + 1, edges[i + 1], e))
            u = (a[0] - b[0], a[1] - b[1])
            v = (c[0] - b[0], c[1] - b[1])
            ang = math.degrees(math.atan2(v[0] * u[1] - v[1] * u[0], v[0] * u[0] + v[1] * u[1])) % 360
            if abs(angles[i + 1] - ang) > 0.01:
                fail("%s: angle %d says %.2f, the outline has %.4f" % (path, i + 1, angles[i + 1], ang))
        if abs(sum(angles.values()) - (k - 2) * 180) > 0.01 * k:
            fail("%s: corner angles sum to %.3f" % (path, sum(angles.values())))
        for (i, j), dv in diags.items():
            if abs(dv - math.dist(pts[i - 1], pts[j - 1])) > 0.01:
                fail("%s: diagonal %d-%d differs" % (path, i, j))


def corners_agree(rep):
    """Corner 1 of every panel is corner 1 of its type: edge i of a panel
    (edge i of its type, or for a panel cut turned over edge k-1-i, read
    the other way) lies within the type's largest deviation of the type's
    nominal edge."""
    types = {t["name"]: t for t in rep["panel_types"]}
    for p in rep["panels"]:
        t = types[p["type"]]
        k = len(t["edges_mm"])
        turned = p["label"] in t["turned_over"]
        for i in range(k):
            e = p["cut"]["edges_mm"][(k - 1 - i) % k if turned else i]
            if abs(e - t["edges_mm"][i]) > t["max_deviation_mm"] + 0.011:
                fail("%s: edge %d is %.2f, its type %s has %.2f (deviation %.2f): corner 1 differs" % (p["label"], i + 1, e, t["name"], t["edges_mm"][i], t["max_deviation_mm"]))


def member_types(out, rep):
    for t in rep["member_types"]:
        path = os.path.join(out, "member-types", t["name"] + ".dxf")
        doc = ezdxf.readfile(path)
        if doc.audit().has_errors:
            fail("%s: audit errors" % path)
        dims = " | ".join(texts(doc, "PQ-DIM"))
        want = {
            r"cut length " + NUM + " mm": t["cut_length_mm"],
            r"blank length " + NUM + " mm": t["blank_length_mm"],
            r"twist " + NUM + "°": t["twist_deg"],
        }
        for i, end in enumerate("AB"):
            e = t["ends"][i]
            want[r"end %s: mitre " % end + NUM + "°"] = e["mitre_deg"]
            want[r"end %s: bevel " % end + NUM + "°"] = e["bevel_deg"]
            want[r"end %s: setback " % end + NUM + " mm"] = e["setback_mm"]
        f = t["face_lengths_mm"]
        want[r"top face " + NUM + " mm"] = f["top"]
        want[r"bottom face " + NUM + " mm"] = f["bottom"]
        want[r"side \+y " + NUM + " mm"] = f["side_y_pos"]
        want[r"side -y " + NUM + " mm"] = f["side_y_neg"]
        want[r"system length " + NUM + " mm"] = t["set_out_length_mm"]
        for pat, v in want.items():
            m = re.search(pat, dims)
            if not m or abs(float(m.group(1)) - v) > 0.0051:
                fail("%s: %s: %r, want %r" % (path, pat, m and m.group(1), v))
        # Face lengths recomputed from the ends and the section.
        w, d = rep["member_section_mm"]["width"] / 2, rep["member_section_mm"]["depth"] / 2

        def off(e, y, z):
            return -y * math.tan(math.radians(e["mitre_deg"])) - z * math.tan(math.radians(e["bevel_deg"]))
        a, b = t["ends"]
        for name, (y, z) in (("top", (0, d)), ("bottom", (0, -d)), ("side_y_pos", (w, 0)), ("side_y_neg", (-w, 0))):
            got = t["cut_length_mm"] + off(b, y, z) - off(a, y, z)
            # the ends' angles are rounded to 0.001°: up to d·0.001° per end
            if abs(got - f[name]) > 0.011 + 2 * max(w, d) * math.radians(0.0005):
                fail("%s: %s face %.3f, recomputed %.3f" % (path, name, f[name], got))
        if abs(f["top"] - f["bottom"]) >= 0.51:  # pqfab marks faces 0.5 mm apart or more
            longer = "top" if f["top"] > f["bottom"] else "bottom"
            if not re.search(longer + r" face " + NUM + r" mm \(long point\)", dims):
                fail("%s: the %s face is the long point but is not marked so" % (path, longer))
        setbacks = t["cut_length_mm"] + a["setback_mm"] + b["setback_mm"]
        if abs(setbacks - t["set_out_length_mm"]) > 0.011:
            fail("%s: system length %.2f, cut length and setbacks make %.2f" % (path, t["set_out_length_mm"], setbacks))
        # The set-out line: the longest line on PQ-SET-OUT.
        lens = [math.dist(l.dxf.start, l.dxf.end) for l in doc.modelspace().query('LINE[layer=="PQ-SET-OUT"]')]
        if not lens or abs(max(lens) - t["set_out_length_mm"]) > 0.011:
            fail("%s: set-out line %r long, want %.2f" % (path, lens and max(lens), t["set_out_length_mm"]))
        notes = " | ".join(texts(doc, "PQ-NOTE"))
        if "End A is the tag end" not in notes:
            fail("%s: no note on the tag end" % path)
        boxes = [(ezdxf.decode_dxf_unicode(x.dxf.text), text_box(x)) for x in doc.modelspace().query("TEXT")]
        for i in range(len(boxes)):
            for j in range(i):
                if boxes[i][1].intersection(boxes[j][1]).area > 1e-6:
                    fail("%s: text boxes overlap: %r and %r" % (path, boxes[i][0], boxes[j][0]))


def main(out):
    with open(os.path.join(out, "report.json")) as f:
        rep = json.load(f)
    panel_types(out, rep)
    corners_agree(rep)
    member_types(out, rep)
    print("%d panel types, %d member types" % (len(rep["panel_types"]), len(rep["member_types"])))
    print("ok")


if __name__ == "__main__":
    main(sys.argv[1])
