package job

import (
	"fmt"
	"os"
	"reflect"
	"regexp"
	"slices"
	"strings"
	"testing"

	"github.com/BurntSushi/toml"

	"pqfab/nodes"
	"pqfab/panels"
)

// readmeKey is one key of README.md's job-file block.
type readmeKey struct {
	table, key string // table "" for the top level
	value      string // as written
	comment    string
	line       int // in README.md
}

// kind says what the block's comment makes of a value: "required", an
// example ("e.g."), or the default.
func (k readmeKey) kind() string {
	switch {
	case strings.HasPrefix(k.comment, "required"):
		return "required"
	case strings.HasPrefix(k.comment, "e.g."):
		return "example"
	}
	return "default"
}

var readmeLine = regexp.MustCompile(`^([a-z_0-9]+)\s*=\s*(.*?)\s*(?:#\s*(.*))?$`)

// readmeJobBlock returns the keys of the TOML block under README.md's
// "## The job file", and its tables in order (array tables as "[[name]]").
func readmeJobBlock(t *testing.T) ([]readmeKey, []string) {
	t.Helper()
	b, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	text := string(b)
	at := strings.Index(text, "## The job file")
	if at < 0 {
		t.Fatal("README.md has no section \"## The job file\"")
	}
	start := strings.Index(text[at:], "```toml\n")
	if start < 0 {
		t.Fatal("no ```toml block in README.md's job file section")
	}
	start += at + len("```toml\n")
	end := start + strings.Index(text[start:], "\n```")
	first := strings.Count(text[:start], "\n") + 1
	var keys []readmeKey
	var tables []string
	table := ""
	for i, line := range strings.Split(text[start:end], "\n") {
		s := strings.TrimSpace(line)
		switch {
		case s == "" || strings.HasPrefix(s, "#"):
		case strings.HasPrefix(s, "[["):
			table = strings.TrimSpace(s[2:strings.Index(s, "]]")])
			tables = append(tables, "[["+table+"]]")
		case strings.HasPrefix(s, "["):
			table = strings.TrimSpace(s[1:strings.Index(s, "]")])
			tables = append(tables, "["+table+"]")
		default:
			m := readmeLine.FindStringSubmatch(s)
			if m == nil {
				t.Fatalf("README.md:%d: %q is not key = value", first+i, s)
			}
			keys = append(keys, readmeKey{table: table, key: m[1], value: m[2], comment: m[3], line: first + i})
		}
	}
	return keys, tables
}

// fieldByTag returns the field of struct v whose toml tag is tag, looking
// into embedded structs too.
func fieldByTag(v reflect.Value, tag string) (reflect.Value, bool) {
	for i := range v.NumField() {
		f := v.Type().Field(i)
		if f.Tag.Get("toml") == tag {
			return v.Field(i), true
		}
		if f.Anonymous && f.Type.Kind() == reflect.Struct {
			if fv, ok := fieldByTag(v.Field(i), tag); ok {
				return fv, true
			}
		}
	}
	return reflect.Value{}, false
}

// applied returns the value the job holds for table.key (the first table
// of an array table).
func applied(j *Job, table, key string) (any, bool) {
	v := reflect.ValueOf(j).Elem()
	if table != "" {
		tv, ok := fieldByTag(v, table)
		if !ok {
			return nil, false
		}
		switch tv.Kind() {
		case reflect.Slice:
			if tv.Len() == 0 {
				return nil, false
			}
			tv = tv.Index(0)
		case reflect.Pointer:
			if tv.IsNil() {
				return nil, false
			}
			tv = tv.Elem()
		}
		v = tv
	}
	f, ok := fieldByTag(v, key)
	if !ok {
		return nil, false
	}
	return f.Interface(), true
}

// sameValue compares a value read by the TOML library (int64, float64,
// string, bool, []any) with a job field's.
func sameValue(want, got any) bool {
	num := func(x any) (float64, bool) {
		switch n := x.(type) {
		case int64:
			return float64(n), true
		case int:
			return float64(n), true
		case float64:
			return n, true
		}
		return 0, false
	}
	if w, ok := num(want); ok {
		g, ok := num(got)
		return ok && w == g
	}
	if w, ok := want.([]any); ok {
		g := reflect.ValueOf(got)
		return g.Kind() == reflect.Slice && len(w) == 0 && g.Len() == 0
	}
	return reflect.DeepEqual(want, reflect.ValueOf(got).Convert(reflect.TypeOf(want)).Interface())
}

// TestSharedDefaults: types.angle_tol_deg sets the angle tolerance of
// members and nodes (nodes) and of panels (panels) alike, so the two
// libraries' defaults must be one value.
func TestSharedDefaults(t *testing.T) {
	if nodes.DefaultTypeAngleTolDeg != panels.DefaultTypeAngleTolDeg {
		t.Errorf("types.angle_tol_deg: nodes' default %g°, panels' %g°", nodes.DefaultTypeAngleTolDeg, panels.DefaultTypeAngleTolDeg)
	}
	j, err := Parse([]byte("[net]\nfile = \"n.obj\"\n[[stock]]\nwidth_mm = 6000\nheight_mm = 3210\n"), "job.toml")
	if err != nil {
		t.Fatal(err)
	}
	if got := j.PanelTypeOptions().AngleTolDeg; got != panels.DefaultTypeAngleTolDeg {
		t.Errorf("panel types get %g°, panels' default is %g°", got, panels.DefaultTypeAngleTolDeg)
	}
}

// TestReadmeDefaults: every default in README.md's job-file block is the
// value a job gets when it leaves the key out. The test builds a job of
// the block's tables with only their required keys, parses it, and
// compares every documented default with the job's value; it also checks
// that the block documents every key of the job file.
func TestReadmeDefaults(t *testing.T) {
	keys, tables := readmeJobBlock(t)
	var tableKeys []string
	for _, tb := range tables {
		tableKeys = append(tableKeys, strings.Trim(tb, "[]"))
	}
	var job strings.Builder
	for _, k := range keys {
		if k.table == "" && k.kind() == "required" {
			fmt.Fprintf(&job, "%s = %s\n", k.key, k.value)
		}
	}
	for _, tb := range tables {
		job.WriteString(tb + "\n")
		name := strings.Trim(tb, "[]")
		for _, k := range keys {
			if k.table == name && k.kind() == "required" {
				fmt.Fprintf(&job, "%s = %s\n", k.key, k.value)
			}
		}
	}
	j, err := Parse([]byte(job.String()), "readme.toml")
	if err != nil {
		t.Fatalf("the job of README's required keys: %v\n%s", err, job.String())
	}
	defaults := 0
	documented := map[string]bool{}
	for _, k := range keys {
		full := strings.TrimPrefix(k.table+"."+k.key, ".")
		documented[full] = true
		got, ok := applied(j, k.table, k.key)
		if !ok {
			t.Errorf("README.md:%d: %s is not a key of the job file", k.line, full)
			continue
		}
		if k.kind() != "default" {
			continue
		}
		var v map[string]any
		if _, err := toml.Decode("v = "+k.value, &v); err != nil {
			t.Errorf("README.md:%d: %s = %s: %v", k.line, full, k.value, err)
			continue
		}
		defaults++
		if !sameValue(v["v"], got) {
			t.Errorf("README.md:%d: %s: README says the default is %s, a job gets %#v", k.line, full, k.value, got)
		}
	}
	if defaults < 40 {
		t.Errorf("only %d defaults compared", defaults)
	}
	for _, key := range knownKeys() {
		if slices.Contains(tableKeys, key) {
			continue // a table: its keys are checked one by one
		}
		// A [[panel_type]] table takes [panel]'s specification keys.
		if !documented[key] && !documented[strings.Replace(key, "panel_type.", "panel.", 1)] {
			t.Errorf("README.md's job-file block does not document %s", key)
		}
	}
}
