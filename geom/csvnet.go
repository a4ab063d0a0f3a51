package geom

import (
	"encoding/csv"
	"errors"
	"io"
	"path/filepath"
	"strings"
)

// PanelsPathFor returns the panels file that goes with a nodes CSV file:
// the same name with the last "nodes" replaced by "panels"
// (canopy-nodes.csv → canopy-panels.csv).
func PanelsPathFor(nodesPath string) (string, error) {
	dir, base := filepath.Split(nodesPath)
	i := strings.LastIndex(strings.ToLower(base), "nodes")
	if i < 0 {
		return "", &InputError{File: nodesPath, Msg: `a CSV net is a pair of files: name the nodes file "…nodes….csv" so its "…panels….csv" partner can be found`}
	}
	return dir + base[:i] + "panels" + base[i+len("nodes"):], nil
}

// ReadCSV reads a net from a CSV pair, each with a header row. Nodes:
// id,x,y,z[,support] where support is 1/0, true/false, yes/no or empty.
// Panels: id,n1,n2,n3[,n4,...] naming node ids; empty trailing cells are
// allowed so triangles and quads can share a table.
func ReadCSV(nodes io.Reader, nodesFile string, panels io.Reader, panelsFile string, unit Unit) (*Net, error) {
	n := &Net{Source: nodesFile}
	byID := map[string]int{}
	err := readCSVRows(nodes, nodesFile, func(line int, rec []string) error {
		if len(rec) < 4 || len(rec) > 5 {
			return inputErr(nodesFile, line, "", "want id,x,y,z[,support], got %d cells", len(rec))
		}
		id := strings.TrimSpace(rec[0])
		if id == "" {
			return inputErr(nodesFile, line, "", "node id is empty")
		}
		if prev, dup := byID[id]; dup {
			return inputErr(nodesFile, line, "node "+id, "id used before on line %d", n.Nodes[prev].Line)
		}
		p, err := parsePoint(trimAll(rec[1:4]), unit)
		if err != nil {
			return inputErr(nodesFile, line, "node "+id, "%v", err)
		}
		sup := false
		if len(rec) == 5 {
			switch strings.ToLower(strings.TrimSpace(rec[4])) {
			case "1", "true", "yes", "y":
				sup = true
			case "0", "false", "no", "n", "":
			default:
				return inputErr(nodesFile, line, "node "+id, "support %q: want 1/0, true/false or yes/no", rec[4])
			}
		}
		byID[id] = len(n.Nodes)
		n.Nodes = append(n.Nodes, Node{ID: id, Pos: p, Support: sup, Line: line})
		return nil
	})
	if err != nil {
		return nil, err
	}
	faceIDs := map[string]int{}
	err = readCSVRows(panels, panelsFile, func(line int, rec []string) error {
		id := strings.TrimSpace(rec[0])
		if id == "" {
			return inputErr(panelsFile, line, "", "panel id is empty")
		}
		if prev, dup := faceIDs[id]; dup {
			return inputErr(panelsFile, line, "panel "+id, "id used before on line %d", prev)
		}
		faceIDs[id] = line
		cells := trimAll(rec[1:])
		for len(cells) > 0 && cells[len(cells)-1] == "" {
			cells = cells[:len(cells)-1]
		}
		corners := make([]int, len(cells))
		for k, c := range cells {
			idx, ok := byID[c]
			if !ok {
				if c == "" {
					return inputErr(panelsFile, line, "panel "+id, "corner %d is empty", k+1)
				}
				return inputErr(panelsFile, line, "panel "+id, "corner %d: node %q is not in %s", k+1, c, nodesFile)
			}
			corners[k] = idx
		}
		if msg := checkFaceCorners(corners); msg != "" {
			return inputErr(panelsFile, line, "panel "+id, "%s", msg)
		}
		n.Faces = append(n.Faces, Face{ID: id, Corners: corners, Line: line})
		return nil
	})
	if err != nil {
		return nil, err
	}
	if len(n.Nodes) == 0 {
		return nil, &InputError{File: nodesFile, Msg: "no nodes"}
	}
	if len(n.Faces) == 0 {
		return nil, &InputError{File: panelsFile, Msg: "no panels"}
	}
	return n, nil
}

func trimAll(s []string) []string {
	out := make([]string, len(s))
	for i, c := range s {
		out[i] = strings.TrimSpace(c)
	}
	return out
}

// readCSVRows skips the header row and calls row for every other record.
func readCSVRows(r io.Reader, file string, row func(line int, rec []string) error) error {
	cr := csv.NewReader(r)
	cr.FieldsPerRecord = -1
	cr.Comment = '#'
	cr.ReuseRecord = true
	header := true
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			if header {
				return &InputError{File: file, Msg: "empty file (want a header row and data rows)"}
			}
			return nil
		}
		if err != nil {
			var pe *csv.ParseError
			if errors.As(err, &pe) {
				return inputErr(file, pe.Line, "", "CSV: %v", pe.Err)
			}
			return inputErr(file, 0, "", "read failed: %v", err)
		}
		line, _ := cr.FieldPos(0)
		for _, c := range rec {
			if !utf8Text(c) {
				return inputErr(file, line, "", "not a text line (binary data?)")
			}
		}
		if header {
			header = false
			if !strings.EqualFold(strings.TrimSpace(strings.TrimPrefix(rec[0], "\ufeff")), "id") {
				return inputErr(file, line, "", "first row must be a header starting with id, got %q", rec[0])
			}
			continue
		}
		if len(rec) == 1 && strings.TrimSpace(rec[0]) == "" {
			continue
		}
		if err := row(line, rec); err != nil {
			return err
		}
	}
}
