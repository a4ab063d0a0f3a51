"""Read pqfab's schedule.xlsx back with openpyxl (a general-purpose
spreadsheet library from Debian's python3-openpyxl) and compare it with
report.json.

Usage: readback_xlsx.py OUTPUT_FOLDER
"""
import json
import os
import re
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
    want = ["Summary", "Panels", "Members", "Nodes", "Member types", "Node types", "Panel types", "Sheets", "Cuts", "Bars", "Glossary"]
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
    check_cost(summary, rep)
    check_numbers(wb)
    print("ok")


# A header or setting name with a unit in brackets: its values are numbers.
UNIT = re.compile(r"\((mm|°|m²|m|kg|%|s)[,)]")


def is_number(v):
    return isinstance(v, (int, float)) and not isinstance(v, bool)


def check_numbers(wb):
    """Numbers are numbers: in every table, each cell under a header with a
    unit is a number or empty; in the summary, each setting whose name has
    a unit has a number beside it, and so has each cell of the sheet and bar
    stock tables under a header with a unit."""
    seen = 0
    for name in wb.sheetnames:
        if name == "Summary":
            continue
        header, data = rows(wb[name])
        cols = [i for i, h in enumerate(header) if h and UNIT.search(h)]
        for r in data:
            for i in cols:
                if r[i] is not None and not is_number(r[i]):
                    fail("%s: %r under %r is not a number" % (name, r[i], header[i]))
                seen += 1
        for i, h in enumerate(header):
            if h and re.search(r"\d+(\.\d+)?°? to -?\d", str(h)):
                fail("%s: a range in one header %r" % (name, h))
    summary = list(wb["Summary"].iter_rows(values_only=True))
    header, tables = None, 0
    for r in summary:
        if (r[0], r[1]) in (("Stock", "Width (mm)"), ("Bar stock", "Length (mm)")):
            header = r
            continue
        if header is not None:
            if r[0] is None:
                header = None
                continue
            for i, h in enumerate(header):
                if h and UNIT.search(h) and not is_number(r[i]):
                    fail("Summary stock %s: %r under %r is not a number" % (r[0], r[i], h))
                tables += 1
            continue
        if isinstance(r[0], str) and UNIT.search(r[0]) and r[1] is not None and not is_number(r[1]):
            fail("Summary: %r is %r, not a number" % (r[0], r[1]))
    for name in wb.sheetnames:
        it = wb[name].iter_rows(values_only=True)
        head = next(it)
        for r in it:
            for c, (h, v) in enumerate(zip(head, r)):
                if h in ("Id", "Stock") or (name == "Summary" and c == 0):
                    continue  # input ids, names and stock names are the job's text (a CSV net may say N12, a bar stock "12 m")
                if isinstance(v, str) and re.fullmatch(r"-?\d+(\.\d+)?( ?(mm|°|m))?( to -?\d+(\.\d+)?°?)?", v.strip()):
                    fail("%s: number written as text %r" % (name, v))
    if seen == 0 or tables == 0:
        fail("no cells with units found (%d in tables, %d in the summary's stock tables)" % (seen, tables))


def check_cost(summary, rep):
    """The cost lines add up to the total, each line is its quantity times
    its rate, and no material is counted twice: every stock used has one
    material line, at its price where it has one (never also per m² or per
    m), and the making lines charge cut length and cut area only."""
    if rep.get("cost") is None:
        return
    start = next(i for i, r in enumerate(summary) if (r[0] or "").startswith("Cost estimate"))
    head = next(i for i in range(start, len(summary)) if summary[i][0] == "Item")
    if list(summary[head][:6]) != ["Item", "Quantity", "Unit", "Rate", "Amount", "Kind"]:
        fail("cost header %r" % (summary[head],))
    lines, total = [], None
    for r in summary[head + 1:]:
        if r[0] == "Total":
            total = r[4]
            break
        lines.append(r)
    if total is None or not isinstance(total, (int, float)):
        fail("cost: no total")
    cents = 0
    for item, q, unit, rate, amount, kind in (r[:6] for r in lines):
        for v in (q, rate, amount):
            if not isinstance(v, (int, float)):
                fail("cost line %r: %r is not a number" % (item, v))
        if abs(amount - q * rate) > 0.005 + 1e-9:  # rounded to the cent
            fail("cost line %r: %r × %r is not %r" % (item, q, rate, amount))
        if kind not in ("material", "making", "setup"):
            fail("cost line %r: kind %r" % (item, kind))
        cents += round(amount * 100)
    if cents != round(total * 100):
        fail("cost lines add up to %.2f, total %.2f" % (cents / 100, total))
    material = [r for r in lines if r[5] == "material"]
    for stocks, word, unit in ((rep["stocks"], "sheets", "sheet"), (rep["bar_stocks"], "bars", "bar")):
        for s in stocks:
            used = s["sheets"] if unit == "sheet" else s["bars"]
            mine = [r for r in material if (r[0] or "").startswith(("Panel material: ", "Member material: "))
                    and (" %s %s," % (word, s["name"]) in r[0] or " %s %s (" % (word, s["name"]) in r[0])]
            if used == 0:
                if mine:
                    fail("material charged for unused stock %s" % s["name"])
                continue
            if len(mine) != 1:
                fail("stock %s: %d material lines, want one" % (s["name"], len(mine)))
            if s["price"] > 0 and (mine[0][2] != unit or mine[0][3] != s["price"] or mine[0][1] != used):
                fail("stock %s: material %r, want %d %s at the price %r" % (s["name"], mine[0], used, unit, s["price"]))
    if len(material) != sum(1 for s in rep["stocks"] if s["sheets"]) + sum(1 for s in rep["bar_stocks"] if s["bars"]) + \
            sum(1 for r in material if "on no bar" in r[0]):
        fail("material lines for no stock: %r" % material)
    making = {r[0].split(":")[0]: r for r in lines if r[5] == "making"}
    cut_m = sum(m["cut_length_mm"] for m in rep["members"]) / 1000
    area = sum(p["area_m2"] for p in rep["panels"])
    for name, unit, q in (("Member making", "m", cut_m), ("Panel making", "m²", area)):
        r = making.get(name)
        if r is None or r[2] != unit or abs(r[1] - q) > 0.001:
            fail("%s: %r, want %.3f %s" % (name, r, q, unit))


if __name__ == "__main__":
    main(sys.argv[1])
