package stats

import (
	"encoding/csv"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"
)

// TestWeightedMedianAgainstPython compares WeightedMedian with Python's
// statistics.median of the sample in which each value is repeated weight
// times (testdata/weighted_median.py, Debian's python3 standard library):
// 60 cases of 1 to 25 values with integer weights, half of them with many
// ties.
func TestWeightedMedianAgainstPython(t *testing.T) {
	f, err := os.Open("testdata/weighted_median.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	if len(rows) < 61 {
		t.Fatalf("%d reference rows, want 60 and a header", len(rows)-1)
	}
	floats := func(s string) []float64 {
		var out []float64
		for _, x := range strings.Fields(s) {
			v, err := strconv.ParseFloat(x, 64)
			if err != nil {
				t.Fatal(err)
			}
			out = append(out, v)
		}
		return out
	}
	for _, r := range rows[1:] {
		vs, ws := floats(r[1]), floats(r[2])
		want, _ := strconv.ParseFloat(r[3], 64)
		got, n, ok := WeightedMedian(vs, ws)
		if !ok || n != len(vs) || math.Abs(got-want) > 1e-12 {
			t.Errorf("case %s: got %v (n %d, ok %v), Python says %v", r[0], got, n, ok, want)
		}
	}
}

// TestWeightedMedianWorked checks hand-worked cases and what is left out.
func TestWeightedMedianWorked(t *testing.T) {
	nan := math.NaN()
	cases := []struct {
		name   string
		v, w   []float64
		want   float64
		n      int
		wantOK bool
	}{
		// Wikipedia's "Weighted median" example (from memory): values
		// 1..5 with weights 0.15, 0.1, 0.2, 0.3, 0.25; the running total
		// passes 0.5 at 4 (0.45 before it, 0.75 with it).
		{"worked", []float64{1, 2, 3, 4, 5}, []float64{0.15, 0.1, 0.2, 0.3, 0.25}, 4, 5, true},
		// Equal weights give the plain median (R quantile type 7 at 0.5).
		{"equal even", []float64{4, 1, 3, 2}, []float64{1, 1, 1, 1}, 2.5, 4, true},
		{"equal odd", []float64{5, 1, 3}, []float64{2, 2, 2}, 3, 3, true},
		// One large institution carries the median to its own value.
		{"one heavy", []float64{10, 20, 30}, []float64{1, 1, 5}, 30, 3, true},
		// Missing values, zero and negative weights are left out.
		{"left out", []float64{nan, 1, 2, 3, 100}, []float64{5, 1, 0, 1, -4}, 2, 2, true},
		{"none", []float64{nan, 1}, []float64{1, 0}, nan, 0, false},
	}
	for _, c := range cases {
		got, n, ok := WeightedMedian(c.v, c.w)
		if ok != c.wantOK || n != c.n || (c.wantOK && got != c.want) {
			t.Errorf("%s: got %v n %d ok %v, want %v n %d ok %v", c.name, got, n, ok, c.want, c.n, c.wantOK)
		}
	}
}
