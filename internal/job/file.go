package job

import (
	"io"

	"pqfab/quadnet"
)

// ReadFile reads and parses a job file from disk: a regular file (never a
// FIFO or device, which could block) of at most MaxFileBytes.
func ReadFile(path string) (*Job, error) {
	f, err := quadnet.OpenRegular(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	data, err := io.ReadAll(io.LimitReader(f, MaxFileBytes+1))
	if err != nil {
		return nil, &quadnet.InputError{File: path, Msg: "read failed: " + err.Error()}
	}
	return Parse(data, path)
}
