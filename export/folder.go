package export

import (
	"bufio"
	"fmt"
	"io"
	"os"
	"path/filepath"
)

// WriteFolder builds an output folder atomically: fill writes every file
// into a new temporary sibling of dir, which then takes dir's place. A
// failed fill removes the temporary folder and leaves any old dir intact;
// no reader ever sees a half-written folder under dir's name.
func WriteFolder(dir string, fill func(tmp string) error) (err error) {
	dir = filepath.Clean(dir)
	parent := filepath.Dir(dir)
	if st, err := os.Stat(dir); err == nil && !st.IsDir() {
		return fmt.Errorf("export: %s exists and is not a folder", dir)
	}
	tmp, err := os.MkdirTemp(parent, "."+filepath.Base(dir)+".tmp-")
	if err != nil {
		return fmt.Errorf("export: %s: cannot write there: %w", dir, unwrapPath(err))
	}
	defer func() {
		if err != nil {
			os.RemoveAll(tmp)
		}
	}()
	if err = os.Chmod(tmp, 0o755); err != nil {
		return err
	}
	if err = fill(tmp); err != nil {
		return err
	}
	old := ""
	if _, serr := os.Stat(dir); serr == nil {
		old = tmp + ".old"
		if err = os.Rename(dir, old); err != nil {
			return fmt.Errorf("export: %s: cannot replace it: %w", dir, unwrapPath(err))
		}
	}
	if err = os.Rename(tmp, dir); err != nil {
		if old != "" {
			os.Rename(old, dir) // put the old folder back
		}
		return fmt.Errorf("export: %s: %w", dir, unwrapPath(err))
	}
	if old != "" {
		if rerr := os.RemoveAll(old); rerr != nil {
			return fmt.Errorf("export: %s written, but the previous copy %s could not be removed: %w", dir, old, rerr)
		}
	}
	return nil
}

// writeFile writes one file (inside a folder being built), checking the
// flush and close errors.
func writeFile(path string, write func(w io.Writer) error) error {
	f, err := os.Create(path)
	if err != nil {
		return fmt.Errorf("export: %s: %w", path, unwrapPath(err))
	}
	bw := bufio.NewWriterSize(f, 1<<16)
	if err := write(bw); err != nil {
		f.Close()
		return fmt.Errorf("export: %s: %w", filepath.Base(path), err)
	}
	if err := bw.Flush(); err != nil {
		f.Close()
		return fmt.Errorf("export: %s: %w", filepath.Base(path), err)
	}
	if err := f.Close(); err != nil {
		return fmt.Errorf("export: %s: %w", filepath.Base(path), err)
	}
	return nil
}
