"""Read an OBJ net the way a strict reader does, with numpy (Debian's
python3-numpy) parsing the numbers: every line is a comment starting with
'#', or `v x y z` (exactly three numbers: a fourth would be a weight), or
`f a b c ...` (1-based node numbers). A '#' after the numbers of a `v` or
`f` line makes numpy's text parser fail, as it does strict OBJ readers.
Prints the nodes and faces as JSON.

Usage: readback_obj.py NET.obj
"""
import io
import json
import sys

import numpy as np


def main(path):
    vlines, faces = [], []
    with open(path, encoding="utf-8") as f:
        for line in f:
            if line.startswith("#"):
                continue
            if line.startswith("v "):
                vlines.append(line[2:])
            elif line.startswith("f "):
                # comments=None: a trailing comment is not skipped but read
                # as values, and fails.
                idx = np.loadtxt(io.StringIO(line[2:]), dtype=np.int64, comments=None, ndmin=1)
                faces.append([int(i) for i in idx])
            else:
                print("FAIL: not a comment, v or f line:", line.rstrip())
                sys.exit(1)
    nodes = np.loadtxt(io.StringIO("".join(vlines)), dtype=np.float64, comments=None, ndmin=2)
    if nodes.shape[1] != 3:
        print("FAIL: v lines hold", nodes.shape[1], "values, want 3")
        sys.exit(1)
    for fc in faces:
        if min(fc) < 1 or max(fc) > nodes.shape[0]:
            print("FAIL: face", fc, "names a node outside 1 ..", nodes.shape[0])
            sys.exit(1)
    json.dump({"nodes": nodes.tolist(), "faces": faces}, sys.stdout)


if __name__ == "__main__":
    main(sys.argv[1])
