package batch

import (
	"fmt"
	"io"
	"os"
	"strings"
)

// NewProgress returns a bar that redraws one line on a terminal, or plain
// lines (one per finished pack) when w is not a terminal, so logs stay
// readable.
func NewProgress(w io.Writer) Progress {
	if f, ok := w.(*os.File); ok {
		if fi, err := f.Stat(); err == nil && fi.Mode()&os.ModeCharDevice != 0 {
			return &bar{w: w}
		}
	}
	return &lines{w: w}
}

type bar struct {
	w     io.Writer
	fails int
}

func (b *bar) Start(total int) { b.draw(0, total, "") }

func (b *bar) Done(o Outcome, finished, total int) {
	if o.Err != nil {
		b.fails++
	}
	b.draw(finished, total, o.Job.Output)
}

func (b *bar) draw(done, total int, last string) {
	const width = 30
	filled := 0
	if total > 0 {
		filled = done * width / total
	}
	if len(last) > 28 {
		last = last[:28]
	}
	fmt.Fprintf(b.w, "\r[%s%s] %d/%d packs, %d failed  %-28s", strings.Repeat("#", filled), strings.Repeat(".", width-filled), done, total, b.fails, last)
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
