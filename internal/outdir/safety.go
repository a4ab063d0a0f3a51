package outdir

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"syscall"
)

// Options say what the writers may replace.
type Options struct {
	// Force replaces an existing folder or file that pqfab did not write.
	// It never replaces what Keep protects.
	Force bool
	// Keep lists files that must survive the write: the job file and the
	// net file(s). A folder holding one of them, or a parent of such a
	// folder, is never replaced, nor is a file itself.
	Keep []string
	// OnTemp, if set, is told the temporary folder's path before anything
	// is written into it (so that a signal handler can remove it).
	OnTemp func(path string)
}

// MarkerFile is written last into every output folder; its presence tells
// a later run that pqfab wrote the folder and may replace it.
const MarkerFile = ".pqfab-output"

// markerText is the marker's content (the same bytes every time).
const markerText = "This folder was written by pqfab. While this file is here, pqfab may replace the folder\n" +
	"when it builds into it again; remove this file to keep the folder from being replaced.\n"

// buildingText marks a temporary folder still being filled.
const buildingText = "pqfab is writing this folder; an interrupted run leaves it behind and the next run removes it.\n"

// Signatures that mark a file as written by pqfab: the OBJ writer's
// header line and the JSON reports' first key.
var ownSignatures = [][]byte{[]byte("written by pqfab"), []byte(`"written_by": "pqfab"`), []byte(`"written_by":"pqfab"`)}

// ErrNotOurs is wrapped by errors for an output path that holds something
// pqfab did not write.
var ErrNotOurs = errors.New("not written by pqfab")

// leftover names: a temporary folder is ".DIR.pqfab-tmp-ID", the old copy
// during the swap ".DIR.pqfab-old-ID", the lock ".DIR.pqfab-lock".
func tmpPrefix(base string) string { return "." + base + ".pqfab-tmp-" }
func oldPrefix(base string) string { return "." + base + ".pqfab-old-" }
func lockName(base string) string  { return "." + base + ".pqfab-lock" }

// guard refuses to replace path (a folder when dir is set, else a file)
// when that would lose a kept file, the current folder, the home folder
// or the root, whatever Force says.
func guard(path string, dir bool, opt Options) error {
	abs, err := realAbs(path)
	if err != nil {
		return fmt.Errorf("%s: %w", path, err)
	}
	refuse := func(why string) error {
		return fmt.Errorf("%s: pqfab never replaces %s (not even with --force): choose another output", path, why)
	}
	if abs == string(filepath.Separator) {
		return refuse("the root folder")
	}
	for _, k := range opt.Keep {
		if k == "" {
			continue
		}
		ka, err := realAbs(k)
		if err != nil {
			continue
		}
		if ka == abs {
			return refuse("an input file of this job (" + k + ")")
		}
		if dir && within(ka, abs) {
			return refuse("a folder holding an input file of this job (" + k + ")")
		}
	}
	if home, err := os.UserHomeDir(); err == nil && home != "" {
		if h, err := realAbs(home); err == nil && dir && within(h, abs) {
			return refuse("the home folder or a folder above it")
		}
	}
	if cwd, err := os.Getwd(); err == nil && dir {
		if c, err := realAbs(cwd); err == nil && within(c, abs) {
			return refuse("the current folder or a folder above it")
		}
	}
	return nil
}

// realAbs returns the absolute path with symbolic links resolved as far
// as the path exists.
func realAbs(p string) (string, error) {
	abs, err := filepath.Abs(p)
	if err != nil {
		return "", err
	}
	// Resolve the longest existing prefix, keep the rest as written.
	rest := ""
	for cur := abs; ; {
		if r, err := filepath.EvalSymlinks(cur); err == nil {
			return filepath.Join(r, rest), nil
		}
		parent := filepath.Dir(cur)
		if parent == cur {
			return abs, nil
		}
		rest = filepath.Join(filepath.Base(cur), rest)
		cur = parent
	}
}

// within reports whether p is dir or lies below it.
func within(p, dir string) bool {
	if p == dir {
		return true
	}
	rel, err := filepath.Rel(dir, p)
	return err == nil && rel != ".." && !strings.HasPrefix(rel, ".."+string(filepath.Separator))
}

// replaceable checks that an existing folder dir may be replaced: it is
// empty, or pqfab wrote it (MarkerFile), or force is set.
func replaceable(dir string, force bool) error {
	ents, err := os.ReadDir(dir)
	if err != nil {
		return fmt.Errorf("%s: %w", dir, unwrapPath(err))
	}
	if len(ents) == 0 || force {
		return nil
	}
	if b, err := os.ReadFile(filepath.Join(dir, MarkerFile)); err == nil && string(b) == markerText {
		return nil
	}
	var names []string
	for _, e := range ents {
		if len(names) == 3 {
			names = append(names, "…")
			break
		}
		names = append(names, e.Name())
	}
	what := fmt.Sprintf("%d entries", len(ents))
	if len(ents) == 1 {
		what = "1 entry"
	}
	return fmt.Errorf("%s exists and pqfab did not write it (it holds %s: %s): %w; choose another folder, or add --force to replace it",
		dir, what, strings.Join(names, ", "), ErrNotOurs)
}

// ownedFile reports whether the file at path was written by pqfab (its
// first kilobytes carry one of pqfab's signatures).
func ownedFile(path string) bool {
	f, err := os.Open(path)
	if err != nil {
		return false
	}
	defer f.Close()
	head := make([]byte, 4096)
	n, _ := io.ReadFull(f, head)
	for _, s := range ownSignatures {
		if bytes.Contains(head[:n], s) {
			return true
		}
	}
	return false
}

// checkFile checks that path may be written: a new file, or a regular
// file pqfab wrote, or any regular file with force; never a kept file.
func checkFile(path string, opt Options) error {
	if err := guard(path, false, opt); err != nil {
		return err
	}
	st, err := os.Lstat(path)
	if errors.Is(err, fs.ErrNotExist) {
		return nil
	} else if err != nil {
		return fmt.Errorf("%s: %w", path, unwrapPath(err))
	}
	if !st.Mode().IsRegular() {
		return fmt.Errorf("%s exists and is not a regular file: choose another name", path)
	}
	if opt.Force || ownedFile(path) {
		return nil
	}
	return fmt.Errorf("%s exists and pqfab did not write it: %w; choose another name, or add --force to replace it", path, ErrNotOurs)
}

// TempFolder tracks the temporary folder of a write for a signal handler:
// Options.OnTemp = t.Set, and on a signal t.Remove. Its methods are
// safe to call from several goroutines.
type TempFolder struct {
	mu   sync.Mutex
	path string
}

// Set records the temporary folder's path.
func (t *TempFolder) Set(path string) { t.mu.Lock(); t.path = path; t.mu.Unlock() }

// Remove removes the temporary folder, if any, and keeps t locked, so that
// Done blocks until the process ends: call it only on the way out.
func (t *TempFolder) Remove() {
	t.mu.Lock()
	if t.path != "" {
		RemoveTemp(t.path)
	}
}

// Done forgets the folder once the write is over; it waits for a Remove
// that has begun.
func (t *TempFolder) Done() { t.Set("") }

// RemoveTemp removes a temporary output folder at once, such as when the
// process is told to stop: it first renames the folder so that writers
// still running can add nothing more to it, then removes it.
func RemoveTemp(tmp string) error {
	dead := tmp + "-stopped"
	if os.Rename(tmp, dead) == nil {
		tmp = dead
	}
	var err error
	for try := 0; try < 3; try++ {
		if err = os.RemoveAll(tmp); err == nil {
			return nil
		}
	}
	return err
}

// RemoveOwnFile removes the file at path if pqfab wrote it, such as a
// stale diagnostic report; it does nothing when there is no such file.
func RemoveOwnFile(path string) error {
	if st, err := os.Lstat(path); err != nil || !st.Mode().IsRegular() || !ownedFile(path) {
		return nil
	}
	return os.Remove(path)
}

// folderLock is an exclusive lock on an output folder's name, held while
// a build writes it, so two builds into one folder cannot interleave.
type folderLock struct{ f *os.File }

// lockFolder takes the lock of dir (a file ".DIR.pqfab-lock" beside it),
// failing at once when another process holds it. The lock is an advisory
// flock: the system releases it when the process ends, however it ends.
func lockFolder(dir string) (*folderLock, error) {
	path := filepath.Join(filepath.Dir(dir), lockName(filepath.Base(dir)))
	for try := 0; try < 5; try++ {
		f, err := os.OpenFile(path, os.O_RDWR|os.O_CREATE, 0o644)
		if err != nil {
			return nil, fmt.Errorf("%s: cannot write there: %w", dir, unwrapPath(err))
		}
		if err := syscall.Flock(int(f.Fd()), syscall.LOCK_EX|syscall.LOCK_NB); err != nil {
			f.Close()
			if errors.Is(err, syscall.EWOULDBLOCK) {
				return nil, fmt.Errorf("another pqfab build is writing %s; wait for it to finish (or remove %s if no build runs)", dir, path)
			}
			return nil, fmt.Errorf("%s: cannot lock: %w", dir, err)
		}
		// The file may have been removed by the holder we waited for:
		// hold the lock only on the file that is still there.
		var a, b syscall.Stat_t
		if syscall.Fstat(int(f.Fd()), &a) == nil && syscall.Stat(path, &b) == nil && a.Ino == b.Ino && a.Dev == b.Dev {
			return &folderLock{f: f}, nil
		}
		f.Close()
	}
	return nil, fmt.Errorf("%s: cannot take the lock %s", dir, path)
}

// unlock removes the lock file and releases the lock.
func (l *folderLock) unlock() {
	os.Remove(l.f.Name())
	l.f.Close()
}

// recoverLeftovers finishes or undoes what an interrupted run of pqfab
// left beside dir: an old copy whose swap was cut short goes back to dir's
// name when dir is missing (else it is removed), and temporary folders
// holding pqfab's marker are removed, and so are empty ones (a run stopped
// before it wrote the marker). Other entries are left alone: they are not
// pqfab's.
func recoverLeftovers(dir string) error {
	parent, base := filepath.Dir(dir), filepath.Base(dir)
	ents, err := os.ReadDir(parent)
	if err != nil {
		return nil // MkdirTemp reports the real problem
	}
	for _, e := range ents {
		name := e.Name()
		p := filepath.Join(parent, name)
		switch {
		case strings.HasPrefix(name, oldPrefix(base)) && e.IsDir():
			if _, err := os.Lstat(dir); errors.Is(err, fs.ErrNotExist) {
				if err := os.Rename(p, dir); err != nil {
					return fmt.Errorf("%s: an interrupted earlier run left the previous folder as %s and it cannot be put back: %w", dir, name, unwrapPath(err))
				}
			} else if err := os.RemoveAll(p); err != nil {
				return fmt.Errorf("%s: cannot remove the leftover %s: %w", dir, name, unwrapPath(err))
			}
		case strings.HasPrefix(name, tmpPrefix(base)) && e.IsDir():
			if _, err := os.Stat(filepath.Join(p, MarkerFile)); err == nil {
				if err := os.RemoveAll(p); err != nil {
					return fmt.Errorf("%s: cannot remove the leftover %s: %w", dir, name, unwrapPath(err))
				}
			} else {
				os.Remove(p) // an empty one, stopped before its marker; a full one is not ours
			}
		}
	}
	return nil
}
