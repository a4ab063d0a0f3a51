package job

import (
	"testing"

	"pqfab/samples"
)

// FuzzParseJob: the job parser never panics, and whatever it accepts has
// sane values.
func FuzzParseJob(f *testing.F) {
	f.Add(samples.DemoJob())
	f.Add([]byte("[net]\nfile = \"n.obj\"\n[[stock]]\nname = \"jumbo\"\nwidth_mm = 6000\nheight_mm = 3210\nmargin_mm = 20\nspacing_mm = 6\n"))
	f.Add([]byte("[net]\nfile = \"x.obj\"\n[[stock]]\nwidth_mm = 1e308\nheight_mm = 1\n[rates]\nnode_each = 1\n"))
	f.Add([]byte("title = 5\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		j, err := Parse(data, "fuzz.toml")
		if err != nil {
			return
		}
		if j.Net.File == "" || len(j.Stock) == 0 || !(j.Flatness.TolMM > 0) || !(j.Flatness.MaxMoveMM > 0) {
			t.Fatalf("accepted a job with bad values: %+v", j)
		}
		for _, s := range j.Stock {
			if !(s.WidthMM > 0) || !(s.HeightMM > 0) || 2*s.MarginMM >= min(s.WidthMM, s.HeightMM) {
				t.Fatalf("accepted bad stock %+v", s)
			}
		}
		for _, s := range j.Stocks() {
			if err := s.Validate(); err != nil {
				t.Fatalf("accepted stock that does not validate: %v", err)
			}
		}
	})
}
