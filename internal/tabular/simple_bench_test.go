package tabular

import (
	"fmt"
	"strings"
	"testing"
)

// benchValues is a long values file of the world benchmark's shape.
func benchValues() []byte {
	var sb strings.Builder
	sb.WriteString("institution,year,indicator,value\n")
	for i := range 100000 {
		fmt.Fprintf(&sb, "I%05d,%d,indicator_%02d,%d.%04d\n", i/240, 2016+i%10, i%24, i%97, i%9973)
	}
	return []byte(sb.String())
}

// BenchmarkReadParts reads the parts of a long values file through Next
// (cells) and through NextSimple (fields), as the values loader does.
func BenchmarkReadParts(b *testing.B) {
	data := benchValues()
	for _, simple := range []bool{false, true} {
		b.Run(fmt.Sprintf("simple=%v", simple), func(b *testing.B) {
			b.SetBytes(int64(len(data)))
			fields, cols := make([]string, 4), make([]int, 4)
			for range b.N {
				r, _ := NewCSV("v.csv", data)
				for _, p := range r.Split(4) {
					for {
						if simple {
							if _, ok := p.NextSimple(fields, cols); ok {
								continue
							}
						}
						if _, err := p.Next(); err != nil {
							break
						}
					}
				}
			}
		})
	}
}
