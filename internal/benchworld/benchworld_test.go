package benchworld

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// The systems share out every institution, a few large and many small,
// none under five (common practice, no source: a group of fewer reads as
// noise).
func TestSystemSizes(t *testing.T) {
	for _, c := range []struct{ n, k int }{{21500, 120}, {2000, 11}, {600, 120}, {50, 20}} {
		sizes := systemSizes(c.n, c.k)
		sum := 0
		for i, s := range sizes {
			sum += s
			if s < min(5, c.n/c.k) {
				t.Errorf("n=%d k=%d: system %d has %d institutions", c.n, c.k, i+1, s)
			}
			if i > 0 && s > sizes[0] {
				t.Errorf("n=%d k=%d: system %d (%d) is larger than the first (%d)", c.n, c.k, i+1, s, sizes[0])
			}
		}
		if sum != c.n {
			t.Errorf("n=%d k=%d: sizes add up to %d", c.n, c.k, sum)
		}
	}
}

// The world is the same on every run (fixed seed), and its values file
// names every institution and indicator of the register and dictionary.
func TestWriteIsReproducible(t *testing.T) {
	a, b := t.TempDir(), t.TempDir()
	o := Options{Institutions: 300, Systems: 12, Years: 3}
	if err := Write(a, o); err != nil {
		t.Fatal(err)
	}
	if err := Write(b, o); err != nil {
		t.Fatal(err)
	}
	for _, name := range []string{"institutions.csv", "indicators.yaml", "values.csv", "brief.md"} {
		x, _ := os.ReadFile(filepath.Join(a, name))
		y, _ := os.ReadFile(filepath.Join(b, name))
		if len(x) == 0 || !bytes.Equal(x, y) {
			t.Errorf("%s differs between two runs (or is empty)", name)
		}
	}
	vals, _ := os.ReadFile(filepath.Join(a, "values.csv"))
	rows := strings.Count(string(vals), "\n") - 1
	if want := 300 * 3 * len(indicators); rows < want*95/100 || rows > want {
		t.Errorf("%d value rows, want about %d less the 3%% missing", rows, want)
	}
}

// The 24-chart brief has 24 chart blocks, of the kinds the matplotlib
// peer script draws, and no table or commentary block.
func TestChartsBrief(t *testing.T) {
	dir := t.TempDir()
	if err := Write(dir, Options{Institutions: 200, Systems: 12, Years: 3, Brief: BriefCharts}); err != nil {
		t.Fatal(err)
	}
	text, err := os.ReadFile(filepath.Join(dir, "brief.md"))
	if err != nil {
		t.Fatal(err)
	}
	s := string(text)
	if n := strings.Count(s, "```chart\n"); n != ChartCount {
		t.Errorf("%d chart blocks, want %d", n, ChartCount)
	}
	if strings.Contains(s, "```table") || strings.Contains(s, "```commentary") {
		t.Error("the 24-chart brief should hold charts only")
	}
	kinds := map[string]bool{"box": true, "trend": true, "scatter": true, "bars": true, "heatmap": true, "radar": true}
	for _, c := range chartSpecs {
		if !kinds[c.kind] {
			t.Errorf("kind %q is not drawn by charts_peer.py", c.kind)
		}
	}
}
