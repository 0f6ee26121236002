package pdf

import (
	"sync"
	"unicode"

	"codeberg.org/go-fonts/liberation/liberationsansbold"
	"codeberg.org/go-fonts/liberation/liberationsansregular"
	"codeberg.org/go-fonts/liberation/liberationserifbold"
	"codeberg.org/go-fonts/liberation/liberationserifregular"
	"golang.org/x/image/font/sfnt"
)

// shapedScripts are written right to left or need shaping (joining,
// reordering, stacking) that fpdf, which sets glyphs one after another
// left to right, does not do: a Hebrew name would print reversed, an
// Arabic one unjoined, a Devanagari one with its vowel signs misplaced.
var shapedScripts = []*unicode.RangeTable{
	unicode.Hebrew, unicode.Arabic, unicode.Syriac, unicode.Thaana, unicode.Nko,
	unicode.Samaritan, unicode.Mandaic, unicode.Devanagari, unicode.Bengali,
	unicode.Gurmukhi, unicode.Gujarati, unicode.Oriya, unicode.Tamil, unicode.Telugu,
	unicode.Kannada, unicode.Malayalam, unicode.Sinhala, unicode.Thai, unicode.Lao,
	unicode.Tibetan, unicode.Myanmar, unicode.Khmer, unicode.Mongolian,
}

var (
	coverOnce  sync.Once
	coverFaces []*sfnt.Font
	coverMu    sync.Mutex
	coverCache = map[rune]bool{}
)

// Uncovered returns the characters of s, each once and in order, that the
// pack cannot set: those missing from any of the embedded text faces
// (Liberation Sans and Serif, regular and bold; they cover Latin, Greek
// and Cyrillic, not Chinese, Japanese or Korean) and those of scripts
// written right to left or shaped. Spaces and control characters are
// never reported.
func Uncovered(s string) []rune {
	coverOnce.Do(func() {
		for _, ttf := range [][]byte{liberationsansregular.TTF, liberationsansbold.TTF, liberationserifregular.TTF, liberationserifbold.TTF} {
			if f, err := sfnt.Parse(ttf); err == nil {
				coverFaces = append(coverFaces, f)
			}
		}
	})
	var out []rune
	seen := map[rune]bool{}
	for _, r := range s {
		if r < 0x80 || unicode.IsSpace(r) || unicode.IsControl(r) || seen[r] {
			continue
		}
		seen[r] = true
		if !covered(r) {
			out = append(out, r)
		}
	}
	return out
}

func covered(r rune) bool {
	coverMu.Lock()
	defer coverMu.Unlock()
	if ok, known := coverCache[r]; known {
		return ok
	}
	ok := !unicode.In(r, shapedScripts...)
	var buf sfnt.Buffer
	for _, f := range coverFaces {
		if !ok {
			break
		}
		if i, err := f.GlyphIndex(&buf, r); err != nil || i == 0 {
			ok = false
		}
	}
	coverCache[r] = ok
	return ok
}
