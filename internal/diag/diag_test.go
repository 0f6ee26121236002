package diag

import (
	"errors"
	"fmt"
	"strings"
	"testing"
	"unicode/utf8"
)

// The file:line:column: message form is the GNU Coding Standards' format
// for error messages ("Formatting Error Messages"), which editors and CI
// annotators parse (from memory).
func TestProblemFormat(t *testing.T) {
	cases := []struct {
		p    *Problem
		want string
	}{
		{At("values.csv", 12, 3, "bad %s", "number"), "values.csv:12:3: bad number"},
		{At("values.csv", 12, 0, "bad"), "values.csv:12: bad"},
		{At("brief.md", 0, 0, "cannot read"), "brief.md: cannot read"},
	}
	for _, c := range cases {
		if got := c.p.Error(); got != c.want {
			t.Errorf("got %q, want %q", got, c.want)
		}
	}
}

func TestListFlattensAndCaps(t *testing.T) {
	var inner List
	inner.Addf("a.csv", 1, 1, "first")
	inner.Addf("a.csv", 2, 1, "second")
	var outer List
	outer.Add(nil)
	outer.Add(&inner)
	outer.Add(fmt.Errorf("plain"))
	if outer.Len() != 3 {
		t.Fatalf("len %d", outer.Len())
	}
	var p *Problem
	if !errors.As(outer.Err(), &p) || p.Msg != "first" {
		t.Errorf("errors.As did not find the first problem: %v", p)
	}
	capped := List{Max: 2}
	for i := 0; i < 5; i++ {
		capped.Addf("v.csv", i+1, 1, "bad")
	}
	if !strings.HasSuffix(capped.Error(), "... and 3 more problems not shown") {
		t.Errorf("cap message: %q", capped.Error())
	}
	var empty List
	if empty.Err() != nil {
		t.Error("empty list is not nil")
	}
}

// A long cell (5 MiB here, 5,242,880 bytes, plus the quotes and colon the
// message puts around it) is never echoed whole (common practice, no source: a
// message is read on a terminal); the advice at the end survives.
func TestTidyLongEchoes(t *testing.T) {
	cell := strings.Repeat("9", 5<<20)
	p := At("values.csv", 2, 19, "unknown indicator key %q: it is not in the dictionary; correct the key", cell)
	want := `values.csv:2:19: unknown indicator key "` + strings.Repeat("9", 59) + `… (5,242,883 bytes) it is not in the dictionary; correct the key`
	if p.Error() != want {
		t.Errorf("got  %.300s\nwant %s", p.Error(), want)
	}
	spaced := strings.Repeat("ab ", 1<<20)
	msg := At("brief.md", 1, 1, "title %q is too long; shorten it", spaced).Msg
	if len(msg) > MaxMsg+100 || !strings.HasSuffix(msg, "; shorten it") || !strings.Contains(msg, "bytes left out") {
		t.Errorf("a long spaced text: %d bytes, ends %q", len(msg), msg[max(0, len(msg)-40):])
	}
	if got := At("f", 1, 1, "%s", "short text").Msg; got != "short text" {
		t.Errorf("short messages are untouched, got %q", got)
	}
	// Cuts fall on character boundaries (valid UTF-8 out).
	if m := At("f", 0, 0, "%s", strings.Repeat("ø", 500)).Msg; !utf8.ValidString(m) {
		t.Errorf("cut inside a character: %q", m)
	}
}
