package quadnet

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"
)

// Size limits of the readers. A reader stops with an error naming the line
// and wrapping ErrTooLarge as soon as its input passes one, so memory stays
// bounded whatever it is fed (an endless stream, a file without line
// breaks). The counts are well above the largest gridshells built (tens of
// thousands of panels).
const (
	// MaxLineBytes is the longest line a net file may have (1 MiB).
	MaxLineBytes = 1 << 20
	// MaxLines is the most lines a net file may have, blank and comment
	// lines included.
	MaxLines = 10_000_000
	// MaxNodes is the most nodes a net may have.
	MaxNodes = 1_000_000
	// MaxPanels is the most panels a net may have.
	MaxPanels = 500_000
	// MaxFileBytes is the largest net file pqfab reads (1 GiB, several
	// times a net of MaxNodes and MaxPanels with texture and normal lines).
	MaxFileBytes = 1 << 30
	// MaxIDBytes is the longest node or panel id a CSV net may use.
	MaxIDBytes = 64
)

// bom is the UTF-8 byte-order mark some editors put at the start of a file.
var bom = []byte("\ufeff")

// textReader delivers a text file with every line end (LF, CRLF or a lone
// CR) turned into LF and a leading byte-order mark dropped. It fails, with
// an InputError wrapping ErrTooLarge, on a line longer than MaxLineBytes
// and after maxBytes bytes (MaxFileBytes).
type textReader struct {
	r        *bufio.Reader
	file     string
	maxBytes int64
	total    int64 // bytes read
	lines    int   // line ends delivered
	col      int   // bytes delivered on the current line
	cr       bool  // the last byte read was a CR
	started  bool
	err      error
}

func newTextReader(r io.Reader, file string) *textReader {
	return &textReader{r: bufio.NewReaderSize(r, 64<<10), file: file, maxBytes: MaxFileBytes}
}

func (t *textReader) Read(p []byte) (int, error) {
	if t.err != nil {
		return 0, t.err
	}
	if !t.started {
		t.started = true
		if b, _ := t.r.Peek(len(bom)); bytes.Equal(b, bom) {
			_, _ = t.r.Discard(len(bom)) // cannot fail: the bytes are buffered
		}
	}
	for {
		n, err := t.r.Read(p)
		over := false
		if rem := t.maxBytes - t.total; int64(n) > rem {
			n, over = int(rem), true
		}
		t.total += int64(n)
		w, ok := t.convert(p[:n])
		switch {
		case !ok:
			t.err = &InputError{File: t.file, Line: t.lines + 1, Err: ErrTooLarge,
				Msg: fmt.Sprintf("line is longer than %d bytes (%s); is this a net file?", MaxLineBytes, byteSize(MaxLineBytes))}
			return w, t.err
		case over:
			t.err = &InputError{File: t.file, Line: t.lines + 1, Err: ErrTooLarge,
				Msg: fmt.Sprintf("the file is larger than %s, the most pqfab reads", byteSize(t.maxBytes))}
			return w, t.err
		case err != nil && !errors.Is(err, io.EOF):
			t.err = inputErr(t.file, t.lines+1, "", "read failed: %v", err)
			return w, t.err
		case err != nil:
			return w, err
		case w > 0 || n == 0:
			return w, nil
		}
		// The chunk was only the LF of a CRLF pair: read on.
	}
}

// convert turns the line ends of b into LF in place, counting lines, and
// returns the bytes to deliver. It stops (ok false) inside a line longer
// than MaxLineBytes, after the bytes before that line.
func (t *textReader) convert(b []byte) (w int, ok bool) {
	if !t.cr && bytes.IndexByte(b, '\r') < 0 {
		// Fast path: LF line ends only; nothing to rewrite.
		for rest := b; ; {
			i := bytes.IndexByte(rest, '\n')
			seg := i
			if i < 0 {
				seg = len(rest)
			}
			if t.col+seg > MaxLineBytes {
				return len(b) - len(rest), false
			}
			if i < 0 {
				t.col += seg
				return len(b), true
			}
			t.lines++
			t.col = 0
			rest = rest[i+1:]
		}
	}
	lineStart := 0
	for _, c := range b {
		if c == '\n' && t.cr {
			t.cr = false
			continue // the LF of a CRLF pair
		}
		t.cr = c == '\r'
		if c == '\r' {
			c = '\n'
		}
		if c == '\n' {
			t.lines++
			t.col = 0
			lineStart = w + 1
		} else if t.col++; t.col > MaxLineBytes {
			return lineStart, false
		}
		b[w] = c
		w++
	}
	return w, true
}

// byteSize writes a power-of-two size for people: "1 MiB", "1 GiB".
func byteSize(n int64) string {
	switch {
	case n >= 1<<30 && n%(1<<30) == 0:
		return strconv.FormatInt(n>>30, 10) + " GiB"
	case n >= 1<<20 && n%(1<<20) == 0:
		return strconv.FormatInt(n>>20, 10) + " MiB"
	}
	return strconv.FormatInt(n, 10) + " bytes"
}

// lineReader yields the lines of a text file with their numbers, skipping
// blank lines and comments.
type lineReader struct {
	br   *bufio.Reader
	file string
	line int
	buf  []byte
	csv  bool // comments are lines starting with '#' (else '#' starts a comment anywhere)
	err  error
}

func newLineReader(r io.Reader, file string) *lineReader {
	return &lineReader{br: bufio.NewReaderSize(newTextReader(r, file), 64<<10), file: file}
}

// readLine returns the next raw line without its line end, or io.EOF, or
// an InputError.
func (lr *lineReader) readLine() ([]byte, error) {
	lr.buf = lr.buf[:0]
	for {
		b, err := lr.br.ReadSlice('\n')
		lr.buf = append(lr.buf, b...)
		switch {
		case err == nil:
			return lr.buf[:len(lr.buf)-1], nil
		case errors.Is(err, bufio.ErrBufferFull):
			continue // a line longer than the buffer; textReader caps it
		case errors.Is(err, io.EOF) && len(lr.buf) > 0:
			return lr.buf, nil // last line without a line end
		}
		return nil, err
	}
}

// next returns the next line that is not blank and not a comment, trimmed
// of surrounding space and (for OBJ and OFF) of a trailing '#' comment. At
// the end, or on an error (kept in lr.err), it returns false.
func (lr *lineReader) next() (string, bool) {
	if lr.err != nil {
		return "", false
	}
	for {
		b, err := lr.readLine()
		if err != nil {
			if !errors.Is(err, io.EOF) {
				lr.err = err
			}
			return "", false
		}
		lr.line++
		if lr.line > MaxLines {
			lr.err = &InputError{File: lr.file, Line: lr.line, Err: ErrTooLarge, Msg: "more than 10000000 lines, the most pqfab reads"}
			return "", false
		}
		if !lr.csv {
			if i := bytes.IndexByte(b, '#'); i >= 0 {
				b = b[:i]
			}
		}
		b = bytes.TrimSpace(b)
		if len(b) == 0 || (lr.csv && b[0] == '#') {
			continue
		}
		s := string(b)
		if !utf8Text(s) {
			lr.err = inputErr(lr.file, lr.line, "", "not a text line (binary data?)")
			return "", false
		}
		return s, true
	}
}

// utf8Text reports whether s holds printable text: no control bytes other
// than tab, and valid UTF-8.
func utf8Text(s string) bool {
	for _, r := range s {
		if r == 0xFFFD || (r < 0x20 && r != '\t') || r == 0x7f {
			return false
		}
	}
	return true
}

// splitCSV splits one CSV line into cells (RFC 4180 within the line: cells
// separated by commas; a cell in double quotes may hold commas and doubled
// quotes). A cell cannot hold a line break. It returns a message for a
// malformed line.
func splitCSV(s string, cells []string) ([]string, string) {
	cells = cells[:0]
	for k := 1; ; k++ {
		if t := strings.TrimLeft(s, " \t"); strings.HasPrefix(t, `"`) {
			var b strings.Builder
			t = t[1:]
			for {
				i := strings.IndexByte(t, '"')
				if i < 0 {
					return nil, "cell " + strconv.Itoa(k) + ": the quote is not closed on this line (a cell cannot hold a line break)"
				}
				b.WriteString(t[:i])
				t = t[i+1:]
				if strings.HasPrefix(t, `"`) {
					b.WriteByte('"')
					t = t[1:]
					continue
				}
				break
			}
			cells = append(cells, b.String())
			t = strings.TrimLeft(t, " \t")
			if t == "" {
				return cells, ""
			}
			if t[0] != ',' {
				return nil, "cell " + strconv.Itoa(k) + ": text after the closing quote"
			}
			s = t[1:]
			continue
		}
		i := strings.IndexByte(s, ',')
		cell := s
		if i >= 0 {
			cell = s[:i]
		}
		if strings.IndexByte(cell, '"') >= 0 {
			return nil, "cell " + strconv.Itoa(k) + ": a quote inside a cell that does not start with one"
		}
		cells = append(cells, cell)
		if i < 0 {
			return cells, ""
		}
		s = s[i+1:]
	}
}
