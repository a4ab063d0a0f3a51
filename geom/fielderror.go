package geom

import "fmt"

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
