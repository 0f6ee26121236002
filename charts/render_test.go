package charts

import (
	"os"
	"path/filepath"
	"testing"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
)

// TestRenderPNG writes every fixture chart to PNG files in the folder named
// by PEERPACK_CHART_PNG, for looking at; it is skipped otherwise.
func TestRenderPNG(t *testing.T) {
	dir := os.Getenv("PEERPACK_CHART_PNG")
	if dir == "" {
		t.Skip("set PEERPACK_CHART_PNG to a folder to render the fixture charts")
	}
	charts := fixtureCharts()
	m, b := buildModel(t, 60, goldenBody)
	for _, spec := range chartBlocks(b) {
		ch, err := New(m, spec, Theme{})
		if err != nil {
			t.Fatal(err)
		}
		charts = append(charts, fixtureChart{"model-" + blockName(spec), ch})
	}
	for _, fx := range charts {
		for _, w := range []vg.Length{fullWidth, halfWidth} {
			h := fx.chart.Height(w)
			img := vgimg.NewWith(vgimg.UseWH(w, h), vgimg.UseDPI(150))
			dc := draw.New(img)
			// White paper behind the transparent chart.
			dc.SetColor(whiteColor)
			dc.Fill(dc.Rectangle.Path())
			if err := fx.chart.Draw(dc); err != nil {
				t.Fatalf("%s: %v", fx.name, err)
			}
			name := filepath.Join(dir, fx.name+"-"+map[vg.Length]string{fullWidth: "full", halfWidth: "half"}[w]+".png")
			f, err := os.Create(name)
			if err != nil {
				t.Fatal(err)
			}
			if _, err := (vgimg.PngCanvas{Canvas: img}).WriteTo(f); err != nil {
				t.Fatal(err)
			}
			f.Close()
		}
	}
}
