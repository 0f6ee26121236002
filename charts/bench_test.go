package charts

import (
	"fmt"
	"image"
	"image/color"
	"strings"
	"testing"

	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// discard is a vg.Canvas that draws nothing, so the benchmark measures
// planning and geometry rather than a back end.
type discard struct{ w, h vg.Length }

func (discard) SetLineWidth(vg.Length)                 {}
func (discard) SetLineDash([]vg.Length, vg.Length)     {}
func (discard) SetColor(color.Color)                   {}
func (discard) Rotate(float64)                         {}
func (discard) Translate(vg.Point)                     {}
func (discard) Scale(float64, float64)                 {}
func (discard) Push()                                  {}
func (discard) Pop()                                   {}
func (discard) Stroke(vg.Path)                         {}
func (discard) Fill(vg.Path)                           {}
func (discard) FillString(font.Face, vg.Point, string) {}
func (discard) DrawImage(vg.Rectangle, image.Image)    {}
func (d discard) Size() (vg.Length, vg.Length)         { return d.w, d.h }

// benchBody is 25 chart blocks cycling through every kind.
func benchBody() string {
	blocks := []string{
		"kind: box\nindicators: [fnci, ssr]\nlabel: [AL001, KE002]",
		"kind: radar\nindicators: [fnci, intl_staff, ssr, income]",
		"kind: trend\nindicators: [intl_staff, fnci]\nlabel: [KE002]",
		"kind: scatter\nindicators: [intl_staff, fnci]\nfit: true\nlabel: [AL001]",
		"kind: heatmap\nindicators: [fnci, intl_staff, ssr, income]\nlimit: 20",
		"kind: bars\nindicators: [income]\nlimit: 15",
	}
	var b strings.Builder
	for i := 0; i < 25; i++ {
		fmt.Fprintf(&b, "\n```chart\n%s\n```\n", blocks[i%len(blocks)])
	}
	return b.String()
}

// BenchmarkCharts25 plans and draws the 25 charts of a pack over 1,000
// institutions (a 30-page pack's share of the 1-second build target).
func BenchmarkCharts25(b *testing.B) {
	m, br := buildModel(b, 1000, benchBody())
	specs := chartBlocks(br)
	if len(specs) != 25 {
		b.Fatalf("%d chart blocks, want 25", len(specs))
	}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		for _, spec := range specs {
			ch, err := New(m, spec, Theme{})
			if err != nil {
				b.Fatal(err)
			}
			h := ch.Height(fullWidth)
			if err := ch.Draw(draw.NewCanvas(discard{fullWidth, h}, fullWidth, h)); err != nil {
				b.Fatal(err)
			}
		}
	}
}
