// Package chartfiles writes a pack's charts as separate files for slides:
// each figure as SVG (gonum/plot's vg/vgsvg, fonts embedded and text kept
// as text) and as PNG at 300 dots per inch (vg/vgimg), drawn by the same
// chart code and at the same size as in the PDF.
package chartfiles

import (
	"context"
	"fmt"
	"image/color"
	"io"
	"os"
	"path/filepath"
	"strings"
	"unicode"
	"unicode/utf8"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"

	"peerpack/internal/atomicfile"
	"peerpack/internal/layout"
)

// DPI is the resolution of the PNG files: 300 dots per inch, the usual
// resolution for print and slides (common practice, no source).
const DPI = 300

// mm is one millimetre in vg lengths (points, 72 to the inch).
const mm = vg.Inch / 25.4

// Name is a figure's file name without extension: "figure-03-" and its
// title in lower-case letters, digits and hyphens, cut to 60 characters
// on a character boundary, so names sort in figure order and are safe on
// every file system.
func Name(f layout.Figure) string {
	var b strings.Builder
	hyphen := false
	for _, r := range strings.ToLower(f.Title) {
		if unicode.IsLetter(r) || unicode.IsDigit(r) {
			if hyphen && b.Len() > 0 {
				b.WriteByte('-')
			}
			hyphen = false
			b.WriteRune(r)
		} else {
			hyphen = true
		}
		if b.Len() >= 60 {
			break
		}
	}
	slug := b.String()
	for len(slug) > 60 {
		_, size := utf8.DecodeLastRuneInString(slug)
		slug = slug[:len(slug)-size]
	}
	slug = strings.Trim(slug, "-")
	name := fmt.Sprintf("figure-%02d", f.Number)
	if slug != "" {
		name += "-" + slug
	}
	return name
}

// Write draws every figure into dir (made if missing) as NAME.svg and
// NAME.png, each written atomically. It returns the paths written.
func Write(ctx context.Context, dir string, figs []layout.Figure) ([]string, error) {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return nil, fmt.Errorf("cannot make the charts folder %s: %w", dir, err)
	}
	var paths []string
	for _, f := range figs {
		if err := ctx.Err(); err != nil {
			return paths, err
		}
		base := filepath.Join(dir, Name(f))
		if err := atomicfile.Write(ctx, base+".svg", 0o644, func(w io.Writer) error { return SVG(w, f) }); err != nil {
			return paths, err
		}
		paths = append(paths, base+".svg")
		if err := atomicfile.Write(ctx, base+".png", 0o644, func(w io.Writer) error { return PNG(w, f) }); err != nil {
			return paths, err
		}
		paths = append(paths, base+".png")
	}
	return paths, nil
}

// SVG draws a figure as an SVG document at its size in the pack.
func SVG(w io.Writer, f layout.Figure) error {
	c := vgsvg.NewWith(vgsvg.UseWH(size(f)), vgsvg.EmbedFonts(true))
	if err := drawOn(c, f); err != nil {
		return err
	}
	_, err := c.WriteTo(w)
	return err
}

// PNG draws a figure as a PNG image at DPI on a white background.
func PNG(w io.Writer, f layout.Figure) error {
	wd, ht := size(f)
	c := vgimg.NewWith(vgimg.UseWH(wd, ht), vgimg.UseDPI(DPI), vgimg.UseBackgroundColor(color.White))
	if err := drawOn(c, f); err != nil {
		return err
	}
	_, err := vgimg.PngCanvas{Canvas: c}.WriteTo(w)
	return err
}

func size(f layout.Figure) (vg.Length, vg.Length) {
	return vg.Length(f.Width) * mm, vg.Length(f.Height) * mm
}

func drawOn(c vg.CanvasSizer, f layout.Figure) (err error) {
	defer func() {
		if r := recover(); r != nil {
			err = fmt.Errorf("figure %d could not be drawn (internal error, please report it with the brief): %v", f.Number, r)
		}
	}()
	return f.Chart.Draw(draw.New(c))
}
