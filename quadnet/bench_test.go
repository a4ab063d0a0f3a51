package quadnet

import (
	"strings"
	"testing"
)

func benchOBJ(b *testing.B, nx, ny int) {
	src := gridOBJ(nx, ny, 1500)
	b.SetBytes(int64(len(src)))
	b.ReportAllocs()
	for b.Loop() {
		if _, err := ReadOBJ(strings.NewReader(src), "bench.obj", MM); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkReadOBJ100k reads a 100k-panel OBJ (target ≤ 0.5 s, ≤ 200 MB).
func BenchmarkReadOBJ100k(b *testing.B) { benchOBJ(b, 400, 250) }

func benchValidate(b *testing.B, nx, ny int) {
	n := mustRead(b, gridOBJ(nx, ny, 1500))
	b.ReportAllocs()
	for b.Loop() {
		if _, fd := Validate(n, DefaultValidateOptions()); fd.Err() != nil {
			b.Fatal(fd.Err())
		}
	}
}

// Validation is linear in size: compare ns/op of the two.
func BenchmarkValidate10k(b *testing.B)  { benchValidate(b, 125, 80) }
func BenchmarkValidate100k(b *testing.B) { benchValidate(b, 400, 250) }

// BenchmarkCanonical100k renumbers a 100k-panel net in geometric order
// (V log V + F log F).
func BenchmarkCanonical100k(b *testing.B) {
	n := mustRead(b, gridOBJ(400, 250, 1500))
	b.ReportAllocs()
	for b.Loop() {
		Canonical(n)
	}
}
