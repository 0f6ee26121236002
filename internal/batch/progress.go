package batch

import (
	"fmt"
	"io"
	"os"
	"strings"

	"golang.org/x/term"
	"golang.org/x/text/width"
)

// NewProgress returns a bar that redraws one line on a terminal, or plain
// lines (one per finished pack) when w is not a terminal, so logs stay
// readable. A terminal is what the terminal driver answers for (isatty via
// golang.org/x/term): a character device such as /dev/null is not one.
func NewProgress(w io.Writer) Progress {
	if f, ok := w.(*os.File); ok && term.IsTerminal(int(f.Fd())) {
		fd := int(f.Fd())
		return &bar{w: w, cols: func() int {
			c, _, err := term.GetSize(fd)
			if err != nil {
				return 0
			}
			return c
		}}
	}
	return &lines{w: w}
}

// fallbackCols is the width assumed when the terminal does not report one.
const fallbackCols = 80

type bar struct {
	w io.Writer
	// cols reports the terminal's width now, so a resized window is
	// followed; 0 when unknown.
	cols  func() int
	fails int
}

func (b *bar) Start(total int) { b.draw(0, total, "") }

func (b *bar) Done(o Outcome, finished, total int) {
	if o.Err != nil {
		b.fails++
	}
	b.draw(finished, total, o.Job.Output)
}

// draw rewrites the line in place. The line is kept one column short of
// the terminal's width: a line that fills the last column makes many
// terminals wrap, and each redraw would then start a new line.
func (b *bar) draw(done, total int, last string) {
	cols := 0
	if b.cols != nil {
		cols = b.cols()
	}
	if cols <= 0 {
		cols = fallbackCols
	}
	fmt.Fprint(b.w, "\r"+barLine(done, total, b.fails, last, cols-1))
}

// barLine is the bar's text, exactly room columns wide (padded with
// spaces so a shorter redraw covers a longer one).
func barLine(done, total, fails int, last string, room int) string {
	counts := fmt.Sprintf(" %d/%d packs, %d failed", done, total, fails)
	// The bar takes what is left after the counts and a name of up to 28
	// columns, between 10 and 30 cells.
	barW := min(30, room-columns(counts)-2-30)
	var s string
	if barW >= 10 {
		filled := 0
		if total > 0 {
			filled = done * barW / total
		}
		s = "[" + strings.Repeat("#", filled) + strings.Repeat(".", barW-filled) + "]"
	}
	s += counts
	if last != "" {
		s += "  " + last
	}
	s = cutColumns(s, room)
	return s + strings.Repeat(" ", max(0, room-columns(s)))
}

// runeColumns is how many terminal columns r takes: two for East Asian
// wide and fullwidth characters (Unicode Standard Annex #11), none for
// combining marks and controls, one otherwise (common practice, no source;
// wcwidth does the same).
func runeColumns(r rune) int {
	switch {
	case r < 0x20 || r == 0x7f:
		return 0
	case r >= 0x300 && r <= 0x36f, r == 0x200b, r >= 0x200c && r <= 0x200f:
		return 0
	}
	switch width.LookupRune(r).Kind() {
	case width.EastAsianWide, width.EastAsianFullwidth:
		return 2
	}
	return 1
}

func columns(s string) int {
	n := 0
	for _, r := range s {
		n += runeColumns(r)
	}
	return n
}

// cutColumns shortens s to at most room columns, cutting between
// characters (never inside a UTF-8 sequence) and marking the cut with "…".
func cutColumns(s string, room int) string {
	if room <= 0 {
		return ""
	}
	if columns(s) <= room {
		return s
	}
	n := 0
	for i, r := range s {
		c := runeColumns(r)
		if n+c > room-1 {
			return s[:i] + "…"
		}
		n += c
	}
	return s
}

func (b *bar) Finish() { fmt.Fprintln(b.w) }

type lines struct{ w io.Writer }

func (l *lines) Start(total int) { fmt.Fprintf(l.w, "building %d packs\n", total) }

func (l *lines) Done(o Outcome, finished, total int) {
	status := "ok"
	if o.Err != nil {
		status = "FAILED"
	}
	fmt.Fprintf(l.w, "[%d/%d] %s %s\n", finished, total, status, o.Job.Output)
}

func (l *lines) Finish() {}
