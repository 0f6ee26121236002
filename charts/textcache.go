package charts

import (
	"sync"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
)

// measuredText is the text handler of every chart style: gonum's plain
// handler with the boxes it measures kept. A chart measures the same
// tick labels, names and legend entries again and again (axis sizing,
// the dry run that counts dropped labels, the height asked for, the
// drawing), and each measure walks the string glyph by glyph through the
// font's kerning table. Boxes depend on the text and the font alone, so
// a kept box is the box gonum would measure, and charts stay the same
// to the byte (TestMeasuredTextAsPlain; the charts' golden files).
type measuredText struct{ text.Handler }

// textBoxes holds measured boxes for all charts (they are drawn on
// several goroutines at once). It is emptied when it reaches
// maxTextBoxes entries, so a long batch of packs keeps it bounded.
var textBoxes = struct {
	sync.Mutex
	m map[textKey][3]vg.Length
}{m: map[textKey][3]vg.Length{}}

const maxTextBoxes = 1 << 14

type textKey struct {
	txt string
	fnt font.Font
}

var chartText text.Handler = measuredText{plot.DefaultTextHandler}

// Box is the plain handler's box of one line, measured once.
func (h measuredText) Box(txt string, fnt font.Font) (width, height, depth vg.Length) {
	k := textKey{txt, fnt}
	textBoxes.Lock()
	b, ok := textBoxes.m[k]
	textBoxes.Unlock()
	if ok {
		return b[0], b[1], b[2]
	}
	width, height, depth = h.Handler.Box(txt, fnt)
	textBoxes.Lock()
	if len(textBoxes.m) >= maxTextBoxes {
		clear(textBoxes.m)
	}
	textBoxes.m[k] = [3]vg.Length{width, height, depth}
	textBoxes.Unlock()
	return width, height, depth
}
