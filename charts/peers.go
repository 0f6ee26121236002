package charts

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
)

// NewSectorMap plans the map of the sector: every clustered institution
// on the first two principal components of the standardised profiles,
// clusters by colour and shape (GroupSeries), the focus marked, the
// focus's nearest profiles, each cluster's typical member and the given
// institutions labelled, the variance each axis carries in its title, and
// the indicators' loadings as arrows when asked. It reads the figures
// model's peers part and computes nothing.
func NewSectorMap(m *figures.Model, loadings bool, label []int, th Theme) (Chart, error) {
	pm := m.Peers
	if pm == nil {
		return nil, fmt.Errorf("the sector map needs the brief's peers: section")
	}
	a := pm.Analysis
	axis := func(c int) dataset.Indicator {
		name := fmt.Sprintf("Component %d (%s%% of variance)", c+1, format.Int(int(math.Round(a.PCA.Explained[c]*100))))
		return dataset.Indicator{Key: fmt.Sprintf("pc%d", c+1), Label: name, Short: name, Better: dataset.Neutral}
	}
	sc := &ScatterChart{XInd: axis(0), YInd: axis(1), Theme: th}
	sc.Groups = make([]ScatterGroup, a.K)
	for c, k := range pm.Clusters {
		sc.Groups[c].Label = fmt.Sprintf("%d %s", k.Number, k.Name)
	}
	for r, l := range a.Labels {
		sc.Groups[l].X = append(sc.Groups[l].X, a.PCA.Scores[r*2])
		sc.Groups[l].Y = append(sc.Groups[l].Y, a.PCA.Scores[r*2+1])
	}
	if x, y, ok := pm.MapPoint(m.Focus); ok {
		sc.Focus = ScatterMark{Label: institution(m, m.Focus).Name, X: x, Y: y}
		sc.HasFocus = true
	}
	seen := map[int]bool{m.Focus: true}
	mark := func(inst int) {
		if seen[inst] {
			return
		}
		seen[inst] = true
		if x, y, ok := pm.MapPoint(inst); ok {
			sc.Marks = append(sc.Marks, ScatterMark{Label: fitName(institution(m, inst), th.labelStyle(), vg.Points(110)), X: x, Y: y})
		}
	}
	for _, nb := range pm.Nearest {
		mark(nb.Institution)
	}
	for _, k := range pm.Clusters {
		mark(k.Typical)
	}
	for _, inst := range label {
		mark(inst)
	}
	if loadings {
		for j, ind := range pm.Indicators {
			sc.Arrows = append(sc.Arrows, ScatterArrow{Label: shortName(ind), DX: a.PCA.Loadings.At(j, 0), DY: a.PCA.Loadings.At(j, 1)})
		}
		sc.ArrowNote = "Arrows: each indicator's loading on the two components, scaled together; the position of an institution reads against their directions, not their units."
	}
	return sc, nil
}

// SilhouetteChart is the silhouette curve: the average silhouette width
// at every number of clusters tried, the chosen number marked.
type SilhouetteChart struct {
	K     []int
	Width []float64
	// Chosen is the number of clusters used; Auto says it was chosen by
	// the curve.
	Chosen int
	Auto   bool
	// Sampled, when positive, is the sample size the widths come from.
	Sampled int
	Theme   Theme
	built   *panels
}

// SilhouettePlotter draws the curve.
type SilhouettePlotter struct{ Chart *SilhouetteChart }

// DataRange implements plot.DataRanger.
func (s *SilhouettePlotter) DataRange() (xmin, xmax, ymin, ymax float64) {
	ch := s.Chart
	lo, hi := 0.0, 0.0
	for _, w := range ch.Width {
		lo, hi = math.Min(lo, w), math.Max(hi, w)
	}
	return float64(ch.K[0]) - 0.5, float64(ch.K[len(ch.K)-1]) + 0.5, lo, math.Max(hi*1.1, 0.1)
}

// Plot implements plot.Plotter.
func (s *SilhouettePlotter) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	ch := s.Chart
	series := GroupSeries(0)
	ls := draw.LineStyle{Color: series.Colour, Width: vg.Points(1.2)}
	pts := make([]vg.Point, len(ch.K))
	for i, k := range ch.K {
		pts[i] = vg.Point{X: trX(float64(k)), Y: trY(ch.Width[i])}
	}
	c.StrokeLines(ls, pts)
	mk := seriesMarker(series, vg.Points(2.4))
	var labels []labelRequest
	for i, pt := range pts {
		if ch.K[i] == ch.Chosen {
			f := FocusMarker()
			f.Draw(&c, pt)
			labels = append(labels, labelRequest{Anchor: pt, Text: fmt.Sprintf("k = %d: %s", ch.Chosen, format.Number(ch.Width[i], 2)), Style: ch.Theme.focusLabelStyle(), Gap: f.Radius})
			continue
		}
		mk.Draw(&c, pt)
	}
	placed, _ := placeLabelsAvoiding(labels, vg.Rectangle{Min: c.Min, Max: c.Max}, nil, nil, pts)
	drawLabels(&c, placed)
}

// intTicks labels every whole number of an axis.
type intTicks struct{}

// Ticks implements plot.Ticker.
func (intTicks) Ticks(lo, hi float64) []plot.Tick {
	var ts []plot.Tick
	for v := math.Ceil(lo); v <= hi; v++ {
		ts = append(ts, plot.Tick{Value: v, Label: format.Int(int(v))})
	}
	return ts
}

func (sc *SilhouetteChart) panels() *panels {
	if sc.built != nil {
		return sc.built
	}
	th := sc.Theme
	ps := &panels{legend: &legend{th: th}, count: 1}
	ps.panelHeight = func(w vg.Length) vg.Length { return max(min(w*0.38, vg.Points(200)), vg.Points(120)) }
	ps.make = func(w vg.Length, _ int) []*plot.Plot {
		p := newPlot(th)
		p.Add(grid(false, true), &SilhouettePlotter{Chart: sc})
		p.X.Label.Text = "Number of clusters (k)"
		p.Y.Label.Text = "Average silhouette width"
		p.X.Tick.Marker = intTicks{}
		p.Y.Tick.Marker = ticksFor(ps.panelHeight(w) - 30)
		return []*plot.Plot{p}
	}
	series := GroupSeries(0)
	mk := seriesMarker(series, vg.Points(2.4))
	ps.legend.add(legendEntry{Text: "Average silhouette width at k", Width: 20, Thumb: lineThumb(draw.LineStyle{Color: series.Colour, Width: vg.Points(1.2)}, &mk)})
	chosen := "Number of clusters used (set in the brief)"
	if sc.Auto {
		chosen = "Number of clusters chosen (widest average silhouette)"
	}
	ps.legend.add(legendEntry{Text: chosen, Thumb: markerThumb(FocusMarker())})
	ps.legend.note = "Above 0.5 a reasonable structure, 0.25 to 0.5 weak, below 0.25 none substantial (Kaufman and Rousseeuw 1990)."
	if sc.Sampled > 0 {
		ps.legend.note += fmt.Sprintf(" Widths from a random sample of %s institutions.", format.Int(sc.Sampled))
	}
	sc.built = ps
	return ps
}

// Height implements Chart.
func (sc *SilhouetteChart) Height(w vg.Length) vg.Length { return sc.panels().Height(w) }

// Draw implements Chart.
func (sc *SilhouetteChart) Draw(c draw.Canvas) error { return sc.panels().Draw(c) }

// NewSilhouetteCurve plans the silhouette curve from the peers part of
// the model.
func NewSilhouetteCurve(m *figures.Model, th Theme) (Chart, error) {
	pm := m.Peers
	if pm == nil || len(pm.Analysis.Curve) == 0 {
		return nil, fmt.Errorf("the silhouette curve needs the brief's peers: section")
	}
	a := pm.Analysis
	sc := &SilhouetteChart{Chosen: a.K, Auto: pm.Spec.K.Auto(), Theme: th}
	for _, p := range a.Curve {
		sc.K = append(sc.K, p.K)
		sc.Width = append(sc.Width, p.Silhouette)
	}
	if a.Silhouette.Sampled {
		sc.Sampled = len(a.Silhouette.Rows)
	}
	return sc, nil
}
