package geom

import (
	"fmt"
	"strconv"
)

// InputError is a problem with an input file, naming the file, the line
// and the element.
type InputError struct {
	File string // file name as the user gave it
	Line int    // 1-based line, 0 if unknown
	Elem string // element, such as "face 214" or "node 7"; may be empty
	Msg  string
}

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
	return s + e.Msg
}

func inputErr(file string, line int, elem, format string, args ...any) *InputError {
	return &InputError{File: file, Line: line, Elem: elem, Msg: fmt.Sprintf(format, args...)}
}

func itoa(i int) string { return strconv.Itoa(i) }
