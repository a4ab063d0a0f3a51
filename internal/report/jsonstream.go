package report

import (
	"bufio"
	"encoding/json"
	"io"
	"reflect"
	"strings"
)

// WriteJSON writes report.json, compact (it is for machines). It streams:
// the report's top-level lists are encoded one row at a time, so the
// encoder never holds the whole file; the bytes are those of
// json.Encoder.Encode for the whole report.
func WriteJSON(w io.Writer, rep *Report) error {
	bw := bufio.NewWriterSize(w, 1<<16)
	if err := streamObject(bw, reflect.ValueOf(rep).Elem()); err != nil {
		return err
	}
	if err := bw.WriteByte('\n'); err != nil {
		return err
	}
	return bw.Flush()
}

// streamObject writes the exported, tagged fields of struct v as a JSON
// object, lists element by element.
func streamObject(w *bufio.Writer, v reflect.Value) error {
	t := v.Type()
	w.WriteByte('{')
	first := true
	for i := 0; i < t.NumField(); i++ {
		f := t.Field(i)
		tag := f.Tag.Get("json")
		if !f.IsExported() || tag == "-" {
			continue
		}
		name, opts, _ := strings.Cut(tag, ",")
		if name == "" {
			name = f.Name
		}
		fv := v.Field(i)
		if strings.Contains(","+opts+",", ",omitempty,") && fv.IsZero() {
			continue
		}
		if !first {
			w.WriteByte(',')
		}
		first = false
		key, err := json.Marshal(name)
		if err != nil {
			return err
		}
		w.Write(key)
		w.WriteByte(':')
		if fv.Kind() == reflect.Slice && !fv.IsNil() {
			w.WriteByte('[')
			for k := 0; k < fv.Len(); k++ {
				if k > 0 {
					w.WriteByte(',')
				}
				b, err := json.Marshal(fv.Index(k).Interface())
				if err != nil {
					return err
				}
				if _, err := w.Write(b); err != nil {
					return err
				}
			}
			w.WriteByte(']')
			continue
		}
		b, err := json.Marshal(fv.Interface())
		if err != nil {
			return err
		}
		if _, err := w.Write(b); err != nil {
			return err
		}
	}
	return w.WriteByte('}')
}
