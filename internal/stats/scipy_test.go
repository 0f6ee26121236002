package stats

import (
	"bufio"
	"fmt"
	"os"
	"strconv"
	"strings"
	"testing"
)

// TestSample200AgainstSciPy checks the percentile-rank convention against
// SciPy 1.10.1's percentileofscore(kind="mean") (Debian python3-scipy,
// computed by testdata/reference/sample200_scipy.py), a definition
// published independently of ours, plus SciPy's spearmanr, pearsonr,
// std(ddof=1) and skew(bias=False); agreement to 1e-9.
func TestSample200AgainstSciPy(t *testing.T) {
	f, err := os.Open(referenceDir + "/sample200_scipy.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	ref := map[string]float64{}
	sc := bufio.NewScanner(f)
	for first := true; sc.Scan(); first = false {
		line := sc.Text()
		if first && !strings.HasPrefix(line, "# SciPy version: 1.10.1") {
			t.Fatalf("reference not produced by SciPy 1.10.1: %q", line)
		}
		if strings.HasPrefix(line, "#") || line == "name,value" {
			continue
		}
		name, val, _ := strings.Cut(line, ",")
		v, err := strconv.ParseFloat(val, 64)
		if err != nil {
			t.Fatalf("bad line %q", line)
		}
		ref[name] = v
	}
	want := func(name string) float64 {
		v, ok := ref[name]
		if !ok {
			t.Fatalf("reference value %q missing", name)
		}
		return v
	}
	x, y := loadSample(t)
	sx := sorted(x)
	for _, i := range []int{1, 2, 3, 17, 50, 99, 128, 200} {
		v := x[i-1]
		near(t, fmt.Sprintf("percentile higher %d", i), Place(sx, v, HigherFirst, true).Percentile, want(fmt.Sprintf("percentile_higher_%d", i)), 1e-9)
		near(t, fmt.Sprintf("percentile lower %d", i), Place(sx, v, LowerFirst, true).Percentile, want(fmt.Sprintf("percentile_lower_%d", i)), 1e-9)
	}
	for _, v := range []float64{50, 61.3, 10} {
		near(t, fmt.Sprintf("outside %g", v), Place(sx, v, HigherFirst, false).Percentile, want(fmt.Sprintf("outside_percentile_higher_%g", v)), 1e-9)
	}
	near(t, "spearman", Spearman(x, y), want("spearman_xy"), 1e-9)
	near(t, "pearson", Pearson(x, y), want("pearson_xy"), 1e-9)
	near(t, "sd", SD(x), want("sd_x"), 1e-9)
	// SciPy skew(bias=False): the adjusted Fisher-Pearson estimator.
	near(t, "skewness x", Skewness(x), want("skew_x"), 1e-9)
	near(t, "skewness y", Skewness(y), want("skew_y"), 1e-9)
}
