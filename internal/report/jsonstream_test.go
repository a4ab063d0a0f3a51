package report

import (
	"bytes"
	"encoding/json"
	"testing"
)

// TestWriteJSONStreamsSameBytes: the streamed report.json is byte for byte
// what encoding/json's Encoder writes for the whole report (the standard
// library is the reference), with HTML-sensitive text, nil and empty
// lists, an omitted and a present optional field.
func TestWriteJSONStreamsSameBytes(t *testing.T) {
	for _, rep := range []*Report{
		{Title: "a <b> & \"c\" é", Warnings: []string{}, Nodes: []NodeRow{{Label: "A1-01", Arms: []ArmRow{{Member: "A1-M01", AzimuthDeg: 12.5}}}}},
		{Title: "t", Cost: &Cost{Currency: "EUR", Lines: []CostLine{{Item: "x", Amount: 1.5}}}, Panels: []PanelRow{{Label: "A1-P01", Corners: []string{"a", "b"}}}, Sheets: []SheetRow{}},
	} {
		var want, got bytes.Buffer
		if err := json.NewEncoder(&want).Encode(rep); err != nil {
			t.Fatal(err)
		}
		if err := WriteJSON(&got, rep); err != nil {
			t.Fatal(err)
		}
		if got.String() != want.String() {
			t.Errorf("streamed:\n%s\nencoder:\n%s", got.String(), want.String())
		}
	}
}
