package diag

import (
	"errors"
	"fmt"
	"strings"
	"testing"
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
