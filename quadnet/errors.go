package quadnet

import (
	"errors"
	"fmt"
	"strconv"
	"unicode/utf8"
)

// Sentinel causes wrapped by InputError.Err, for errors.Is.
var (
	// ErrTooLarge: the input passes a size limit (MaxLineBytes, MaxLines,
	// MaxNodes, MaxPanels).
	ErrTooLarge = errors.New("input beyond a size limit")
	// ErrNotRegular: the path names a FIFO, device, socket or folder.
	ErrNotRegular = errors.New("not a regular file")
	// ErrWrongUnit: the net's edges are far too short or too long for a
	// building net in the unit it was read in.
	ErrWrongUnit = errors.New("net in the wrong unit")
)

// InputError is the one error type for "this element of this file is
// wrong": it names the file, the line and the element. Every package that
// finds a problem with an element of the input (a node, a panel, a member,
// a job key) reports it as an InputError, wrapping a sentinel error in Err
// where callers need to tell kinds apart (errors.Is).
type InputError struct {
	File string // file name as the user gave it
	Line int    // 1-based line, 0 if unknown
	Elem string // element, such as "panel 214" or "key nodes.axis"; may be empty
	Msg  string // what is wrong, in the user's words
	Err  error  // wrapped cause (a sentinel such as nodes.ErrHubTooLarge), or nil
}

// Error returns "file:line: element: message".
func (e *InputError) Error() string {
	s := e.File
	if s == "" {
		s = "input"
	}
	if e.Line > 0 {
		s += ":" + strconv.Itoa(e.Line)
	}
	s += ": "
	if e.Elem != "" {
		s += e.Elem + ": "
	}
	msg := e.Msg
	if msg == "" && e.Err != nil {
		msg = e.Err.Error()
	}
	return s + msg
}

// Unwrap returns the wrapped cause.
func (e *InputError) Unwrap() error { return e.Err }

func inputErr(file string, line int, elem, format string, args ...any) *InputError {
	return &InputError{File: file, Line: line, Elem: elem, Msg: fmt.Sprintf(format, args...)}
}

// maxQuoteRunes is the longest part of a bad value a message repeats.
const maxQuoteRunes = 32

// short returns s cut to maxQuoteRunes characters, with "…" when cut, so
// that a message never echoes a huge value.
func short(s string) string {
	if utf8.RuneCountInString(s) <= maxQuoteRunes {
		return s
	}
	k := 0
	for i := range s {
		if k == maxQuoteRunes {
			return s[:i] + "…"
		}
		k++
	}
	return s
}

// quote returns short(s) in Go double quotes.
func quote(s string) string { return strconv.Quote(short(s)) }
