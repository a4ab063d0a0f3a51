"""Print every sheet of a workbook as tab-separated text, read with
openpyxl (a general-purpose reader from Debian's python3-openpyxl), for
the golden files.

Usage: xlsx_text.py BOOK.xlsx
Each sheet starts with a line '== NAME'; each row follows as its cells'
values (formulas as written, numbers as Python prints them, empty cells
empty) separated by tabs, trailing empty cells left out. A backslash, tab,
newline or carriage return inside a cell prints as \\, \t, \n, \r.
"""
import sys

import openpyxl


def cell_text(v):
    if v is None:
        return ""
    s = str(v)
    return s.replace("\\", "\\\\").replace("\t", "\\t").replace("\n", "\\n").replace("\r", "\\r")


def main(path):
    book = openpyxl.load_workbook(path)
    out = []
    for ws in book.worksheets:
        out.append("== " + ws.title)
        for row in ws.iter_rows(values_only=True):
            cells = [cell_text(v) for v in row]
            while cells and cells[-1] == "":
                cells.pop()
            out.append("\t".join(cells))
    sys.stdout.write("\n".join(out) + "\n")


if __name__ == "__main__":
    main(sys.argv[1])
