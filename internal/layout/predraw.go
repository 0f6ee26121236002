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
// in line. Charts are handed over as the first measuring pass sizes them
// (add), so drawing overlaps that pass, and again, with the sizes the
// final pass will use, once the measuring passes are done (addSized);
// a drawing at a size the final pass does not use is simply not
// replayed. Each chart is drawn once, by whichever comes first: a worker
// or a pass, which waits for a drawing under way (sync.Once). Every pass
// touches a chart (its height, its drawing) only after its drawings are
// settled (planChart), so no chart is used by two goroutines at once.
type predraw struct {
	// replayed counts the charts set from their recordings (for tests).
	replayed atomic.Int64
	plans    *chartPlans
	// discard: charts drawn for a draft keep nothing (predrawn.discard).
	discard bool
	// bySpec is used by the layout's goroutine alone.
	bySpec map[*brief.ChartBlock][]*predrawn

	mu     sync.Mutex
	more   *sync.Cond // signalled when items grow or the queue is sealed
	items  []*predrawn
	next   int
	sealed bool
	stop   atomic.Bool
	wg     sync.WaitGroup
}

type predrawn struct {
	sizedChart
	once sync.Once
	rec  *pdf.Recording
	err  error
	// discard: the pack is a draft (check), never written; the chart
	// is drawn only to prove it can be.
	discard bool
	// skipped: a measuring pass needed the chart before any worker
	// started it, so it is not drawn at all (set inside once, by hold,
	// on the layout's goroutine, which alone reads it).
	skipped bool
}

// draw records the chart at its size; a panic becomes the same error the
// in-line drawing gives.
func (p *predrawn) draw() {
	c := pdf.Record(p.width, p.height)
	if p.discard {
		c = pdf.RecordDiscarding(p.width, p.height)
	}
	defer func() {
		c.Close()
		if r := recover(); r != nil {
			p.err = fmt.Errorf("could not be drawn (internal error, please report it with the brief): %v", r)
		}
		p.rec = c.Recording()
	}()
	p.err = p.ch.Draw(draw.New(c))
}

// newPredraw starts GOMAXPROCS - 1 workers that draw the charts handed
// to them. With one processor it starts none and every chart is drawn in
// line.
func newPredraw(plans *chartPlans) *predraw {
	workers := runtime.GOMAXPROCS(0) - 1
	if workers <= 0 || plans == nil {
		return nil
	}
	pd := &predraw{plans: plans, bySpec: map[*brief.ChartBlock][]*predrawn{}}
	pd.more = sync.NewCond(&pd.mu)
	for range workers {
		pd.wg.Add(1)
		go func() {
			defer pd.wg.Done()
			for {
				it := pd.take()
				if it == nil {
					return
				}
				it.once.Do(it.draw)
			}
		}()
	}
	return pd
}

// take waits for the next chart to draw; nil when there is none to come.
func (pd *predraw) take() *predrawn {
	pd.mu.Lock()
	defer pd.mu.Unlock()
	for pd.next >= len(pd.items) && !pd.sealed && !pd.stop.Load() {
		pd.more.Wait()
	}
	if pd.stop.Load() || pd.next >= len(pd.items) {
		return nil
	}
	it := pd.items[pd.next]
	pd.next++
	return it
}

// add hands a sized chart to the workers, unless it is not one of the
// brief's planned charts (charts a pass makes afresh, such as the
// composite's, are drawn in line) or is already there at that size.
func (pd *predraw) add(s sizedChart) {
	if pd == nil {
		return
	}
	if p, ok := pd.plans.byBlock[s.spec]; !ok || p.ch != s.ch || p.err != nil {
		return
	}
	for _, it := range pd.bySpec[s.spec] {
		if it.width == s.width && it.height == s.height && !it.skipped {
			return
		}
	}
	it := &predrawn{sizedChart: s, discard: pd.discard}
	pd.bySpec[s.spec] = append(pd.bySpec[s.spec], it)
	pd.mu.Lock()
	pd.items = append(pd.items, it)
	pd.mu.Unlock()
	pd.more.Signal()
}

// addSized hands over the charts as the final pass will set them and
// seals the queue: the workers end when it is drawn.
func (pd *predraw) addSized(sized []sizedChart) {
	if pd == nil {
		return
	}
	for _, s := range sized {
		pd.add(s)
	}
	pd.mu.Lock()
	pd.sealed = true
	pd.mu.Unlock()
	pd.more.Broadcast()
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

// hold makes sure no worker is drawing spec's charts for a measuring
// pass, which only measures: a drawing under way is waited for, one not
// started is dropped (the final pass hands it over again if it needs it).
func (pd *predraw) hold(spec *brief.ChartBlock) {
	if pd == nil {
		return
	}
	for _, it := range pd.bySpec[spec] {
		it.once.Do(func() { it.skipped = true })
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
			if it.skipped {
				continue
			}
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
	pd.mu.Lock()
	pd.stop.Store(true)
	pd.mu.Unlock()
	pd.more.Broadcast()
	pd.wg.Wait()
}
