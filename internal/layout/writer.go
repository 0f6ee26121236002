package layout

import (
	"image/color"
	"math"
	"strconv"

	"github.com/yuin/goldmark/ast"

	"peerpack/internal/brief"
	"peerpack/internal/diag"
	"peerpack/internal/figures"
	"peerpack/internal/narrative"
	"peerpack/internal/pdf"
)

// writer is the shared state of one layout pass: the document, the frame
// text is flowing into, the inline style stack and what the pass records
// (heading pages for the contents, problems).
type writer struct {
	in  Input
	b   *brief.Brief
	m   *figures.Model
	com *narrative.Commentary
	doc *pdf.Doc
	st  style
	src []byte
	// measuring is true in the first pass, which only finds where
	// headings fall: charts are measured, not drawn.
	measuring bool
	// sized are the brief's charts as a measuring pass set them.
	sized []sizedChart

	// The frame: left edge, width, current y and the bottom limit. With
	// columns, the frame is one column; colTop is where columns start.
	x, width, y float64
	cols, col   int
	colTop      float64
	colMax      float64 // lowest y any column of the band reached
	colLimit    float64 // balance line of the columns being set, 0 for none
	colBuf      []colItem
	flushing    bool
	colGap      float64

	// Inline state.
	spans       []span
	bold        int
	italic      int
	code        int
	strike      int
	links       []string
	raise       float64
	inlineSize  float64
	inlineColor color.RGBA
	marker      *span // list marker waiting for the item's first line
	images      []imageRef
	consumed    map[ast.Node]bool

	// Block state.
	depth  int // list and quote nesting
	indent float64
	lists  []*listState
	// quotes holds, per open block quote, the bar's offset from the
	// frame's left edge; every set line draws the bars beside it.
	quotes       []float64
	tight        bool
	keep         float64 // room the heading being set must keep below it
	outlineLevel int     // level of the last outline entry

	// Numbering and records.
	figureNo, tableNo int
	// figures are the charts drawn, in order (not in the measuring pass).
	figures     []Figure
	headings    []headingRec
	known       *passRecord // from the first pass; nil in it
	pendingHalf *halfChart
	problems    diag.List
	funcs       map[ast.NodeKind]nodeFunc
	blockAt     map[int]brief.Block
	imageCache  map[string]*pdf.ImageInfo
	// own is the brief's own cautions section, nil when it has none; the
	// closing section then states only what it leaves out.
	own *ownCautions

	// Fitting (fit.go): the plan both passes follow, the section being
	// set (counted at each fresh start: a level-1 heading or a page
	// break), and what a measuring pass notes per page and section.
	plan        *fitPlan
	section     int
	pages       []pageRecord
	chartHeight map[int]float64
	headed      map[int]bool // sections that open with a level-1 heading
	tableCount  map[int]int
}

// passRecord is what the first pass learns for the second.
type passRecord struct {
	headings []headingRec
	pages    int
	// contentsPages is how many pages the contents takes in the second
	// pass; the first reserves one, so later pages shift by the rest.
	contentsPages int
}

// headingRec is one entry of the contents.
type headingRec struct {
	title string
	level int
	page  int
	link  int
}

type listState struct {
	ordered bool
	next    int
	marker  byte
}

// drawBars draws the block-quote bars beside a line from y to y+h.
func (w *writer) drawBars(y, h float64) {
	if w.measuring {
		return
	}
	for _, off := range w.quotes {
		w.doc.Line(w.x+off, y, w.x+off, y+h, 0.7, w.st.tint2())
	}
}

// failAt records a problem at a position in the brief.
func (w *writer) failAt(pos brief.Pos, format string, args ...any) {
	w.problems.Addf(w.b.File, pos.Line, pos.Column, format, args...)
}

// bottom is the lowest y of the frame: the type area's foot, or, while
// balanced columns are set, the balance line for all but the last column.
func (w *writer) bottom() float64 {
	b := w.doc.ContentBottom()
	if w.colLimit > 0 && w.cols > 1 && w.col < w.cols-1 {
		return math.Min(b, w.colLimit)
	}
	return b
}

// newPage starts a content page and resets the frame to one column, or to
// the first of several columns.
func (w *writer) newPage() {
	if !w.flushing {
		w.flushColumns()
	}
	w.notePage()
	w.doc.AddPage()
	w.y = w.doc.ContentTop()
	w.colTop, w.colMax = w.y, w.y
	w.col = 0
	w.setFrame()
}

// setFrame places the frame for the current column.
func (w *writer) setFrame() {
	full := w.doc.ContentWidth()
	left := w.doc.Margins().Left
	if w.cols <= 1 {
		w.x, w.width = left, full
		return
	}
	cw := (full - float64(w.cols-1)*w.colGap) / float64(w.cols)
	w.x = left + float64(w.col)*(cw+w.colGap)
	w.width = cw
}

// spanColumns runs f with the frame at the full text width, below the
// columns set so far, and resumes the columns under what f set: tables
// and charts in a multi-column section span the columns rather than
// being squeezed into one.
func (w *writer) spanColumns(f func()) {
	if w.cols <= 1 {
		f()
		return
	}
	w.flushColumns()
	cols := w.cols
	w.y = math.Max(w.y, w.colMax)
	w.cols, w.col = 1, 0
	w.setFrame()
	f()
	w.cols, w.col = cols, 0
	w.colTop, w.colMax = w.y, w.y
	w.setFrame()
}

// nextFrame moves to the next column, or the next page after the last.
func (w *writer) nextFrame() {
	if w.cols > 1 && w.col < w.cols-1 {
		w.colMax = math.Max(w.colMax, w.y)
		w.col++
		w.y = w.colTop
		w.setFrame()
		return
	}
	w.newPage()
}

// ensure moves to a new frame unless h millimetres fit below y.
func (w *writer) ensure(h float64) {
	if w.y+h > w.bottom()+0.01 && w.y > w.frameTop()+0.01 {
		w.nextFrame()
	}
}

func (w *writer) frameTop() float64 {
	if w.cols > 1 {
		return w.colTop
	}
	return w.doc.ContentTop()
}

// atFrameTop reports whether nothing has been set in the frame yet.
func (w *writer) atFrameTop() bool { return w.y <= w.frameTop()+0.5 }

// setColumns switches the flow to n columns from the current y.
func (w *writer) setColumns(n int) {
	if n < 1 {
		n = 1
	}
	if n == w.cols {
		return
	}
	w.flushColumns()
	if w.cols > 1 {
		// Leave the columns below the longest of them.
		w.y = math.Max(w.y, w.colMax)
	}
	w.cols, w.col = n, 0
	w.colTop, w.colMax = w.y, w.y
	w.setFrame()
}

func itoa(i int) string { return strconv.Itoa(i) }
