package geom

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"syscall"
)

// MaxCorners is the largest panel pqfab takes; MinCorners the smallest.
const (
	MinCorners = 3
	MaxCorners = 6
)

// MaxCoordMM is the largest coordinate magnitude accepted (100 km): larger
// values are a unit mistake or junk, and would ruin float precision at the
// 0.01 mm scale the outputs are written in.
const MaxCoordMM = 1e8

// ReadFile reads a net file from disk, choosing the format by the file
// name's extension: .obj, .off, or .csv for a CSV pair (see ReadCSV; the
// panels file is found by PanelsPathFor).
func ReadFile(path string, unit Unit) (*Net, error) {
	return ReadFrom(func(name string) (io.ReadCloser, error) { return os.Open(name) }, path, unit)
}

// ReadFrom is ReadFile with files opened by open, such as an embedded
// file system's Open.
func ReadFrom(open func(name string) (io.ReadCloser, error), path string, unit Unit) (*Net, error) {
	var read func(io.Reader, string, Unit) (*Net, error)
	switch strings.ToLower(filepath.Ext(path)) {
	case ".obj":
		read = ReadOBJ
	case ".off":
		read = ReadOFF
	case ".csv":
		pp, err := PanelsPathFor(path)
		if err != nil {
			return nil, err
		}
		nf, err := open(path)
		if err != nil {
			return nil, &InputError{File: path, Msg: openMsg(err)}
		}
		defer nf.Close()
		pf, err := open(pp)
		if err != nil {
			return nil, &InputError{File: pp, Msg: openMsg(err)}
		}
		defer pf.Close()
		return ReadCSV(nf, path, pf, pp, unit)
	default:
		return nil, &InputError{File: path, Msg: "unknown net format (want .obj, .off or a nodes/panels .csv pair)"}
	}
	f, err := open(path)
	if err != nil {
		return nil, &InputError{File: path, Msg: openMsg(err)}
	}
	defer f.Close()
	return read(f, path, unit)
}

func openMsg(err error) string {
	switch {
	case errors.Is(err, fs.ErrNotExist):
		return "file not found"
	case errors.Is(err, fs.ErrPermission):
		return "permission denied"
	}
	var pe *fs.PathError
	if errors.As(err, &pe) {
		if errors.Is(pe.Err, syscall.EISDIR) {
			return "is a folder, not a file"
		}
		return pe.Err.Error()
	}
	return err.Error()
}

// lineReader yields trimmed lines with their numbers, skipping blank lines
// and '#' comments.
type lineReader struct {
	sc   *bufio.Scanner
	file string
	line int
	err  error
}

func newLineReader(r io.Reader, file string) *lineReader {
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 64*1024), 16*1024*1024)
	return &lineReader{sc: sc, file: file}
}

func (lr *lineReader) next() (string, bool) {
	for lr.sc.Scan() {
		lr.line++
		s := lr.sc.Text()
		if i := strings.IndexByte(s, '#'); i >= 0 {
			s = s[:i]
		}
		s = strings.TrimSpace(s)
		if s == "" {
			continue
		}
		if !utf8Text(s) {
			lr.err = inputErr(lr.file, lr.line, "", "not a text line (binary data?)")
			return "", false
		}
		return s, true
	}
	if err := lr.sc.Err(); err != nil {
		lr.err = inputErr(lr.file, lr.line+1, "", "read failed: %v", err)
	}
	return "", false
}

// utf8Text reports whether s holds printable text: no control bytes other
// than tab, and valid UTF-8.
func utf8Text(s string) bool {
	for _, r := range s {
		if r == 0xFFFD || (r < 0x20 && r != '\t' && r != '\r') || r == 0x7f {
			return false
		}
	}
	return true
}

// parseCoord reads one coordinate and converts it to millimetres.
func parseCoord(s string, unit Unit) (float64, error) {
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return 0, fmt.Errorf("bad number %q", s)
	}
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("coordinate %q is not a finite number", s)
	}
	v *= float64(unit)
	if math.Abs(v) > MaxCoordMM {
		return 0, fmt.Errorf("coordinate %s %s is beyond %.0f km (wrong unit?)", s, unit, MaxCoordMM/1e6)
	}
	return v, nil
}

// parsePoint reads three coordinates.
func parsePoint(f []string, unit Unit) (Vec, error) {
	var c [3]float64
	for i := 0; i < 3; i++ {
		v, err := parseCoord(f[i], unit)
		if err != nil {
			return Vec{}, err
		}
		c[i] = v
	}
	return Vec{X: c[0], Y: c[1], Z: c[2]}, nil
}

// checkFaceCorners reports a face with too few, too many or repeated corners.
func checkFaceCorners(corners []int) string {
	if len(corners) < MinCorners {
		return fmt.Sprintf("has %d corners; a panel needs at least %d", len(corners), MinCorners)
	}
	if len(corners) > MaxCorners {
		return fmt.Sprintf("has %d corners; pqfab takes panels of %d to %d corners", len(corners), MinCorners, MaxCorners)
	}
	for i := range corners {
		for j := i + 1; j < len(corners); j++ {
			if corners[i] == corners[j] {
				return fmt.Sprintf("corners %d and %d are the same node", i+1, j+1)
			}
		}
	}
	return ""
}
