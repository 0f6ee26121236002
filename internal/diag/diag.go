// Package diag carries problems found in a user's inputs: where (file, line,
// column), what is wrong and what to do. Every stage reports through it so
// that `peerpack check` can list all problems at once and `build` can stop at
// the first with the same words.
package diag

import (
	"errors"
	"fmt"
	"strings"
	"unicode/utf8"
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

// At makes a Problem. Text echoed from an input (a 50 MB cell, a runaway
// id) is never repeated whole: see Tidy.
func At(file string, line, col int, format string, args ...any) *Problem {
	return &Problem{File: file, Line: line, Column: col, Msg: Tidy(fmt.Sprintf(format, args...))}
}

// MaxWord is the longest run without spaces a message repeats whole, and
// MaxMsg the longest message.
const (
	MaxWord = 200
	MaxMsg  = 2000
)

// Tidy shortens what no reader can take in: a run of more than MaxWord
// bytes without a space becomes its first 60 characters, an ellipsis and
// its size; a message still over MaxMsg bytes keeps its start and its end
// (where the advice is) around a note of what was left out.
func Tidy(msg string) string {
	if len(msg) <= MaxWord {
		return msg
	}
	var b strings.Builder
	start := 0
	flush := func(end int) {
		if w := msg[start:end]; len(w) > MaxWord {
			b.WriteString(clip(w))
		} else {
			b.WriteString(w)
		}
	}
	for i, r := range msg {
		if r == ' ' || r == '\n' {
			flush(i)
			b.WriteRune(r)
			start = i + 1
		}
	}
	flush(len(msg))
	out := b.String()
	if len(out) > MaxMsg {
		head, tail := validCut(out, 1200), validCutFromEnd(out, 600)
		out = fmt.Sprintf("%s … [%s bytes left out] … %s", head, group(len(out)-len(head)-len(tail)), tail)
	}
	return out
}

func clip(s string) string {
	head := validCut(s, 60)
	if len(head) == len(s) {
		return s
	}
	return fmt.Sprintf("%s… (%s bytes)", head, group(len(s)))
}

// validCut is s cut to at most n bytes at a character boundary.
func validCut(s string, n int) string {
	if len(s) <= n {
		return s
	}
	for n > 0 && !utf8.RuneStart(s[n]) {
		n--
	}
	return s[:n]
}

func validCutFromEnd(s string, n int) string {
	if len(s) <= n {
		return s
	}
	i := len(s) - n
	for i < len(s) && !utf8.RuneStart(s[i]) {
		i++
	}
	return s[i:]
}

func group(n int) string {
	s := fmt.Sprint(n)
	for i := len(s) - 3; i > 0; i -= 3 {
		s = s[:i] + "," + s[i:]
	}
	return s
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
