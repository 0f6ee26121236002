package charts

import (
	"strconv"
	"sync"
	"testing"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/vg"
)

// A kept box is the box gonum's plain handler measures, on the first call
// and on every later one, from several goroutines at once.
func TestMeasuredTextAsPlain(t *testing.T) {
	texts := []string{"", "0", "1,250", "Høgskolen i Vårdø", "Politechnika Źródłowa", "AVAWAT To", "−12.5%", "Q1–Q3"}
	var fonts []font.Font
	for _, th := range []Theme{{}, {Serif: true}} {
		for _, size := range []float64{sizeTick, sizeLabel, sizeLegend, 11.5} {
			fonts = append(fonts, th.font(size, false), th.font(size, true))
		}
	}
	var wg sync.WaitGroup
	for g := range 2 {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for round := range 3 {
				for _, f := range fonts {
					for _, s := range texts {
						w, h, d := chartText.Box(s, f)
						pw, ph, pd := plot.DefaultTextHandler.Box(s, f)
						if w != pw || h != ph || d != pd {
							t.Errorf("goroutine %d, round %d, %q in %v: box %v %v %v, plain handler %v %v %v", g, round, s, f, w, h, d, pw, ph, pd)
						}
					}
				}
			}
		}()
	}
	wg.Wait()
}

// The kept boxes never outgrow their bound.
func TestMeasuredTextBounded(t *testing.T) {
	f := Theme{}.font(sizeLabel, false)
	for i := range maxTextBoxes + 10 {
		chartText.Box("label "+strconv.Itoa(i), f)
	}
	textBoxes.Lock()
	n := len(textBoxes.m)
	textBoxes.Unlock()
	if n > maxTextBoxes || n == 0 {
		t.Errorf("%d boxes kept, bound %d", n, maxTextBoxes)
	}
	w, _, _ := chartText.Box("label 3", f)
	if pw, _, _ := plot.DefaultTextHandler.Box("label 3", f); w != pw || w <= vg.Length(0) {
		t.Errorf("after emptying, width %v, plain handler %v", w, pw)
	}
}
