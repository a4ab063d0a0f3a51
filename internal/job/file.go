package job

import (
	"errors"
	"io"
	"io/fs"
	"os"

	"pqfab/geom"
)

// ReadFile reads and parses a job file from disk: a regular file (never a
// FIFO or device, which could block) of at most MaxFileBytes.
func ReadFile(path string) (*Job, error) {
	st, err := os.Stat(path)
	if err != nil {
		var pe *fs.PathError
		if errors.As(err, &pe) {
			err = pe.Err
		}
		return nil, &geom.InputError{File: path, Msg: err.Error()}
	}
	if !st.Mode().IsRegular() {
		return nil, &geom.InputError{File: path, Msg: "is not a regular file (a folder, FIFO, device or socket)"}
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, &geom.InputError{File: path, Msg: errors.Unwrap(err).Error()}
	}
	defer f.Close()
	data, err := io.ReadAll(io.LimitReader(f, MaxFileBytes+1))
	if err != nil {
		return nil, &geom.InputError{File: path, Msg: "read failed: " + err.Error()}
	}
	return Parse(data, path)
}
