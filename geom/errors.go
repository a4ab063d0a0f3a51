package geom

import (
	"fmt"
	"strconv"
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

// FieldError is a bad value in an options struct: Field names the Go field
// (such as "TolMM", or "Stocks[2].WidthMM" for an element of a list) and
// Msg says what is wrong with the value. Options.Validate methods return
// it; the job file maps Field to its TOML key and line, the command line
// to its flag.
type FieldError struct {
	Field string
	Msg   string
}

// Error returns "Field: message".
func (e *FieldError) Error() string { return e.Field + ": " + e.Msg }

// FieldErrorf returns a *FieldError for field with a formatted message.
func FieldErrorf(field, format string, args ...any) *FieldError {
	return &FieldError{Field: field, Msg: fmt.Sprintf(format, args...)}
}
