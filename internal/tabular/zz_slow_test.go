package tabular

import (
	"math/rand"
	"os"
	"path/filepath"
	"testing"
	"time"
)

func TestZZSlow(t *testing.T) {
	seed, _ := os.ReadFile(filepath.Join(xlsxDir, "values.xlsx"))
	rng := rand.New(rand.NewSource(1))
	for i := 0; i < 3000; i++ {
		b := append([]byte(nil), seed...)
		for k := 0; k < 1+rng.Intn(4); k++ {
			b[rng.Intn(len(b))] = byte(rng.Intn(256))
		}
		st := time.Now()
		ParseXLSX("x", b, "")
		if d := time.Since(st); d > 200*time.Millisecond {
			os.WriteFile("/tmp/slow.xlsx", b, 0o644)
			t.Fatalf("iteration %d took %v", i, d)
		}
	}
}
