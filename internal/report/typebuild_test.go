package report

import (
	"testing"

	"pqfab/parttype"
)

// TestBoundReason: the fewest-types reason says, in words, what forces the
// count: parts pairwise apart, one quantity alone, or a sum over sets of
// parts that never share a type.
func TestBoundReason(t *testing.T) {
	one := func(n int, key string) parttype.Bound {
		return parttype.Bound{Count: n, Terms: []parttype.BoundTerm{{Count: n, Key: key}}}
	}
	for _, tc := range []struct {
		b    parttype.Bound
		want string
	}{
		{parttype.Bound{}, ""},
		{one(37, ""), "at least 37 types: 37 of the members differ pairwise by more than the tolerances, so no two of them can share a type"},
		{one(12, "cut length"), "at least 12 types: by cut length alone the members need at least 12 types (values further apart than the tolerance cannot share a type)"},
		{one(1, ""), "at least 1 type: there are members"},
		{one(1, "cut length"), "at least 1 type: there are members"},
		{one(4, "twist").Of("nodes with 2 members").Add(one(5, "").Of("nodes with 3 members")),
			"at least 9 types: kinds never mix; nodes with 2 members need at least 4 types (by twist alone), nodes with 3 members need at least 5 types (5 of them differ pairwise by more than the tolerances)"},
	} {
		if got := boundReason(tc.b, "members", "kinds never mix"); got != tc.want {
			t.Errorf("%+v:\n got %q\nwant %q", tc.b, got, tc.want)
		}
	}
}
