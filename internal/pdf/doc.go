// Package pdf is the pack's document: one fpdf document with the Liberation
// fonts embedded as subset UTF-8 TrueType, exact ISO 216 / ANSI page sizes,
// metadata, an outline, internal links, the running header and footer, text
// and rule primitives, user images with capped dimensions, and a vg.Canvas
// that lets gonum/plot charts draw as vectors straight into the page.
//
// Coordinates are millimetres from the top-left corner of the page, as in
// fpdf, except inside a Canvas, which speaks gonum's points from the
// bottom-left corner of its rectangle.
package pdf

import (
	"fmt"
	"image/color"
	"strings"
	"time"

	"codeberg.org/go-pdf/fpdf"
)

// PointsPerMM converts millimetres to PostScript points (72 to the inch,
// 25.4 mm to the inch).
const PointsPerMM = 72 / 25.4

// Options configure a document.
type Options struct {
	Paper   Paper
	Margins Margins
	// Title, Author, Subject, Keywords, Creator and Producer fill the PDF
	// information dictionary; Lang the catalog's /Lang (BCP 47, "en-GB").
	Title, Author, Subject, Creator, Producer, Lang string
	Keywords                                        []string
	// Created stamps /CreationDate and /ModDate; the caller passes
	// SOURCE_DATE_EPOCH when set, so that builds are reproducible.
	Created time.Time
	// NoCompression leaves page streams readable, for debugging.
	NoCompression bool
}

// Furniture draws the running header and footer of a page; the document
// calls it for every page not added as plain.
type Furniture func(d *Doc, page int)

// Doc is a pack document under construction.
type Doc struct {
	f     *fpdf.Fpdf
	opt   Options
	fonts map[Font]bool // registered family+style (size 0)
	// used are the faces SetFont selected; onNewFace, when set, hears of
	// each face SetFont registers (AddFace, UnusedFaces).
	used      map[Font]bool
	onNewFace func(Font)
	cur       Font
	text      color.RGBA
	header    Furniture
	footer    Furniture
	plain     map[int]bool
	images    int
	canvasOn  bool
	// footerDone: the last page's footer is drawn (deflatePages), so
	// fpdf's Close must not draw it again.
	footerDone bool
}

// New starts an empty document.
func New(opt Options) *Doc {
	if opt.Paper.Width == 0 {
		opt.Paper = A4
	}
	if opt.Margins == (Margins{}) {
		opt.Margins = DefaultMargins
	}
	f := fpdf.NewCustom(&fpdf.InitType{
		OrientationStr: "P",
		UnitStr:        "mm",
		Size:           fpdf.SizeType{Wd: opt.Paper.Width, Ht: opt.Paper.Height},
	})
	f.SetCompression(!opt.NoCompression)
	f.SetMargins(opt.Margins.Left, opt.Margins.Top, opt.Margins.Right)
	// Page breaks are the layout's decision, never fpdf's.
	f.SetAutoPageBreak(false, opt.Margins.Bottom)
	f.SetCatalogSort(true)
	created := opt.Created
	if created.IsZero() {
		created = time.Now()
	}
	created = created.UTC()
	f.SetCreationDate(created)
	f.SetModificationDate(created)
	if opt.Title != "" {
		f.SetTitle(Printable(opt.Title), true)
	}
	if opt.Author != "" {
		f.SetAuthor(Printable(opt.Author), true)
	}
	if opt.Subject != "" {
		f.SetSubject(Printable(opt.Subject), true)
	}
	if len(opt.Keywords) > 0 {
		f.SetKeywords(Printable(strings.Join(opt.Keywords, ", ")), true)
	}
	if opt.Creator != "" {
		f.SetCreator(opt.Creator, true)
	}
	if opt.Producer != "" {
		f.SetProducer(opt.Producer, true)
	}
	if opt.Lang != "" {
		f.SetLang(opt.Lang)
	}
	f.SetDisplayMode("fullpage", "continuous")
	d := &Doc{f: f, opt: opt, fonts: map[Font]bool{}, used: map[Font]bool{}, plain: map[int]bool{}}
	f.SetHeaderFuncMode(func() {
		if d.header != nil && !d.plain[f.PageNo()] {
			d.header(d, f.PageNo())
		}
	}, false)
	f.SetFooterFunc(func() {
		if d.footerDone {
			return
		}
		if d.footer != nil && !d.plain[f.PageNo()] {
			d.footer(d, f.PageNo())
		}
	})
	d.SetFont(Font{Family: Sans, Size: 10})
	return d
}

// SetFurniture sets the functions that draw each page's header and footer.
// They run when a page is added (header) and when it is finished (footer).
func (d *Doc) SetFurniture(header, footer Furniture) {
	d.header, d.footer = header, footer
}

// Paper is the document's page size.
func (d *Doc) Paper() Paper { return d.opt.Paper }

// Margins are the document's page margins.
func (d *Doc) Margins() Margins { return d.opt.Margins }

// ContentWidth is the width between the side margins.
func (d *Doc) ContentWidth() float64 {
	return d.opt.Paper.Width - d.opt.Margins.Left - d.opt.Margins.Right
}

// ContentTop and ContentBottom bound the type area vertically.
func (d *Doc) ContentTop() float64 { return d.opt.Margins.Top }

// ContentBottom is the lowest y text may reach.
func (d *Doc) ContentBottom() float64 { return d.opt.Paper.Height - d.opt.Margins.Bottom }

// AddPage starts a page with header and footer.
func (d *Doc) AddPage() { d.addPage(false) }

// AddPlainPage starts a page without header and footer (the cover).
func (d *Doc) AddPlainPage() { d.addPage(true) }

func (d *Doc) addPage(plain bool) {
	if d.canvasOn {
		return
	}
	next := d.f.PageNo() + 1
	d.plain[next] = plain
	cur := d.cur
	d.f.AddPage()
	// fpdf restores the font after the header, but our furniture may leave
	// colours changed; put the body state back explicitly.
	d.SetFont(cur)
	d.SetTextColor(d.text)
}

// PageNo is the current page number (1-based).
func (d *Doc) PageNo() int { return d.f.PageNo() }

// Err is the first error fpdf met, if any.
func (d *Doc) Err() error { return d.f.Error() }

// Bytes closes the document and returns the PDF.
func (d *Doc) Bytes() ([]byte, error) {
	if err := d.f.Error(); err != nil {
		return nil, fmt.Errorf("the PDF could not be written: %w", err)
	}
	// The pages are compressed here, on every processor, rather than by
	// fpdf page after page (deflate.go).
	deflated := false
	if !d.opt.NoCompression {
		var err error
		if deflated, err = d.deflatePages(); err != nil {
			return nil, fmt.Errorf("the PDF's pages could not be compressed: %w", err)
		}
	}
	// fpdf hands its whole buffer over in one Write: keep it rather than
	// copy it (fpdf writes nothing more once the document is closed).
	var whole keepWriter
	if err := d.f.Output(&whole); err != nil {
		return nil, fmt.Errorf("the PDF could not be written: %w", err)
	}
	raw := whole.b
	if deflated {
		var err error
		if raw, err = markDeflated(raw); err != nil {
			return nil, fmt.Errorf("the PDF's compressed pages could not be marked: %w", err)
		}
	}
	out, err := finishStructure(tagSubsets(raw))
	if err != nil {
		return nil, fmt.Errorf("the PDF's structure could not be completed: %w", err)
	}
	return out, nil
}

// keepWriter keeps what it is given: the slice itself from a single
// Write, a copy once a second one comes.
type keepWriter struct {
	b      []byte
	copied bool
}

func (k *keepWriter) Write(p []byte) (int, error) {
	switch {
	case k.b == nil:
		k.b = p
	case !k.copied:
		k.b = append(append(make([]byte, 0, len(k.b)+len(p)), k.b...), p...)
		k.copied = true
	default:
		k.b = append(k.b, p...)
	}
	return len(p), nil
}
