//go:build unix

package quadnet

import (
	"errors"
	"net"
	"os"
	"path/filepath"
	"syscall"
	"testing"
	"time"
)

// TestOpenRegular: FIFOs, devices, sockets and folders are refused at once,
// without blocking.
func TestOpenRegular(t *testing.T) {
	dir := t.TempDir()
	fifo := filepath.Join(dir, "pipe.obj")
	if err := syscall.Mkfifo(fifo, 0o600); err != nil {
		t.Skip("no FIFOs here:", err)
	}
	dev := filepath.Join(dir, "null.obj")
	if err := os.Symlink("/dev/null", dev); err != nil {
		t.Fatal(err)
	}
	sock := filepath.Join(dir, "s.obj")
	l, err := net.Listen("unix", sock)
	if err != nil {
		t.Fatal(err)
	}
	defer l.Close()
	folder := filepath.Join(dir, "folder.obj")
	if err := os.Mkdir(folder, 0o755); err != nil {
		t.Fatal(err)
	}
	regular := filepath.Join(dir, "ok.obj")
	if err := os.WriteFile(regular, []byte(gridOBJ(1, 1, 1000)), 0o644); err != nil {
		t.Fatal(err)
	}
	tests := []struct{ path, want string }{
		{fifo, fifo + ": is not a regular file (a FIFO, device or socket)"},
		{dev, dev + ": is not a regular file (a FIFO, device or socket)"},
		{sock, sock + ": is not a regular file (a FIFO, device or socket)"},
		{folder, folder + ": is a folder, not a file"},
		{filepath.Join(dir, "none.obj"), filepath.Join(dir, "none.obj") + ": file not found"},
	}
	for _, tc := range tests {
		done := make(chan error, 1)
		go func() { _, err := ReadFile(tc.path, MM); done <- err }()
		select {
		case err := <-done:
			if err == nil || err.Error() != tc.want {
				t.Errorf("got %v, want %s", err, tc.want)
			}
			var ie *InputError
			if !errors.As(err, &ie) {
				t.Errorf("%T is not an InputError", err)
			}
		case <-time.After(10 * time.Second):
			t.Fatalf("%s: ReadFile blocks", tc.path)
		}
	}
	f, err := OpenRegular(regular)
	if err != nil {
		t.Fatal(err)
	}
	if err := f.Close(); err != nil {
		t.Fatal(err)
	}
	if _, err := OpenRegular(fifo); !errors.Is(err, ErrNotRegular) {
		t.Errorf("FIFO: %v does not wrap ErrNotRegular", err)
	}
}
