package outdir

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"
	"strings"
)

// WriteFolder builds an output folder atomically: fill writes every file
// into a new temporary sibling of dir (".DIR.pqfab-tmp-ID", marked as
// pqfab's from its first moment), the marker file is written last, and
// the folder then takes dir's place. A failed fill removes the temporary
// folder and leaves any old dir intact; no reader ever sees a half-written
// folder under dir's name.
//
// Safety: an existing dir is replaced only when it is empty, when pqfab
// wrote it (its MarkerFile) or with opt.Force; never when it is the root,
// the home or current folder or one above them, or holds a file listed in
// opt.Keep. A lock beside dir keeps two builds from writing it at once.
// The swap renames dir to ".DIR.pqfab-old-ID" and the new folder to dir;
// a run killed between the two renames leaves both, and the next run
// puts the old folder back before it starts (recoverLeftovers), so no run
// ever loses the previous folder.
func WriteFolder(dir string, opt Options, fill func(tmp string) error) (err error) {
	dir = filepath.Clean(dir)
	if err := CheckFolder(dir, opt); err != nil {
		return err
	}
	parent, base := filepath.Dir(dir), filepath.Base(dir)
	lock, err := lockFolder(dir)
	if err != nil {
		return err
	}
	defer lock.unlock()
	if err := recoverLeftovers(dir); err != nil {
		return err
	}
	if _, err := os.Stat(dir); err == nil {
		if err := replaceable(dir, opt.Force); err != nil {
			return err
		}
	}
	tmp, err := makeTemp(parent, tmpPrefix(base), opt.OnTemp)
	if err != nil {
		return fmt.Errorf("%s: cannot write there: %w", dir, unwrapPath(err))
	}
	defer func() {
		if err != nil {
			os.RemoveAll(tmp)
		}
	}()
	marker := filepath.Join(tmp, MarkerFile)
	if err = os.WriteFile(marker, []byte(buildingText), 0o644); err != nil {
		return fmt.Errorf("%s: %w", dir, unwrapPath(err))
	}
	if err = fill(tmp); err != nil {
		return err
	}
	if err = FillFile(marker, func(w io.Writer) error { _, err := io.WriteString(w, markerText); return err }); err != nil {
		return err
	}
	old := ""
	if _, serr := os.Lstat(dir); serr == nil {
		old = filepath.Join(parent, oldPrefix(base)+strings.TrimPrefix(filepath.Base(tmp), tmpPrefix(base)))
		if err = os.Rename(dir, old); err != nil {
			return fmt.Errorf("%s: cannot replace it: %w", dir, unwrapPath(err))
		}
	}
	if err = os.Rename(tmp, dir); err != nil {
		if old != "" {
			os.Rename(old, dir) // put the old folder back
		}
		return fmt.Errorf("%s: %w", dir, unwrapPath(err))
	}
	if old != "" {
		if rerr := os.RemoveAll(old); rerr != nil {
			return fmt.Errorf("%s written, but the previous copy %s could not be removed: %w", dir, old, rerr)
		}
	}
	return nil
}

// makeTemp makes a new folder prefix+ID in parent, telling onTemp its
// path before it exists (so a signal handler never misses it).
func makeTemp(parent, prefix string, onTemp func(string)) (string, error) {
	for try := 0; ; try++ {
		p := filepath.Join(parent, prefix+strconv.FormatUint(uint64(rand.Uint32()), 10))
		if onTemp != nil {
			onTemp(p)
		}
		err := os.Mkdir(p, 0o755)
		if err == nil || !errors.Is(err, fs.ErrExist) || try == 100 {
			return p, err
		}
	}
}

// CheckFolder reports, before any work is done, whether WriteFolder could
// write dir with opt: the same checks, without taking the lock.
func CheckFolder(dir string, opt Options) error {
	dir = filepath.Clean(dir)
	if err := guard(dir, true, opt); err != nil {
		return err
	}
	if st, err := os.Stat(dir); err == nil && !st.IsDir() {
		return fmt.Errorf("%s exists and is not a folder", dir)
	} else if err == nil {
		if err := replaceable(dir, opt.Force); err != nil {
			return err
		}
	}
	if st, err := os.Stat(filepath.Dir(dir)); err != nil || !st.IsDir() {
		return fmt.Errorf("%s: cannot write there: %s is not a folder", dir, filepath.Dir(dir))
	}
	return nil
}

// CheckFiles reports, before any work is done, whether WriteFileAtomic
// could write each of paths with opt, and refuses two outputs that are
// the same file. Empty paths are skipped.
func CheckFiles(opt Options, paths ...string) error {
	seen := map[string]string{}
	for _, p := range paths {
		if p == "" {
			continue
		}
		abs, err := realAbs(p)
		if err != nil {
			return fmt.Errorf("%s: %w", p, err)
		}
		if q, dup := seen[abs]; dup {
			return fmt.Errorf("%s and %s are the same file: give each output its own name", q, p)
		}
		seen[abs] = p
		if err := checkFile(p, opt); err != nil {
			return err
		}
	}
	return nil
}

// FillFile writes one file inside a folder being built (from WriteFolder's
// fill), checking the flush and close errors. It checks nothing else: the
// folder is new and pqfab's own.
func FillFile(path string, write func(w io.Writer) error) error {
	f, err := os.Create(path)
	if err != nil {
		return fmt.Errorf("%s: %w", path, unwrapPath(err))
	}
	bw := bufio.NewWriterSize(f, 1<<16)
	if err := write(bw); err != nil {
		f.Close()
		return fmt.Errorf("%s: %w", filepath.Base(path), err)
	}
	if err := bw.Flush(); err != nil {
		f.Close()
		return fmt.Errorf("%s: %w", filepath.Base(path), err)
	}
	if err := f.Close(); err != nil {
		return fmt.Errorf("%s: %w", filepath.Base(path), err)
	}
	return nil
}
