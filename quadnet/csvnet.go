package quadnet

import (
	"io"
	"path/filepath"
	"strconv"
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

// ReadCSV reads a net from a CSV pair, each with a header row whose first
// cell is "id". Nodes: id,x,y,z[,support] where x, y, z are plain decimal
// numbers and support is 1/0, true/false, yes/no or empty. Panels:
// id,n1,n2,n3[,n4,...] naming node ids; empty trailing cells are allowed
// so triangles and quads can share a table.
//
// Cells are separated by commas and may be quoted ("a,b" and "say ""x"""
// are one cell each); a cell cannot hold a line break, so every record is
// one line. Lines starting with '#' and blank lines are skipped. Lines may
// end in LF, CRLF or a lone CR; a byte-order mark at the start is skipped.
// Ids are at most MaxIDBytes long. Input beyond MaxLineBytes, MaxLines,
// MaxNodes or MaxPanels stops the reader with an error naming the line,
// so an endless stream cannot exhaust memory.
func ReadCSV(nodes io.Reader, nodesFile string, panels io.Reader, panelsFile string, unit Unit) (*Net, error) {
	n := &Net{Source: nodesFile, Unit: unit}
	byID := map[string]int{}
	err := readCSVRows(nodes, nodesFile, func(line int, rec []string) error {
		if len(rec) < 4 || len(rec) > 5 {
			return inputErr(nodesFile, line, "", "want id,x,y,z[,support], got %d cells", len(rec))
		}
		id, err := csvID(rec[0], nodesFile, line, "node")
		if err != nil {
			return err
		}
		if prev, dup := byID[id]; dup {
			return inputErr(nodesFile, line, "node "+id, "id used before on line %d", n.Nodes[prev].Line)
		}
		if len(n.Nodes) == MaxNodes {
			return tooMany(nodesFile, line, "node "+strconv.Itoa(MaxNodes+1), "nodes", MaxNodes)
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
				return inputErr(nodesFile, line, "node "+id, "support %s: want 1/0, true/false or yes/no", quote(rec[4]))
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
		id, err := csvID(rec[0], panelsFile, line, "panel")
		if err != nil {
			return err
		}
		if prev, dup := faceIDs[id]; dup {
			return inputErr(panelsFile, line, "panel "+id, "id used before on line %d", prev)
		}
		if len(n.Faces) == MaxPanels {
			return tooMany(panelsFile, line, "panel "+strconv.Itoa(MaxPanels+1), "panels", MaxPanels)
		}
		faceIDs[id] = line
		cells := trimAll(rec[1:])
		for len(cells) > 0 && cells[len(cells)-1] == "" {
			cells = cells[:len(cells)-1]
		}
		if msg := checkCornerCount(len(cells)); msg != "" {
			return inputErr(panelsFile, line, "panel "+id, "%s", msg)
		}
		corners := make([]int, len(cells))
		for k, c := range cells {
			idx, ok := byID[c]
			if !ok {
				if c == "" {
					return inputErr(panelsFile, line, "panel "+id, "corner %d is empty", k+1)
				}
				return inputErr(panelsFile, line, "panel "+id, "corner %d: node %s is not in %s", k+1, quote(c), nodesFile)
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

// csvID reads the id cell of a row: not empty, at most MaxIDBytes long.
func csvID(cell, file string, line int, kind string) (string, error) {
	id := strings.TrimSpace(cell)
	switch {
	case id == "":
		return "", inputErr(file, line, "", "%s id is empty", kind)
	case len(id) > MaxIDBytes:
		return "", inputErr(file, line, "", "%s id %s is longer than %d bytes", kind, quote(id), MaxIDBytes)
	}
	return strings.Clone(id), nil // not a view that keeps the whole line alive
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
	lr := newLineReader(r, file)
	lr.csv = true
	header := true
	var rec []string
	for {
		s, ok := lr.next()
		if !ok {
			break
		}
		var msg string
		if rec, msg = splitCSV(s, rec); msg != "" {
			return inputErr(file, lr.line, "", "CSV: %s", msg)
		}
		if header {
			header = false
			if !strings.EqualFold(strings.TrimSpace(rec[0]), "id") {
				for _, sep := range []struct{ c, name string }{{";", "semicolons"}, {"\t", "tabs"}} {
					if len(rec) == 1 && strings.Contains(rec[0], sep.c) {
						return inputErr(file, lr.line, "", "cells must be separated by commas; this file uses %s", sep.name)
					}
				}
				return inputErr(file, lr.line, "", "first row must be a header starting with id, got %s", quote(rec[0]))
			}
			continue
		}
		if err := row(lr.line, rec); err != nil {
			return err
		}
	}
	if lr.err != nil {
		return lr.err
	}
	if header {
		return &InputError{File: file, Msg: "empty file (want a header row and data rows)"}
	}
	return nil
}
