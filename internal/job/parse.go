package job

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"reflect"
	"regexp"
	"slices"
	"strconv"
	"strings"

	"github.com/BurntSushi/toml"

	"pqfab/quadnet"
)

// MaxFileBytes is the largest job file read (1 MiB): a job is a page of
// settings.
const MaxFileBytes = 1 << 20

// Parse reads and checks a job file's text. Errors name the file, the
// line and the key, in plain words.
func Parse(data []byte, file string) (*Job, error) {
	if len(data) > MaxFileBytes {
		return nil, &quadnet.InputError{File: file, Msg: fmt.Sprintf("%d bytes: a job file is at most %d bytes", len(data), MaxFileBytes)}
	}
	j := defaults(file)
	j.lines = indexKeys(data)
	if len(bytes.TrimSpace(data)) == 0 {
		return nil, &quadnet.InputError{File: file, Msg: "empty job file"}
	}
	md, err := toml.Decode(string(data), j)
	if err != nil {
		return nil, decodeError(err, file)
	}
	if und := md.Undecoded(); len(und) > 0 {
		k := und[0].String()
		msg := "unknown key (see the README for the job file's keys)"
		if s := suggest(k); s != "" {
			msg = fmt.Sprintf("unknown key; did you mean %s?", s)
		}
		return nil, j.Errorf(k, "%s", msg)
	}
	if j.Stock == nil {
		return nil, &quadnet.InputError{File: file, Msg: "no [[stock]] sheet given: nesting needs at least one"}
	}
	// The keys each [[stock]] and [[bar]] table holds: the others take
	// their defaults (a table read into a list starts from zero values).
	var given struct {
		Stock []map[string]any `toml:"stock"`
		Bar   []map[string]any `toml:"bar"`
	}
	if _, err := toml.Decode(string(data), &given); err != nil {
		return nil, decodeError(err, file)
	}
	for i := range j.Stock {
		fillDefaults(&j.Stock[i], stockDefaults(), given.Stock, i)
	}
	for i := range j.Bar {
		fillDefaults(&j.Bar[i], barDefaults(), given.Bar, i)
	}
	for i := range j.Stock {
		if j.Stock[i].Name == "" {
			j.Stock[i].Name = fmt.Sprintf("stock %d", i+1)
		}
	}
	if err := j.check(); err != nil {
		return nil, err
	}
	return j, nil
}

// fillDefaults sets every field of *dst whose key tables[i] does not
// hold to its value in def.
func fillDefaults[T any](dst *T, def T, tables []map[string]any, i int) {
	var keys map[string]any
	if i < len(tables) {
		keys = tables[i]
	}
	dv, fv := reflect.ValueOf(dst).Elem(), reflect.ValueOf(def)
	for k := range dv.NumField() {
		tag := dv.Type().Field(k).Tag.Get("toml")
		if _, ok := keys[tag]; !ok && tag != "" && tag != "-" {
			dv.Field(k).Set(fv.Field(k))
		}
	}
}

var tomlTypeErr = regexp.MustCompile(`^toml: line (\d+) \(last key "([^"]*)"\): (.*)$`)
var tomlTypes = regexp.MustCompile(`TOML value has type (\S+); destination has type (\S+)`)

// decodeError turns the TOML library's errors into ours: syntax errors keep
// their line, type mismatches say what the key wants in plain words.
func decodeError(err error, file string) error {
	var pe toml.ParseError
	if errors.As(err, &pe) {
		e := &quadnet.InputError{File: file, Line: pe.Position.Line, Msg: "TOML syntax: " + pe.Message}
		if pe.LastKey != "" {
			e.Elem = "key " + pe.LastKey
		}
		return e
	}
	if m := tomlTypeErr.FindStringSubmatch(err.Error()); m != nil {
		line, _ := strconv.Atoi(m[1])
		msg := m[3]
		if t := tomlTypes.FindStringSubmatch(msg); t != nil {
			msg = fmt.Sprintf("want %s, got %s", goTypeWords(t[2]), tomlTypeWords(t[1]))
		} else {
			msg = "this value does not fit the key (see the README for the job file's keys)"
		}
		return &quadnet.InputError{File: file, Line: line, Elem: "key " + m[2], Msg: msg}
	}
	return &quadnet.InputError{File: file, Msg: "cannot read the job: its values do not fit the keys (see the README)"}
}

// goTypeWords names what a Go destination type wants.
func goTypeWords(t string) string {
	switch {
	case strings.HasPrefix(t, "float"):
		return "a number"
	case strings.HasPrefix(t, "int"), strings.HasPrefix(t, "uint"):
		return "a whole number"
	case t == "string":
		return "text in quotes"
	case t == "bool":
		return "true or false"
	case strings.HasPrefix(t, "[]string"):
		return "a list of texts in quotes, such as [\"12\", \"14\"]"
	case strings.HasPrefix(t, "[]"):
		return "a [[table]]"
	}
	return "a table"
}

// tomlTypeWords names a TOML value type.
func tomlTypeWords(t string) string {
	switch strings.ToLower(t) {
	case "string":
		return "text"
	case "integer":
		return "a whole number"
	case "float":
		return "a number"
	case "bool", "boolean":
		return "true or false"
	case "array":
		return "a list"
	case "hash", "table":
		return "a table"
	}
	return "another kind of value"
}

// knownKeys lists every key of the job file, "table.key" and "stock.key",
// from the struct tags.
func knownKeys() []string {
	var keys []string
	var walk func(t reflect.Type, prefix string)
	walk = func(t reflect.Type, prefix string) {
		for f := range t.Fields() {
			tag := f.Tag.Get("toml")
			if tag == "" || tag == "-" {
				continue
			}
			ft := f.Type
			for ft.Kind() == reflect.Pointer || ft.Kind() == reflect.Slice {
				ft = ft.Elem()
			}
			if ft.Kind() == reflect.Struct {
				keys = append(keys, prefix+tag)
				walk(ft, prefix+tag+".")
				continue
			}
			keys = append(keys, prefix+tag)
		}
	}
	walk(reflect.TypeFor[Job](), "")
	slices.Sort(keys)
	return keys
}

// suggest returns the known key nearest to an unknown one (by edit
// distance, at most a third of its length), or "".
func suggest(key string) string {
	best, bestD := "", len(key)/3+1
	for _, k := range knownKeys() {
		if d := editDistance(key, k); d < bestD {
			best, bestD = k, d
		}
	}
	return best
}

// editDistance is the Levenshtein distance between a and b.
func editDistance(a, b string) int {
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			c := prev[j-1]
			if a[i-1] != b[j-1] {
				c++
			}
			cur[j] = min(c, prev[j]+1, cur[j-1]+1)
		}
		prev, cur = cur, prev
	}
	return prev[len(b)]
}

// keyLines finds the line of each key in a TOML text: "table.key" for
// plain tables and "stock[2].key" for the second [[stock]] table.
type keyLines struct{ lines map[string]int }

func indexKeys(data []byte) *keyLines {
	kl := &keyLines{lines: map[string]int{}}
	sc := bufio.NewScanner(bytes.NewReader(data))
	sc.Buffer(make([]byte, 64*1024), MaxFileBytes+1)
	table := ""
	arrays := map[string]int{}
	for n := 1; sc.Scan(); n++ {
		s := strings.TrimSpace(sc.Text())
		switch {
		case strings.HasPrefix(s, "[["):
			name := strings.TrimSpace(strings.Trim(strings.SplitN(s, "]]", 2)[0], "[ "))
			arrays[name]++
			table = fmt.Sprintf("%s[%d]", name, arrays[name])
			kl.set(table, n)
		case strings.HasPrefix(s, "["):
			table = strings.TrimSpace(strings.Trim(strings.SplitN(s, "]", 2)[0], "[ "))
			kl.set(table, n)
		default:
			if k, _, ok := strings.Cut(s, "="); ok && !strings.HasPrefix(s, "#") {
				key := strings.Trim(strings.TrimSpace(k), `"`)
				if table != "" {
					kl.set(table+"."+key, n)
					// Undecoded keys of array tables come without the index:
					// remember the first line under the plain name too.
					if i := strings.IndexByte(table, '['); i >= 0 {
						kl.set(table[:i]+"."+key, n)
					}
				} else {
					kl.set(key, n)
				}
			}
		}
	}
	return kl
}

func (kl *keyLines) set(key string, n int) {
	if _, ok := kl.lines[key]; !ok {
		kl.lines[key] = n
	}
}

// line returns the line of a key such as "net.unit", "stock[1].width_mm",
// "stock" (the first [[stock]]) or, for an undecoded key in an array
// table, "stock.colour" (the first such key); 0 if not found.
func (kl *keyLines) line(key string) int {
	if kl == nil {
		return 0
	}
	if n, ok := kl.lines[key]; ok {
		return n
	}
	if n, ok := kl.lines[key+"[1]"]; ok {
		return n // an array table: its first table
	}
	return 0
}
