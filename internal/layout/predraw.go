package layout

import (
	"fmt"
	"runtime"
	"sync"
	"sync/atomic"

	"gonum.org/v1/plot/vg/draw"

	"peerpack/charts"
	"peerpack/internal/brief"
	"peerpack/internal/pdf"
)

// sizedChart is a brief's chart as a measuring pass set it: the size it
// will have in the final pass when that pass makes the same decisions.
type sizedChart struct {
	spec          *brief.ChartBlock
	ch            charts.Chart
	width, height float64 // mm
}

// predraw draws the charts of the final pass ahead of it, on the
// processors the layout leaves idle, each into a pdf.Recording; the final
// pass replays them in order, so the PDF is byte for byte the one drawn
// in line. Each chart is drawn once, by whichever comes first: a worker
// or the final pass, which waits for a drawing under way (sync.Once). The
// final pass touches a chart (its height, its drawing) only after its
// drawing is settled, so no chart is used by two goroutines at once.
type predraw struct {
	// replayed counts the charts set from their recordings (for tests).
	replayed atomic.Int64
	items    []*predrawn
	bySpec   map[*brief.ChartBlock][]*predrawn
	stop     atomic.Bool
	wg       sync.WaitGroup
}

type predrawn struct {
	sizedChart
	once sync.Once
	rec  *pdf.Recording
	err  error
}

// draw records the chart at its size; a panic becomes the same error the
// in-line drawing gives.
func (p *predrawn) draw() {
	c := pdf.Record(p.width, p.height)
	defer func() {
		c.Close()
		if r := recover(); r != nil {
			p.err = fmt.Errorf("could not be drawn (internal error, please report it with the brief): %v", r)
		}
		p.rec = c.Recording()
	}()
	p.err = p.ch.Draw(draw.New(c))
}

// startPredraw starts drawing the sized charts that plans made (the
// brief's chart blocks; charts a pass makes afresh, such as the
// composite's, are drawn in line) on GOMAXPROCS - 1 workers. With one
// processor it starts none and every chart is drawn in line.
func startPredraw(sized []sizedChart, plans *chartPlans) *predraw {
	workers := runtime.GOMAXPROCS(0) - 1
	if workers <= 0 || plans == nil {
		return nil
	}
	pd := &predraw{bySpec: map[*brief.ChartBlock][]*predrawn{}}
	for _, s := range sized {
		if p, ok := plans.byBlock[s.spec]; !ok || p.ch != s.ch || p.err != nil {
			continue
		}
		it := &predrawn{sizedChart: s}
		pd.items = append(pd.items, it)
		pd.bySpec[s.spec] = append(pd.bySpec[s.spec], it)
	}
	if len(pd.items) == 0 {
		return nil
	}
	var next atomic.Int64
	for range min(workers, len(pd.items)) {
		pd.wg.Add(1)
		go func() {
			defer pd.wg.Done()
			for !pd.stop.Load() {
				i := int(next.Add(1) - 1)
				if i >= len(pd.items) {
					return
				}
				pd.items[i].once.Do(pd.items[i].draw)
			}
		}()
	}
	return pd
}

// settle makes sure no worker is drawing spec's charts: each is drawn by
// now, or will be drawn by the final pass itself.
func (pd *predraw) settle(spec *brief.ChartBlock) {
	if pd == nil {
		return
	}
	for _, it := range pd.bySpec[spec] {
		it.once.Do(it.draw)
	}
}

// recording returns spec's chart drawn at width x height mm, if it was
// sized so.
func (pd *predraw) recording(spec *brief.ChartBlock, width, height float64) (*pdf.Recording, bool, error) {
	if pd == nil {
		return nil, false, nil
	}
	for _, it := range pd.bySpec[spec] {
		if it.width == width && it.height == height {
			it.once.Do(it.draw)
			return it.rec, it.rec != nil, it.err
		}
	}
	return nil, false, nil
}

// testReplayed, when set by a test, receives the number of charts set
// from recordings in a render.
var testReplayed func(n int64)

// finish stops the workers and waits for them.
func (pd *predraw) finish() {
	if testReplayed != nil {
		n := int64(0)
		if pd != nil {
			n = pd.replayed.Load()
		}
		testReplayed(n)
	}
	if pd == nil {
		return
	}
	pd.stop.Store(true)
	pd.wg.Wait()
}
