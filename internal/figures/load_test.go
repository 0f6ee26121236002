package figures

import (
	"bytes"
	"os"
	"strings"
	"testing"

	"peerpack/internal/dataset"
)

// TestFixtureThroughDatasetLoad reads the fixture with the real loader
// (dataset.Load, which also applies the brief's population rule) and
// checks it yields the same figures as the test reader behind the golden
// file, apart from the wording of population reasons, which belongs to
// the dataset package.
func TestFixtureThroughDatasetLoad(t *testing.T) {
	d0, b := loadFixture(t)
	d, _, err := dataset.Load(os.DirFS(fixtureDir), b)
	if err != nil {
		t.Fatalf("dataset.Load: %v", err)
	}
	if d.InPopulation(d.Register.Index("ZU01")) {
		t.Fatal("the population rule require: [mission] should leave ZU01 out")
	}
	write := func(dd *dataset.Dataset) string {
		m, err := Compute(dd, b)
		if err != nil {
			t.Fatal(err)
		}
		var buf bytes.Buffer
		if err := WriteCSV(&buf, m); err != nil {
			t.Fatal(err)
		}
		var keep []string
		for _, line := range strings.Split(buf.String(), "\n") {
			if !strings.HasPrefix(line, "population,") && !strings.Contains(line, ",dropped,") {
				keep = append(keep, line)
			}
		}
		return strings.Join(keep, "\n")
	}
	if a, b := write(d), write(d0); a != b {
		al, bl := strings.Split(a, "\n"), strings.Split(b, "\n")
		for i := range min(len(al), len(bl)) {
			if al[i] != bl[i] {
				t.Fatalf("line %d differs:\n dataset.Load %s\n test reader  %s", i+1, al[i], bl[i])
			}
		}
		t.Fatalf("lengths differ: %d and %d lines", len(al), len(bl))
	}
}
