package xlsx

import (
	"bytes"
	"io"
	"math/rand/v2"
	"testing"
)

// The chunks buffer reads back what was written, at any offset and across
// chunk borders, the same as bytes.Reader over the same bytes.
func TestChunksReadAt(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	want := make([]byte, 3*chunkSize+12345)
	for i := range want {
		want[i] = byte(rng.IntN(256))
	}
	var c chunks
	for rest := want; len(rest) > 0; {
		n := min(len(rest), 1+rng.IntN(chunkSize/2))
		if k, err := c.Write(rest[:n]); k != n || err != nil {
			t.Fatalf("write %d: %d, %v", n, k, err)
		}
		rest = rest[n:]
	}
	if c.size != int64(len(want)) {
		t.Fatalf("size %d, want %d", c.size, len(want))
	}
	ref := bytes.NewReader(want)
	offs := []int64{0, chunkSize - 1, chunkSize, 2*chunkSize + 7, int64(len(want)) - 10, int64(len(want)), int64(len(want)) + 5}
	for range 200 {
		offs = append(offs, rng.Int64N(int64(len(want))))
	}
	for _, off := range offs {
		for _, n := range []int{0, 1, 100, chunkSize + 3} {
			got, wantBuf := make([]byte, n), make([]byte, n)
			k, err := c.ReadAt(got, off)
			kw, errw := ref.ReadAt(wantBuf, off)
			if k != kw || !bytes.Equal(got[:k], wantBuf[:kw]) || (err == nil) != (errw == nil) || (err != nil && err != io.EOF) {
				t.Fatalf("ReadAt(%d bytes, %d): %d, %v; bytes.Reader %d, %v", n, off, k, err, kw, errw)
			}
		}
	}
}
