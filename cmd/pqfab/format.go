package main

import (
	"encoding/json"
	"errors"
	"flag"
	"io"

	"pqfab/geom"
)

// writeJSON writes v as indented JSON.
func writeJSON(w io.Writer, v any) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", " ")
	return enc.Encode(v)
}

// show prints a summary as JSON or as text.
func show(w io.Writer, asJSON bool, v interface{ WriteText(io.Writer) }) error {
	if asJSON {
		return writeJSON(w, v)
	}
	v.WriteText(w)
	return nil
}

// fieldFlags maps the option fields some flags set to the flags' names,
// so that a *geom.FieldError from an options Validate names the flag.
type fieldFlags map[string]string

// float, text and integer register a flag for the option field at p
// (its value now is the default).
func (m fieldFlags) float(fs *flag.FlagSet, p *float64, name, field, usage string) {
	fs.Float64Var(p, name, *p, usage)
	m[field] = name
}

func (m fieldFlags) text(fs *flag.FlagSet, p *string, name, field, usage string) {
	fs.StringVar(p, name, *p, usage)
	m[field] = name
}

func (m fieldFlags) integer(fs *flag.FlagSet, p *int, name, field, usage string) {
	fs.IntVar(p, name, *p, usage)
	m[field] = name
}

// check returns the first error of errs as a usage error naming the flag.
func (m fieldFlags) check(errs ...error) error {
	for _, err := range errs {
		var fe *geom.FieldError
		if errors.As(err, &fe) {
			if name, ok := m[fe.Field]; ok {
				return usagef("--%s: %s", name, fe.Msg)
			}
		}
		if err != nil {
			return err
		}
	}
	return nil
}
