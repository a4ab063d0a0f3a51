"""Check pqfab's assembly plan with ezdxf (Debian's python3-ezdxf, a
general-purpose DXF library) and shapely (python3-shapely) against
report.json.

Usage: check_plan_dxf.py OUTPUT_FOLDER [--perturb]
Checks: the file audits clean; no two TEXT boxes overlap (box from the
text's alignment point, height, rotation and a width of 0.9 x height per
character, pqfab's stated upper estimate for common CAD fonts); no label
box of a node, member or panel crosses a member line; bay grid lines lie
on the report's bay grid and every bay with parts has its name and its
column and row in bubbles; every part label appears once, near its part
or on a leader line drawn from it; node type and height stand under each
node label; the title block carries the caution and the legend the hub
angle definition. Prints 'ok' at the end; exits non-zero on the first
failure. --perturb moves one label onto another first, to show that the
overlap check fails then.
"""
import json
import math
import os
import re
import sys
import warnings

import ezdxf
import ezdxf.tools.text
from shapely.geometry import LineString, Polygon
from shapely.strtree import STRtree

CHAR_W = 0.9  # width of a character / text height: pqfab's stated estimate
TOL = 0.01  # mm


def fail(msg):
    print("FAIL:", msg)
    sys.exit(1)


def plain(t):
    """The text a reader shows: DXF control codes resolved ("%%%" is a
    percent sign in AutoCAD's TEXT codes, which ezdxf 0.18 does not know)
    and \\U+XXXX escapes decoded with ezdxf's decoder."""
    s = t.dxf.text.replace("%%%", "\ue000")
    s = ezdxf.tools.text.plain_text(s).replace("\ue000", "%")
    return ezdxf.decode_dxf_unicode(s)


def text_box(t):
    h = t.dxf.height
    s = plain(t)
    w = CHAR_W * h * len(s)
    a = math.radians(t.dxf.rotation)
    ux, uy = math.cos(a), math.sin(a)
    vx, vy = -uy, ux
    if (t.dxf.halign, t.dxf.valign) == (1, 2):  # middle-centre: the align point is the centre
        cx, cy = t.dxf.align_point[0], t.dxf.align_point[1]
    elif (t.dxf.halign, t.dxf.valign) == (0, 0):  # left, baseline: the insert point
        x, y = t.dxf.insert[0], t.dxf.insert[1]
        cx, cy = x + w / 2 * ux + h / 2 * vx, y + w / 2 * uy + h / 2 * vy
    else:
        fail("text %r has an alignment this check does not know (%d, %d)" % (s, t.dxf.halign, t.dxf.valign))
    pts = [(cx + sx * w / 2 * ux + sy * h / 2 * vx, cy + sx * w / 2 * uy + sy * h / 2 * vy)
           for sx, sy in ((-1, -1), (1, -1), (1, 1), (-1, 1))]
    return Polygon(pts)


def index(geoms):
    """A search tree over geoms; near(g) gives the indices of the geoms whose
    boxes meet g's box (shapely 1.8 answers with geometries, 2.x with
    indices)."""
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        tree = STRtree(geoms)
    ids = {id(g): i for i, g in enumerate(geoms)}

    def near(g):
        return [ids[id(x)] if not isinstance(x, (int,)) and hasattr(x, "geom_type") else int(x) for x in tree.query(g)]
    return near


def bay_of(label):
    return label.split("-")[0]


# Bay columns: A to Z without I and O (read as 1 and 0 on grid lines),
# then AA, AB, ... over the same 24 letters.
COLUMN_LETTERS = "ABCDEFGHJKLMNPQRSTUVWXYZ"


def col_row(bay):
    m = re.fullmatch(r"([A-HJ-NP-Z]+)(\d+)", bay)
    if not m:
        fail("bay %r is not letters without I and O, then a row number" % bay)
    col = 0
    for ch in m.group(1):
        col = col * len(COLUMN_LETTERS) + COLUMN_LETTERS.index(ch) + 1
    return col - 1, int(m.group(2)) - 1


def main(out, perturb=False):
    with open(os.path.join(out, "report.json")) as f:
        rep = json.load(f)
    path = os.path.join(out, "assembly-plan.dxf")
    doc = ezdxf.readfile(path)
    if doc.audit().has_errors:
        fail("%s: audit errors" % path)
    msp = doc.modelspace()
    texts = list(msp.query("TEXT"))
    if perturb:
        # Self-test: put a member label onto a panel label; the overlap
        # check below must catch it.
        a = msp.query('TEXT[layer=="PQ-MEMBER-LABEL"]')[0]
        b = msp.query('TEXT[layer=="PQ-PANEL-LABEL"]')[0]
        a.dxf.align_point = b.dxf.align_point
    boxes = [text_box(t) for t in texts]
    near = index(boxes)
    for i, b in enumerate(boxes):
        for j in near(b):
            if j > i and boxes[j].intersection(b).area > 0:
                fail("text boxes overlap: %r and %r" % (plain(texts[i]), plain(texts[j])))
    print(path, len(texts), "texts, no two boxes overlap")

    pos = {n["label"]: n["position_mm"] for n in rep["nodes"]}
    member_lines = [LineString([pos[m["node_a"]][:2], pos[m["node_b"]][:2]]) for m in rep["members"]]
    near_line = index(member_lines)
    by_layer = {}
    for t, b in zip(texts, boxes):
        by_layer.setdefault(t.dxf.layer, []).append((t, b))
    for layer in ("PQ-NODE-LABEL", "PQ-NODE-INFO", "PQ-MEMBER-LABEL", "PQ-PANEL-LABEL"):
        for t, b in by_layer.get(layer, []):
            for j in near_line(b):
                if member_lines[j].intersects(b):
                    fail("label %r on layer %s crosses member %s" % (plain(t), layer, rep["members"][j]["label"]))
    print(path, "no label crosses a member line")

    # Grid: lines on the bay grid, bubbles and bay names.
    ox, oy = rep["bays"]["origin_mm"]
    sx, sy = rep["bays"]["size_mm"]
    vert, horiz = set(), set()
    for ln in msp.query('LINE[layer=="PQ-GRID"]'):
        a, b = ln.dxf.start, ln.dxf.end
        if abs(a[0] - b[0]) < TOL:
            k = (a[0] - ox) / sx
            if abs(k - round(k)) > 1e-6:
                fail("grid line x = %g is not on the bay grid" % a[0])
            vert.add(round(k))
        elif abs(a[1] - b[1]) < TOL:
            k = (a[1] - oy) / sy
            if abs(k - round(k)) > 1e-6:
                fail("grid line y = %g is not on the bay grid" % a[1])
            horiz.add(round(k))
        else:
            fail("grid line is neither along x nor along y")
    bays = {bay_of(x["label"]) for kind in ("nodes", "members", "panels") for x in rep[kind]}
    grid_texts = [plain(t) for t, _ in by_layer.get("PQ-GRID-TEXT", [])]
    for bay in sorted(bays):
        c, r = col_row(bay)
        if not {c, c + 1} <= vert or not {r, r + 1} <= horiz:
            fail("bay %s has no grid lines around it" % bay)
        letters = re.match(r"[A-Z]+", bay).group(0)
        if grid_texts.count(bay) != 1:
            fail("bay name %s appears %d times" % (bay, grid_texts.count(bay)))
        if grid_texts.count(letters) != 2 or grid_texts.count(str(r + 1)) != 2:
            fail("bay %s: column %s or row %d is not in two bubbles" % (bay, letters, r + 1))
    if len(msp.query('CIRCLE[layer=="PQ-PLAN-FRAME"]')) != len([t for t in grid_texts if t not in bays]):
        fail("every bubble text needs a circle")
    print(path, len(vert), "+", len(horiz), "grid lines,", len(bays), "bays named")

    # Labels: each once, near its part or with a leader from the part.
    leaders = [(l.dxf.start, l.dxf.end) for l in msp.query('LINE[layer=="PQ-LEADER"]')]
    leader_from = {(round(a[0], 1), round(a[1], 1)) for a, _ in leaders}

    def check(layer, parts, anchor, reach):
        got = {}
        for t, _ in by_layer.get(layer, []):
            got.setdefault(plain(t), []).append(t)
        for label, p in parts.items():
            ts = got.get(label, [])
            if len(ts) != 1:
                fail("%s: label %s appears %d times" % (layer, label, len(ts)))
            a = anchor(p)
            c = ts[0].dxf.align_point
            if math.hypot(c[0] - a[0], c[1] - a[1]) > reach and (round(a[0], 1), round(a[1], 1)) not in leader_from:
                fail("%s: label %s is %.0f mm from its part and has no leader" % (layer, label, math.hypot(c[0] - a[0], c[1] - a[1])))
        if len(got) != len(parts):
            fail("%s: %d labels for %d parts" % (layer, len(got), len(parts)))

    h = max(t.dxf.height for t, _ in by_layer["PQ-NODE-LABEL"])
    spans = [m["system_length_mm"] for m in rep["members"]]
    reach = 8 * h  # a label block is at most about 8 label heights across
    check("PQ-NODE-LABEL", {n["label"]: n for n in rep["nodes"]}, lambda n: n["position_mm"], reach)

    def mid(m):
        a, b = pos[m["node_a"]], pos[m["node_b"]]
        return ((a[0] + b[0]) / 2, (a[1] + b[1]) / 2)

    check("PQ-MEMBER-LABEL", {m["label"]: m for m in rep["members"]}, mid, max(spans) / 2 + reach)

    def centre(p):
        xs = [pos[c][0] for c in p["corners"]]
        ys = [pos[c][1] for c in p["corners"]]
        return (sum(xs) / len(xs), sum(ys) / len(ys))

    check("PQ-PANEL-LABEL", {p["label"]: p for p in rep["panels"]}, centre, max(spans) / 2 + reach)
    # Node type and height under each node label.
    infos = {}
    for t, _ in by_layer.get("PQ-NODE-INFO", []):
        infos.setdefault(plain(t), 0)
        infos[plain(t)] += 1
    labels = {plain(t): t for t, _ in by_layer["PQ-NODE-LABEL"]}
    for n in rep["nodes"]:
        z = n["position_mm"][2]
        # Whole mm, halves away from zero (Python's round() goes to even).
        zmm = int(math.floor(abs(z) + 0.5)) * (1 if z >= 0 else -1)
        want = "%s  z %d" % (n["type"], zmm)
        if infos.get(want, 0) < 1:
            fail("node %s: no info text %r" % (n["label"], want))
    # Member labels not on leaders run along their members.
    members = {m["label"]: m for m in rep["members"]}
    for t, _ in by_layer["PQ-MEMBER-LABEL"]:
        m = members[plain(t)]
        a, b = pos[m["node_a"]], pos[m["node_b"]]
        ang = math.degrees(math.atan2(b[1] - a[1], b[0] - a[0]))
        d = (t.dxf.rotation - ang) % 180
        c = t.dxf.align_point
        mx, my = mid(m)
        if min(d, 180 - d) > 0.01 and (round(mx, 1), round(my, 1)) not in leader_from:
            fail("member label %s at %.3f° along a member at %.3f°" % (m["label"], t.dxf.rotation, ang))
    print(path, "labels: %d nodes, %d members, %d panels, %d leaders" % (len(rep["nodes"]), len(rep["members"]), len(rep["panels"]), len(leaders)))

    legend = " ".join(plain(t) for t, _ in by_layer.get("PQ-LEGEND", []))
    if "azimuth 0" not in legend or "row by row" not in legend:
        fail("legend lacks the hub angle definition or the numbering rule: %r" % legend[:300])
    title = " ".join(plain(t) for t, _ in by_layer.get("PQ-TITLE", []))
    if "CAUTION" not in title or rep["title"] not in title:
        fail("title block lacks the title or the caution: %r" % title[:300])
    print("ok")


if __name__ == "__main__":
    main(sys.argv[1], "--perturb" in sys.argv[2:])
