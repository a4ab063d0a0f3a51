"""Read pqfab's schedule.xlsx back with openpyxl (a general-purpose
spreadsheet library from Debian's python3-openpyxl) and compare it with
report.json.

Usage: readback_xlsx.py OUTPUT_FOLDER
"""
import json
import os
import sys

import openpyxl


def fail(msg):
    print("FAIL:", msg)
    sys.exit(1)


def rows(ws):
    it = ws.iter_rows(values_only=True)
    header = next(it)
    return header, [r for r in it]


def main(out):
    with open(os.path.join(out, "report.json")) as f:
        rep = json.load(f)
    wb = openpyxl.load_workbook(os.path.join(out, "schedule.xlsx"))
    want = ["Summary", "Panels", "Members", "Nodes", "Member types", "Node types", "Panel types", "Sheets", "Cuts", "Bars"]
    if wb.sheetnames != want:
        fail("sheets %s" % wb.sheetnames)
    summary = [r for r in wb["Summary"].iter_rows(values_only=True)]
    if not any(r[0] == "CAUTION" and "qualified structural engineer" in (r[1] or "") for r in summary):
        fail("no caution in the summary")
    for name, key, label_col in (("Panels", "panels", 0), ("Members", "members", 0), ("Nodes", "nodes", 0)):
        ws = wb[name]
        if ws.freeze_panes != "A2":
            fail("%s: header not frozen (%s)" % (name, ws.freeze_panes))
        if not ws.tables:
            fail("%s: no table with filters" % name)
        header, data = rows(ws)
        if len(data) != len(rep[key]):
            fail("%s: %d rows, report has %d" % (name, len(data), len(rep[key])))
        labels = [r[label_col] for r in data]
        if sorted(labels) != sorted(x["label"] for x in rep[key]) or len(set(labels)) != len(labels):
            fail("%s: labels differ from the report or repeat" % name)
        if not any("(" in (h or "") for h in header):
            fail("%s: no units in the header" % name)
    # Spot values, as numbers, found by their column headers.
    head, panels = rows(wb["Panels"])
    col = {h: i for i, h in enumerate(head)}
    for row, p in list(zip(panels, rep["panels"]))[:: max(1, len(panels) // 25)]:
        area = row[col["Cut area (m²)"]]
        if row[0] != p["label"] or not isinstance(area, (int, float)) or abs(area - p["area_m2"]) > 1e-9:
            fail("Panels: %s area %r != %r" % (p["label"], area, p["area_m2"]))
        for k, e in enumerate(p["cut"]["edges_mm"]):
            if abs(row[col["Cut edge %d (mm)" % (k + 1)]] - e) > 1e-9:
                fail("Panels: %s cut edge %d differs" % (p["label"], k + 1))
        for k, e in enumerate(p["edges"]):
            if abs(row[col["Set-out edge %d (mm)" % (k + 1)]] - e["length_mm"]) > 1e-9:
                fail("Panels: %s set-out edge %d differs" % (p["label"], k + 1))
        if (row[col["Sheet"]] or "") != p["sheet"]:
            fail("Panels: %s sheet %r != %r" % (p["label"], row[col["Sheet"]], p["sheet"]))
    head, members = rows(wb["Members"])
    col = {h: i for i, h in enumerate(head)}
    for row, m in list(zip(members, rep["members"]))[:: max(1, len(members) // 25)]:
        if row[col["Tag end (A or B: the type's end A)"]] != m["tag_end"]:
            fail("Members: %s tag end %r, report %r" % (m["label"], row[col["Tag end (A or B: the type's end A)"]], m["tag_end"]))
        cut, tw = row[col["Cut length (mm)"]], row[col["Twist (°)"]]
        if row[0] != m["label"] or not isinstance(cut, (int, float)) or abs(cut - m["cut_length_mm"]) > 1e-9 or abs(tw - m["twist_deg"]) > 1e-9:
            fail("Members: %s cut length/twist %r %r" % (m["label"], cut, tw))
    head, nodes = rows(wb["Nodes"])
    col = {h: i for i, h in enumerate(head)}
    for row, n in list(zip(nodes, rep["nodes"]))[:: max(1, len(nodes) // 25)]:
        if row[0] != n["label"] or row[col["Members at node"]] != n["members_at_node"] or abs(row[col["Z (mm)"]] - n["position_mm"][2]) > 1e-9:
            fail("Nodes: %s differs" % n["label"])
    for name, key in (("Member types", "member_types"), ("Node types", "node_types"), ("Panel types", "panel_types")):
        _, data = rows(wb[name])
        if len(data) != len(rep[key]) or sum(r[1] for r in data) != sum(t["count"] for t in rep[key]):
            fail("%s: rows or counts differ" % name)
    _, sheets = rows(wb["Sheets"])
    placed = sum(r[4] for r in sheets)
    if placed != len(rep["panels"]):
        fail("Sheets: %d parts listed for %d panels" % (placed, len(rep["panels"])))
    _, bars = rows(wb["Bars"])
    if len(bars) != len(rep["bars"]) or sum(r[3] for r in bars) != sum(len(b["pieces"]) for b in rep["bars"]):
        fail("Bars: %d rows for %d bars, or pieces differ" % (len(bars), len(rep["bars"])))
    print("ok")


if __name__ == "__main__":
    main(sys.argv[1])
