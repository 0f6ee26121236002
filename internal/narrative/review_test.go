package narrative

import (
	"path/filepath"
	"testing"
)

// TestReview runs the review set: thirty-seven invented situations whose
// expected text was written by hand, from the templates and figures worked
// out by hand, before the code ran. A wording change shows here as a diff
// to review; the files are never rewritten by the test.
func TestReview(t *testing.T) {
	files, err := filepath.Glob("../../testdata/narrative/review/*.yaml")
	if err != nil {
		t.Fatal(err)
	}
	if len(files) < 30 {
		t.Fatalf("review set has %d situations, want at least 30", len(files))
	}
	for _, f := range files {
		t.Run(filepath.Base(f), func(t *testing.T) {
			s := loadSituation(t, f)
			if s.Expect == nil && s.Summary == nil {
				t.Fatal("situation has neither expect nor summary")
			}
			c, _, b := s.compose(t)
			if s.Expect != nil {
				if got := blockText(c, b); got != *s.Expect {
					t.Errorf("%s\nblock text:\n%s\nwant:\n%s", s.About, got, *s.Expect)
				}
			}
			if s.Summary != nil {
				if got := render(c.Summary); got != *s.Summary {
					t.Errorf("%s\nsummary:\n%s\nwant:\n%s", s.About, got, *s.Summary)
				}
			}
		})
	}
}
