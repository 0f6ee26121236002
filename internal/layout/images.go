package layout

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"math"
	"path"
	"strings"

	"github.com/yuin/goldmark/ast"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/pdf"
)

// imageRef is a Markdown image waiting to be placed after its paragraph.
type imageRef struct {
	path, alt string
	pos       brief.Pos
}

// image records a Markdown image; images are set as figures below the
// paragraph they appear in, at most the frame's width and a third of the
// page's height, their alternative text as the caption.
func (w *writer) image(n ast.Node, entering bool) ast.WalkStatus {
	if !entering {
		return ast.WalkSkipChildren
	}
	img := n.(*ast.Image)
	var alt strings.Builder
	for c := n.FirstChild(); c != nil; c = c.NextSibling() {
		if t, ok := c.(*ast.Text); ok {
			alt.Write(t.Segment.Value(w.src))
		}
	}
	w.images = append(w.images, imageRef{path: string(img.Destination), alt: unescape(alt.String()), pos: w.nodePos(n)})
	return ast.WalkSkipChildren
}

func (w *writer) placeImages() {
	refs := w.images
	w.images = nil
	for _, r := range refs {
		info, err := w.loadImage(r.path)
		if err != nil {
			w.failAt(r.pos, "%v", err)
			continue
		}
		maxW := w.width - w.indent
		maxH := (w.bottom() - w.frameTop()) / 3
		// Never enlarge beyond 150 pixels to the inch, where a raster
		// starts to look soft in print (common practice, no source).
		natW, natH := naturalSize(info)
		iw, ih := fitBox(float64(info.Width), float64(info.Height), math.Min(maxW, natW), math.Min(maxH, natH))
		w.figureNo++
		capSp := w.captionSpans("Figure", w.figureNo, r.alt)
		capLines := w.wrap(capSp, w.tokenize(capSp), maxW, maxW)
		need := ih + 2 + float64(len(capLines))*w.st.lineHeight(captionSize)
		w.ensure(need + chartSpacing)
		x := w.x + w.indent + (maxW-iw)/2
		if !w.measuring {
			w.doc.DrawImage(info, x, w.y, iw, ih)
		}
		w.y += ih + 1.5
		for _, ln := range capLines {
			w.drawLine(capSp, ln, w.x+w.indent, w.y+pdf.PtToMM(captionSize)*0.8)
			w.y += w.st.lineHeight(captionSize)
		}
		w.y += chartSpacing
	}
}

// naturalSize is an image's size in mm at printDPI.
func naturalSize(info *pdf.ImageInfo) (float64, float64) {
	const printDPI = 150
	return float64(info.Width) * 25.4 / printDPI, float64(info.Height) * 25.4 / printDPI
}

// fitBox scales w x h to fit inside maxW x maxH, keeping the aspect.
func fitBox(w, h, maxW, maxH float64) (float64, float64) {
	if w <= 0 || h <= 0 {
		return maxW, maxH
	}
	s := maxW / w
	if h*s > maxH {
		s = maxH / h
	}
	return w * s, h * s
}

// loadImage reads a PNG or JPEG from the brief's root. Paths are relative
// to the brief; anything leading out of the root is refused by fs.FS.
// Images are registered once per path.
func (w *writer) loadImage(p string) (*pdf.ImageInfo, error) {
	if w.imageCache == nil {
		w.imageCache = map[string]*pdf.ImageInfo{}
	}
	if info, ok := w.imageCache[p]; ok {
		return info, nil
	}
	if w.in.FS == nil {
		return nil, fmt.Errorf("image %q cannot be read: the build has no folder to read images from", p)
	}
	clean := path.Clean(strings.TrimPrefix(p, "./"))
	if !fs.ValidPath(clean) {
		return nil, fmt.Errorf("image path %q must be relative to the brief and stay inside its folder", p)
	}
	// Kind first: opening a named pipe would block, a device never end.
	if fi, err := fs.Stat(w.in.FS, clean); err == nil {
		if kind := dataset.NotAFile(fi.Mode()); kind != "" {
			return nil, fmt.Errorf("image %q is %s, not a file; name a PNG or JPEG file", p, kind)
		}
	} else if !errors.Is(err, fs.ErrNotExist) {
		return nil, fmt.Errorf("image %q %s", p, dataset.OpenProblem(err))
	}
	f, err := w.in.FS.Open(clean)
	if err != nil {
		return nil, fmt.Errorf("image %q cannot be opened: %v; check the path, relative to the brief", p, unwrapPath(err))
	}
	defer f.Close()
	data, err := io.ReadAll(io.LimitReader(f, pdf.MaxImageBytes+1))
	if err != nil {
		return nil, fmt.Errorf("image %q cannot be read: %v", p, unwrapPath(err))
	}
	info, err := w.doc.RegisterImage(fmt.Sprintf("image %q", p), data)
	if err != nil {
		return nil, err
	}
	w.imageCache[p] = info
	return info, nil
}

func unwrapPath(err error) error {
	if pe, ok := err.(*fs.PathError); ok {
		return pe.Err
	}
	return err
}
