package templates

import (
	"reflect"
	"strings"
	"testing"
)

func TestEditNotes(t *testing.T) {
	src := strings.Join([]string{
		"---",                                    // 1
		"# A comment that is not a note.",        // 2
		"# edit: the title your board will see",  // 3
		"# and the subtitle.",                    // 4
		"title: T",                               // 5
		"# edit: your id.",                       // 6
		"focus: KE007",                           // 7
		"---",                                    // 8
		"# edit: a Markdown heading, not a note", // 9
		"<!-- edit: one line -->",                // 10
		"Text <!-- not a note -->",               // 11
		"<!-- edit: several",                     // 12
		"lines of",                               // 13
		"note. -->",                              // 14
		"<!-- edit: never closed",                // 15
	}, "\n")
	want := []EditNote{
		{3, "the title your board will see and the subtitle."},
		{6, "your id."},
		{10, "one line"},
		{12, "several lines of note."},
		{15, "never closed"},
	}
	if got := EditNotes([]byte(src)); !reflect.DeepEqual(got, want) {
		t.Errorf("EditNotes:\n got %+v\nwant %+v", got, want)
	}
}

func TestEveryTemplateHasEditNotes(t *testing.T) {
	for _, name := range Names() {
		src, _ := Brief(name)
		notes := EditNotes(src)
		if len(notes) < 5 {
			t.Errorf("%s: %d edit notes", name, len(notes))
		}
		for _, n := range notes {
			if len(n.Text) < 10 {
				t.Errorf("%s:%d: edit note %q says too little", name, n.Line, n.Text)
			}
		}
	}
}

func FuzzEditNotes(f *testing.F) {
	for _, name := range Names() {
		src, _ := Brief(name)
		f.Add(src)
	}
	f.Add([]byte("---\n# edit:\n---\n<!-- edit:"))
	f.Fuzz(func(t *testing.T, src []byte) {
		n := strings.Count(string(src), "\n") + 1
		prev := 0
		for _, note := range EditNotes(src) {
			if note.Line <= prev || note.Line > n {
				t.Fatalf("note line %d out of order or beyond the %d lines", note.Line, n)
			}
			prev = note.Line
		}
	})
}
