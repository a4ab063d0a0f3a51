package xlsx

import (
	"errors"
	"io"
)

// chunkSize is the size of one chunk of a chunks buffer.
const chunkSize = 1 << 20

// chunks is an in-memory file written once from the start and then read
// at any offset: a list of fixed-size chunks, so that growing it never
// copies what it holds and it holds no spare room (a schedule of a large
// net is some 100 MB).
type chunks struct {
	bufs [][]byte
	size int64
}

// Write appends p.
func (c *chunks) Write(p []byte) (int, error) {
	n := len(p)
	for len(p) > 0 {
		if k := len(c.bufs); k == 0 || len(c.bufs[k-1]) == chunkSize {
			c.bufs = append(c.bufs, make([]byte, 0, chunkSize))
		}
		last := &c.bufs[len(c.bufs)-1]
		m := min(len(p), chunkSize-len(*last))
		*last = append(*last, p[:m]...)
		p = p[m:]
	}
	c.size += int64(n)
	return n, nil
}

// ReadAt reads len(p) bytes from offset off.
func (c *chunks) ReadAt(p []byte, off int64) (int, error) {
	if off < 0 {
		return 0, errors.New("chunks: negative offset")
	}
	if off >= c.size {
		return 0, io.EOF
	}
	n := 0
	for n < len(p) && off < c.size {
		b := c.bufs[off/chunkSize][off%chunkSize:]
		m := copy(p[n:], b)
		n += m
		off += int64(m)
	}
	if n < len(p) {
		return n, io.EOF
	}
	return n, nil
}
