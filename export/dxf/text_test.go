package dxf

import "testing"

func TestDXFText(t *testing.T) {
	tests := []struct{ in, want string }{
		{"Vault A", "Vault A"},
		{"line\nbreak\r\tx", "line break  x"},
		{"Café 90°", "Caf\xe9 90\xb0"}, // code page 1252 bytes, which readers take AC1015 files to be in
		{"日本", `\U+65E5\U+672C`},
		{"a\\b^c", `a\U+005Cb\U+005Ec`},
		{"50% off", "50% off"},
		{"%%u under", "%%%%%%u under"},
		{"emoji 🙂", "emoji ?"},
		{"bad \xff byte", "bad ? byte"},
	}
	for _, tc := range tests {
		if got := dxfText(tc.in); got != tc.want {
			t.Errorf("dxfText(%q) = %q, want %q", tc.in, got, tc.want)
		}
	}
}
