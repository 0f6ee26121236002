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
// NAME.png, as one outcome: every file is drawn before any reaches dir,
// and a failure leaves dir as it was. It returns the paths written.
func Write(ctx context.Context, dir string, figs []layout.Figure) ([]string, error) {
	var set atomicfile.Set
	paths, err := Add(ctx, &set, dir, figs)
	if err != nil {
		set.Discard()
		return nil, err
	}
	if err := set.Commit(ctx); err != nil {
		return nil, err
	}
	return paths, nil
}

// Add draws every figure as Write does into a folder of set, so that the
// charts are replaced together with the set's other outputs (the pack)
// or not at all. It returns the paths the files will have; on error the
// caller discards the set.
func Add(ctx context.Context, set *atomicfile.Set, dir string, figs []layout.Figure) ([]string, error) {
	folder, err := set.Folder(dir, 0o755)
	if err != nil {
		return nil, fmt.Errorf("cannot make the charts folder %s: %w", dir, err)
	}
	var paths []string
	for _, f := range figs {
		if err := ctx.Err(); err != nil {
			return nil, err
		}
		name := Name(f)
		if err := folder.Add(name+".svg", 0o644, func(w io.Writer) error { return SVG(w, f) }); err != nil {
			return nil, err
		}
		if err := folder.Add(name+".png", 0o644, func(w io.Writer) error { return PNG(w, f) }); err != nil {
			return nil, err
		}
		paths = append(paths, filepath.Join(dir, name+".svg"), filepath.Join(dir, name+".png"))
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
