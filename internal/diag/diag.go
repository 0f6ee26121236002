// Package diag carries problems found in a user's inputs: where (file, line,
// column), what is wrong and what to do. Every stage reports through it so
// that `peerpack check` can list all problems at once and `build` can stop at
// the first with the same words.
package diag

import (
	"errors"
	"fmt"
	"strings"
)

// Problem is one thing wrong with an input.
type Problem struct {
	File   string
	Line   int // 1-based; 0 when not known
	Column int // 1-based; 0 when not known
	Msg    string
}

func (p *Problem) Error() string {
	var b strings.Builder
	b.WriteString(p.File)
	if p.Line > 0 {
		fmt.Fprintf(&b, ":%d", p.Line)
		if p.Column > 0 {
			fmt.Fprintf(&b, ":%d", p.Column)
		}
	}
	if b.Len() > 0 {
		b.WriteString(": ")
	}
	b.WriteString(p.Msg)
	return b.String()
}

// At makes a Problem.
func At(file string, line, col int, format string, args ...any) *Problem {
	return &Problem{File: file, Line: line, Column: col, Msg: fmt.Sprintf(format, args...)}
}

// List gathers problems; its zero value is ready to use.
type List struct {
	Items []error
	// Max caps how many are kept (0: 200) so a broken file of a million
	// rows does not print a million lines.
	Max     int
	dropped int
}

// Add appends a problem (nil is ignored). An error that is itself a List is
// flattened.
func (l *List) Add(err error) {
	if err == nil {
		return
	}
	var other *List
	if errors.As(err, &other) && other != l {
		for _, e := range other.Items {
			l.Add(e)
		}
		l.dropped += other.dropped
		return
	}
	max := l.Max
	if max == 0 {
		max = 200
	}
	if len(l.Items) >= max {
		l.dropped++
		return
	}
	l.Items = append(l.Items, err)
}

// Addf appends a positioned problem.
func (l *List) Addf(file string, line, col int, format string, args ...any) {
	l.Add(At(file, line, col, format, args...))
}

// Len is the number of problems kept.
func (l *List) Len() int { return len(l.Items) }

// Err returns nil when empty, otherwise the list as an error.
func (l *List) Err() error {
	if l == nil || len(l.Items) == 0 {
		return nil
	}
	return l
}

func (l *List) Error() string {
	lines := make([]string, 0, len(l.Items)+1)
	for _, e := range l.Items {
		lines = append(lines, e.Error())
	}
	if l.dropped > 0 {
		lines = append(lines, fmt.Sprintf("... and %d more problems not shown", l.dropped))
	}
	return strings.Join(lines, "\n")
}

// Dropped is the number of problems past Max that were counted, not kept.
func (l *List) Dropped() int { return l.dropped }

// Unwrap exposes the items to errors.Is and errors.As.
func (l *List) Unwrap() []error { return l.Items }
