"""Read text written from a job and a net back with general-purpose readers
from Debian's packages: ezdxf (DXF, with its decode_dxf_unicode for the
\\U+XXXX notation of AC1015 files) and openpyxl (XLSX).

Usage: readback_text.py OUTPUT_FOLDER TITLE
Checks that the title reads back unchanged from a cut sheet's title block
and from the schedule's Summary, and that every DXF passes ezdxf's audit.
Prints 'ok' or exits non-zero.
"""
import glob
import os
import sys

import ezdxf
import openpyxl


def fail(msg):
    print("FAIL:", msg)
    sys.exit(1)


def main(out, title):
    for path in sorted(glob.glob(os.path.join(out, "**", "*.dxf"), recursive=True)):
        doc = ezdxf.readfile(path)
        auditor = doc.audit()
        if auditor.has_errors:
            fail("%s: audit errors %s" % (path, auditor.errors[:3]))
    doc = ezdxf.readfile(sorted(glob.glob(os.path.join(out, "sheets", "*.dxf")))[0])
    texts = [ezdxf.decode_dxf_unicode(t.dxf.text).replace("%%%", "%") for t in doc.modelspace().query("TEXT")]
    if not any(t.startswith(title + "  ") for t in texts):
        fail("title %r not found in the sheet's texts %r" % (title, texts[-4:]))
    wb = openpyxl.load_workbook(os.path.join(out, "schedule.xlsx"), read_only=True)
    first = next(wb["Summary"].iter_rows(min_row=1, max_row=1, values_only=True))[0]
    if first != title:
        fail("schedule title %r, want %r" % (first, title))
    print("ok")


if __name__ == "__main__":
    main(sys.argv[1], sys.argv[2])
