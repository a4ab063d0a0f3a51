package outdir

import (
	"bufio"
	"fmt"
	"io"
	"os"
	"path/filepath"
)

// WriteFileAtomic writes a file through a temporary sibling that is renamed
// into place only when write succeeded, so a failed run leaves any old
// file intact and never a half-written one. An existing file is replaced
// only when pqfab wrote it (its signature in the first kilobytes) or with
// opt.Force, and never when opt.Keep lists it.
func WriteFileAtomic(path string, opt Options, write func(w io.Writer) error) (err error) {
	if err := checkFile(path, opt); err != nil {
		return err
	}
	dir := filepath.Dir(path)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp-*")
	if err != nil {
		return fmt.Errorf("%s: cannot write there: %w", path, unwrapPath(err))
	}
	defer func() {
		if err != nil {
			os.Remove(tmp.Name())
		}
	}()
	bw := bufio.NewWriterSize(tmp, 1<<16)
	if err = write(bw); err != nil {
		tmp.Close()
		return fmt.Errorf("%s: %w", path, err)
	}
	if err = bw.Flush(); err != nil {
		tmp.Close()
		return fmt.Errorf("%s: %w", path, err)
	}
	if err = tmp.Close(); err != nil {
		return fmt.Errorf("%s: %w", path, err)
	}
	if err = os.Chmod(tmp.Name(), 0o644); err != nil {
		return fmt.Errorf("%s: %w", path, err)
	}
	if err = os.Rename(tmp.Name(), path); err != nil {
		return fmt.Errorf("%s: %w", path, unwrapPath(err))
	}
	return nil
}

func unwrapPath(err error) error {
	if pe, ok := err.(*os.PathError); ok {
		return pe.Err
	}
	if le, ok := err.(*os.LinkError); ok {
		return le.Err
	}
	return err
}
