package charts

import (
	"flag"
	"fmt"
	"image/color"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/recorder"
)

var update = flag.Bool("update", false, "rewrite testdata/charts/*.golden from the current drawing")

const goldenDir = "../testdata/charts"

// record draws a chart at a width onto gonum's recording canvas.
func record(t testing.TB, ch Chart, width vg.Length) *recorder.Canvas {
	t.Helper()
	rec := &recorder.Canvas{}
	h := ch.Height(width)
	if err := ch.Draw(draw.NewCanvas(rec, width, h)); err != nil {
		t.Fatalf("draw: %v", err)
	}
	return rec
}

// actionsText writes recorded drawing commands one per line, lengths in
// points to two decimals, so that a golden diff shows what moved.
func actionsText(acts []recorder.Action) string {
	var b strings.Builder
	for _, a := range acts {
		switch a := a.(type) {
		case *recorder.SetLineWidth:
			fmt.Fprintf(&b, "width %.2f\n", float64(a.Width))
		case *recorder.SetLineDash:
			fmt.Fprintf(&b, "dash %s %.2f\n", lengths(a.Dashes), float64(a.Offsets))
		case *recorder.SetColor:
			fmt.Fprintf(&b, "colour %s\n", hexColour(a.Color))
		case *recorder.Stroke:
			fmt.Fprintf(&b, "stroke %s\n", pathText(a.Path))
		case *recorder.Fill:
			fmt.Fprintf(&b, "fill %s\n", pathText(a.Path))
		case *recorder.FillString:
			fmt.Fprintf(&b, "text %s %.1f %.2f %.2f %q\n", a.Font.Name(), float64(a.Size), float64(a.Point.X), float64(a.Point.Y), a.String)
		case *recorder.Push:
			b.WriteString("push\n")
		case *recorder.Pop:
			b.WriteString("pop\n")
		case *recorder.Rotate:
			fmt.Fprintf(&b, "rotate %.4f\n", a.Angle)
		case *recorder.Translate:
			fmt.Fprintf(&b, "translate %.2f %.2f\n", float64(a.Point.X), float64(a.Point.Y))
		case *recorder.Scale:
			fmt.Fprintf(&b, "scale %.4f %.4f\n", a.X, a.Y)
		default:
			fmt.Fprintf(&b, "%s\n", a.Call())
		}
	}
	return b.String()
}

func lengths(ls []vg.Length) string {
	parts := make([]string, len(ls))
	for i, l := range ls {
		parts[i] = fmt.Sprintf("%.2f", float64(l))
	}
	return "[" + strings.Join(parts, " ") + "]"
}

func hexColour(c color.Color) string {
	if c == nil {
		return "none"
	}
	r, g, b, a := c.RGBA()
	return fmt.Sprintf("#%02x%02x%02x%02x", r>>8, g>>8, b>>8, a>>8)
}

func pathText(p vg.Path) string {
	var b strings.Builder
	for i, c := range p {
		if i > 0 {
			b.WriteByte(' ')
		}
		switch c.Type {
		case vg.MoveComp:
			fmt.Fprintf(&b, "M%.2f,%.2f", float64(c.Pos.X), float64(c.Pos.Y))
		case vg.LineComp:
			fmt.Fprintf(&b, "L%.2f,%.2f", float64(c.Pos.X), float64(c.Pos.Y))
		case vg.ArcComp:
			fmt.Fprintf(&b, "A%.2f,%.2f,%.2f,%.4f,%.4f", float64(c.Pos.X), float64(c.Pos.Y), float64(c.Radius), c.Start, c.Angle)
		case vg.CurveComp:
			fmt.Fprintf(&b, "C%.2f,%.2f", float64(c.Pos.X), float64(c.Pos.Y))
		case vg.CloseComp:
			b.WriteString("Z")
		}
	}
	return b.String()
}

// TestGolden compares the drawing commands of every chart kind, planned
// from the fixture model, with testdata/charts/<kind>.golden. A change in
// drawing must be deliberate: run go test ./charts -run Golden -update
// and review the diff.
func TestGolden(t *testing.T) {
	m, b := buildModel(t, 60, goldenBody)
	seen := map[string]bool{}
	for _, spec := range chartBlocks(b) {
		name := blockName(spec)
		if seen[name] {
			t.Fatalf("two fixture blocks named %s", name)
		}
		seen[name] = true
		t.Run(name, func(t *testing.T) {
			ch, err := New(m, spec, Theme{})
			if err != nil {
				t.Fatalf("New: %v", err)
			}
			got := fmt.Sprintf("# %s chart at 481.89 pt wide, %.2f pt high\n", name, float64(ch.Height(fullWidth))) + actionsText(record(t, ch, fullWidth).Actions)
			file := filepath.Join(goldenDir, name+".golden")
			if *update {
				if err := os.MkdirAll(goldenDir, 0o755); err != nil {
					t.Fatal(err)
				}
				if err := os.WriteFile(file, []byte(got), 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			want, err := os.ReadFile(file)
			if err != nil {
				t.Fatalf("%v (run with -update to create it)", err)
			}
			if got != string(want) {
				t.Errorf("drawing of %s differs from %s:\n%s", name, file, firstDiff(string(want), got))
			}
		})
	}
	for _, kind := range []string{"box", "radar", "trend", "scatter", "heatmap", "bars"} {
		if !seen[kind] {
			t.Errorf("no golden fixture for chart kind %s", kind)
		}
	}
}

// firstDiff shows the first differing line of two texts.
func firstDiff(want, got string) string {
	wl, gl := strings.Split(want, "\n"), strings.Split(got, "\n")
	for i := 0; i < max(len(wl), len(gl)); i++ {
		var w, g string
		if i < len(wl) {
			w = wl[i]
		}
		if i < len(gl) {
			g = gl[i]
		}
		if w != g {
			return fmt.Sprintf("line %d\n want: %s\n  got: %s", i+1, w, g)
		}
	}
	return "(no line differs)"
}
