package web

import (
	"pqfab/export/internal/exporttest"
	"testing"
)

func BenchmarkView1600(b *testing.B) { exporttest.BenchWrite(b, WriteView) }
