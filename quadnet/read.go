package quadnet

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
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
// panels file is found by PanelsPathFor). Files are opened with
// OpenRegular, so a FIFO, device, socket or folder is refused at once.
func ReadFile(path string, unit Unit) (*Net, error) {
	return ReadFrom(func(name string) (io.ReadCloser, error) { return OpenRegular(name) }, path, unit)
}

// OpenRegular opens a regular file for reading. It refuses, with an
// InputError naming the path, a path that does not exist, a folder, and a
// FIFO, device or socket (wrapping ErrNotRegular), without blocking: it
// checks the path before opening it, opens it without waiting for a
// writer, and checks the opened file again.
func OpenRegular(path string) (*os.File, error) {
	fi, err := os.Stat(path)
	if err != nil {
		return nil, &InputError{File: path, Msg: openMsg(err), Err: err}
	}
	if err := checkRegular(path, fi); err != nil {
		return nil, err
	}
	f, err := os.OpenFile(path, os.O_RDONLY|syscall.O_NONBLOCK, 0)
	if err != nil {
		return nil, &InputError{File: path, Msg: openMsg(err), Err: err}
	}
	if fi, err = f.Stat(); err == nil {
		err = checkRegular(path, fi)
	}
	if err != nil {
		f.Close()
		return nil, err
	}
	return f, nil
}

func checkRegular(path string, fi fs.FileInfo) error {
	switch {
	case fi.IsDir():
		return &InputError{File: path, Msg: "is a folder, not a file", Err: ErrNotRegular}
	case !fi.Mode().IsRegular():
		return &InputError{File: path, Msg: "is not a regular file (a FIFO, device or socket)", Err: ErrNotRegular}
	}
	return nil
}

// ReadFrom is ReadFile with files opened by open, such as an embedded
// file system's Open. An *InputError from open is returned as it is.
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
		nf, err := openFile(open, path)
		if err != nil {
			return nil, err
		}
		defer nf.Close()
		pf, err := openFile(open, pp)
		if err != nil {
			return nil, err
		}
		defer pf.Close()
		return ReadCSV(nf, path, pf, pp, unit)
	default:
		return nil, &InputError{File: path, Msg: "unknown net format (want .obj, .off or a nodes/panels .csv pair)"}
	}
	f, err := openFile(open, path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	return read(f, path, unit)
}

func openFile(open func(name string) (io.ReadCloser, error), path string) (io.ReadCloser, error) {
	f, err := open(path)
	if err != nil {
		var ie *InputError
		if errors.As(err, &ie) {
			return nil, err
		}
		return nil, &InputError{File: path, Msg: openMsg(err), Err: err}
	}
	return f, nil
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

// checkFaceCorners reports a face with too few, too many or repeated corners.
func checkFaceCorners(corners []int) string {
	if msg := checkCornerCount(len(corners)); msg != "" {
		return msg
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

// checkCornerCount reports a panel of too few or too many corners.
func checkCornerCount(k int) string {
	if k < MinCorners {
		return fmt.Sprintf("has %d corners; a panel needs at least %d", k, MinCorners)
	}
	if k > MaxCorners {
		return fmt.Sprintf("has %d corners; pqfab takes panels of %d to %d corners", k, MinCorners, MaxCorners)
	}
	return ""
}

// tooMany is the error for the node or panel past a count limit.
func tooMany(file string, line int, elem, what string, limit int) *InputError {
	return &InputError{File: file, Line: line, Elem: elem, Err: ErrTooLarge,
		Msg: fmt.Sprintf("more than %d %s, the most pqfab takes", limit, what)}
}
