"""Read the Panels sheet of schedule.xlsx back with openpyxl (Debian's
python3-openpyxl) and check every panel of 3 to 6 corners against
report.json and elementary geometry: as many cut edges and corner angles
as corners, k(k-3)/2 diagonals, the values of report.json, and corner
angles summing to (k-2)*180 degrees (the angle sum of a simple polygon).

Usage: readback_shapes.py OUTPUT_FOLDER
"""
import json
import os
import sys

import openpyxl


def fail(msg):
    print("FAIL:", msg)
    sys.exit(1)


def main(out):
    with open(os.path.join(out, "report.json")) as f:
        rep = json.load(f)
    ws = openpyxl.load_workbook(os.path.join(out, "schedule.xlsx"))["Panels"]
    it = ws.iter_rows(values_only=True)
    head = next(it)
    byLabel = {p["label"]: p for p in rep["panels"]}
    seen = set()
    for row in it:
        cells = dict(zip(head, row))
        p = byLabel[cells["Label"]]
        k = len(p["corners"])
        seen.add(k)
        edges = [v for h, v in cells.items() if h.startswith("Cut edge ") and v is not None]
        angles = [v for h, v in cells.items() if h.startswith("Cut angle ") and v is not None]
        diags = [v for h, v in cells.items() if h.startswith("Cut diagonal ") and v is not None]
        setout = [v for h, v in cells.items() if h.startswith("Set-out edge ") and v is not None]
        if len(edges) != k or len(angles) != k or len(setout) != k or len(diags) != k * (k - 3) // 2:
            fail("%s (%d corners): %d edges, %d angles, %d diagonals, %d set-out edges" % (p["label"], k, len(edges), len(angles), len(diags), len(setout)))
        if any(abs(a - b) > 1e-9 for a, b in zip(edges, p["cut"]["edges_mm"])):
            fail("%s: cut edges differ from report.json" % p["label"])
        if sorted(diags) != sorted(d["length_mm"] for d in p["cut"]["diagonals"]):
            fail("%s: cut diagonals differ from report.json" % p["label"])
        if abs(sum(angles) - (k - 2) * 180) > 0.01:
            fail("%s: corner angles sum to %.4f, want %d" % (p["label"], sum(angles), (k - 2) * 180))
    print("corner counts seen:", sorted(seen))
    print("ok")


if __name__ == "__main__":
    main(sys.argv[1])
