"""Check the words of pqfab's user-facing text: the schedule (read with
openpyxl, a general-purpose spreadsheet library from Debian's
python3-openpyxl), the visible text of report.html, the command help and the README.

Words that have a plain replacement must not appear outside the schedule's
Glossary sheet; words kept because they are job keys, job values or
command names must be explained in the Glossary sheet and in the README's
glossary section wherever they appear.

Usage: check_words.py OUTPUT_FOLDER HELP_TEXT_FILE README
"""
import html
import os
import re
import sys

import openpyxl

# Said in plain words instead (the words in brackets are what replaced them).
AVOID = [
    r"planari[sz]ation",      # make the panels flat
    r"planarized",            # with flat panels
    r"normals",               # directions square to the panels
    r"hub plane",             # the plane square to the node axis
    r"set-out outline",       # the outline through the node points
    r"nominal",               # the middle of the parts' values
    r"largest deviation",     # largest difference from type
    r"lower bound",           # fewest possible
]
# Kept (job keys, job values, command names, trade words), explained once.
KEEP = ["net", "planarize", "fairness", "least-twist", "normal", "set-out", "setback", "blank", "quarter", "first-edge"]


def fail(msg):
    print("FAIL:", msg)
    sys.exit(1)


def find(word, text):
    return re.search(r"(?i)(?<![\w-])" + word + r"(?![\w])", text)


def main(out, help_file, readme):
    texts = {}
    wb = openpyxl.load_workbook(os.path.join(out, "schedule.xlsx"))
    if "Glossary" not in wb.sheetnames:
        fail("no Glossary sheet")
    glossary = {}
    for r in list(wb["Glossary"].iter_rows(values_only=True))[1:]:
        glossary[r[0]] = r[1]
    for name in wb.sheetnames:
        if name == "Glossary":
            continue
        cells = []
        for r in wb[name].iter_rows(values_only=True):
            cells += [v for v in r if isinstance(v, str)]
        texts["schedule sheet " + name] = "\n".join(cells)
    with open(os.path.join(out, "report.html"), encoding="utf-8") as f:
        page = f.read()
    page = re.sub(r"(?s)<(style|script)\b.*?</\1>", " ", page)
    page = re.sub(r"(?s)<svg\b.*?</svg>", lambda m: " ".join(re.findall(r">([^<]+)<", m.group(0))), page)
    texts["report.html"] = html.unescape(re.sub(r"<[^>]+>", " ", page))
    with open(help_file, encoding="utf-8") as f:
        texts["help"] = f.read()
    with open(readme, encoding="utf-8") as f:
        rd = f.read()
    m = re.search(r"(?ms)^## Glossary\n(.*?)(?=^## |\Z)", rd)
    if not m:
        fail("README: no ## Glossary section")
    readme_glossary = m.group(1)
    texts["README outside its glossary"] = rd[:m.start()] + rd[m.end():]
    for where, text in texts.items():
        for w in AVOID:
            hit = find(w, text)
            if hit:
                fail("%s: %r outside the glossary: …%s…" % (where, hit.group(0), text[max(0, hit.start() - 60):hit.end() + 60]))
        for w in KEEP:
            if where.startswith("README"):
                continue  # the README explains its kept words in its own glossary, checked below
            if find(w, text):
                if not any(find(w, t) for t in glossary):
                    fail("%s says %r, which the Glossary sheet does not explain" % (where, w))
                if not find(w, readme_glossary):
                    fail("%s says %r, which the README glossary does not explain" % (where, w))
    for w in KEEP:
        if not find(w, readme_glossary):
            fail("README glossary does not explain %r" % w)
    if not texts["schedule sheet Summary"]:
        fail("empty summary")
    print("ok")


if __name__ == "__main__":
    main(*sys.argv[1:4])
