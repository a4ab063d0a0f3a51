package report

import (
	"strings"
	"testing"
)

// TestBuildTextTitle: the first line names the job's title, and a job
// without one reads "built into DIR" (one space).
func TestBuildTextTitle(t *testing.T) {
	for _, tc := range []struct{ title, want string }{
		{"", "built into out\n"},
		{"Larkspur vault", "built Larkspur vault into out\n"},
	} {
		var b strings.Builder
		WriteText(&b, "out", &Report{Title: tc.title})
		if got, _, _ := strings.Cut(b.String(), "\n"); got+"\n" != tc.want {
			t.Errorf("title %q: first line %q, want %q", tc.title, got, tc.want)
		}
	}
}
