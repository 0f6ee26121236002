package pdf

import (
	"bytes"
	"image/color"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

func sampleDoc(t testing.TB, paper Paper) []byte {
	t.Helper()
	out, err := sampleDocument(t, paper).Bytes()
	if err != nil {
		t.Fatal(err)
	}
	return out
}

// sampleDocument is sampleDoc's document before it is written.
func sampleDocument(t testing.TB, paper Paper) *Doc {
	t.Helper()
	d := New(Options{
		Paper: paper, Title: "Position of Université de Saint-Éluard", Author: "Planning Office",
		Subject: "Peer comparison", Keywords: []string{"peers", "benchmark"}, Lang: "en-GB",
		Producer: "peerpack test", Creator: "peerpack", Created: time.Date(2025, 3, 1, 12, 0, 0, 0, time.UTC),
	})
	d.SetFurniture(func(d *Doc, page int) {
		d.SetFont(Font{Family: Sans, Size: 8})
		d.Text(d.Margins().Left, 12, "Running header")
	}, func(d *Doc, page int) {
		d.SetFont(Font{Family: Sans, Size: 8})
		d.TextRight(d.Paper().Width-d.Margins().Right, d.Paper().Height-10, "page footer")
	})
	d.AddPage()
	d.Bookmark("Høgskolen i Vårdø", 0, 30)
	d.SetFont(Font{Family: Serif, Style: Bold, Size: 14})
	d.Text(20, 30, "Høgskolen i Vårdø")
	d.SetFont(Font{Family: Sans, Style: Italic, Size: 10})
	d.Text(20, 40, "Politechnika Źródłowa")

	p := plot.New()
	p.Title.Text = "Université de Saint-Éluard"
	p.X.Label.Text = "Źródło"
	p.Title.TextStyle.Font = font.Font{Typeface: "Liberation", Variant: "Serif", Size: 12}
	pts := plotter.XYs{{X: 0, Y: 1}, {X: 1, Y: 3}, {X: 2, Y: 2}}
	l, err := plotter.NewLine(pts)
	if err != nil {
		t.Fatal(err)
	}
	l.Dashes = []vg.Length{vg.Points(3), vg.Points(2)}
	l.Color = color.NRGBA{R: 0, G: 114, B: 178, A: 200}
	s, _ := plotter.NewScatter(pts)
	p.Add(l, s)
	c := d.Canvas(20, 50, 120, 80)
	p.Draw(draw.New(c))
	c.Close()
	d.Text(20, 140, "after the chart")
	return d
}

func TestDocumentPassesValidators(t *testing.T) {
	for _, paper := range []struct {
		p    Paper
		size string // pdfinfo's "Page size", points: A4 by ISO 216 is 595.276 x 841.89; Letter 612 x 792 (ANSI)
	}{
		{A4, "595.28 x 841.89 pts (A4)"},
		{Letter, "612 x 792 pts (letter)"},
	} {
		out := sampleDoc(t, paper.p)
		runTool(t, out, "qpdf", "--check")
		fonts := runTool(t, out, "pdffonts")
		rows := strings.Split(strings.TrimSpace(fonts), "\n")[2:]
		if len(rows) < 3 {
			t.Fatalf("expected at least three fonts, pdffonts says:\n%s", fonts)
		}
		for _, r := range rows {
			f := strings.Fields(r)
			// columns: name type encoding emb sub uni object ID
			if !strings.Contains(r, "TrueType") || f[len(f)-5] != "yes" || f[len(f)-4] != "yes" {
				t.Errorf("font not embedded and subset: %s", r)
			}
		}
		info := runTool(t, out, "pdfinfo")
		if !strings.Contains(info, paper.size) {
			t.Errorf("page size: want %q in\n%s", paper.size, info)
		}
		for _, want := range []string{"Title:           Position of Université de Saint-Éluard", "Author:          Planning Office", "Keywords:        peers, benchmark", "Producer:        peerpack test"} {
			if !strings.Contains(info, want) {
				t.Errorf("pdfinfo lacks %q:\n%s", want, info)
			}
		}
		text := runTool(t, out, "pdftotext", "-layout")
		for _, want := range []string{"Høgskolen i Vårdø", "Politechnika Źródłowa", "Université de Saint-Éluard", "Źródło", "after the chart", "Running header", "page footer"} {
			if !strings.Contains(text, want) {
				t.Errorf("pdftotext lacks %q:\n%s", want, text)
			}
		}
	}
}

func TestDocumentIsReproducible(t *testing.T) {
	a, b := sampleDoc(t, A4), sampleDoc(t, A4)
	if !bytes.Equal(a, b) {
		t.Fatal("two builds of the same document differ")
	}
	if !regexp.MustCompile(`/CreationDate \(D:20250301120000`).Match(a) {
		t.Error("creation date not taken from Options.Created")
	}
}

func TestWriteSampleForViewing(t *testing.T) {
	if dir := os.Getenv("PEERPACK_SAMPLE_DIR"); dir != "" {
		if err := os.WriteFile(filepath.Join(dir, "pdf-sample.pdf"), sampleDoc(t, A4), 0o644); err != nil {
			t.Fatal(err)
		}
	}
}

func TestFitShortensWithEllipsis(t *testing.T) {
	d := New(Options{})
	d.SetFont(Font{Family: Sans, Size: 10})
	long := strings.Repeat("Université ", 50)
	for _, w := range []float64{1, 20, 55.5, 300} {
		got := d.Fit(long, w)
		if d.StringWidth(got) > w {
			t.Errorf("Fit(%g) = %q is %g mm wide", w, got, d.StringWidth(got))
		}
		// One more rune would not fit: the cut is as long as it can be.
		if got != "" && got != "…" {
			r := []rune(strings.TrimSuffix(got, "…"))
			more := string([]rune(long)[:len(r)+1]) + "…"
			if d.StringWidth(more) <= w {
				t.Errorf("Fit(%g) = %q could keep one more rune", w, got)
			}
		}
	}
	if got := d.Fit("short", 100); got != "short" {
		t.Errorf("Fit left %q", got)
	}
}
