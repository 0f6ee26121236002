package charts

import (
	"math"
	"math/rand/v2"

	"gonum.org/v1/plot/vg"

	"peerpack/internal/dataset"
	"peerpack/internal/stats"
)

// Text widths of an A4 page with 20 mm margins: 170 mm, and half of it
// less a 6 mm gutter.
var (
	fullWidth = 170 * vg.Millimeter
	halfWidth = 82 * vg.Millimeter
)

type fixtureChart struct {
	name  string
	chart Chart
}

// Invented indicators of the fixture.
var (
	fxFNCI = dataset.Indicator{Key: "fnci", Short: "Citation impact", Unit: dataset.UnitIndex, Better: dataset.HigherIsBetter, Decimals: 2}
	fxIntl = dataset.Indicator{Key: "intl_staff", Short: "International staff", Unit: dataset.UnitPercent, Better: dataset.HigherIsBetter, Decimals: 1}
	fxSSR  = dataset.Indicator{Key: "ssr", Short: "Students per academic", Unit: dataset.UnitRatio, Better: dataset.LowerIsBetter, Decimals: 1}
	fxInc  = dataset.Indicator{Key: "income", Short: "Research income per academic", Unit: dataset.UnitCurrency, Currency: true, Better: dataset.HigherIsBetter, Decimals: 0}
)

// fxValues draws n invented values from a fixed seed.
func fxValues(seed uint64, n int, mean, sd float64) []float64 {
	r := rand.New(rand.NewPCG(seed, 7))
	v := make([]float64, n)
	for i := range v {
		v[i] = math.Max(0, mean+sd*r.NormFloat64())
	}
	return v
}

func fxBoxRows(ind dataset.Indicator, seed uint64, focus float64) []BoxRow {
	specs := []struct {
		name     string
		n        int
		mean, sd float64
	}{{"Kestria national", 38, 1, 0.25}, {"Northern research universities", 21, 1.2, 0.3}, {"Technical universities of Vårdø and Lesser Ostmark", 64, 0.9, 0.35}}
	var rows []BoxRow
	for i, s := range specs {
		vals := fxValues(seed+uint64(i), s.n, s.mean*scaleOf(ind), s.sd*scaleOf(ind))
		b := stats.BoxOf(vals, stats.Type7)
		r := BoxRow{Label: s.name, Members: s.n, Box: b, Outliers: b.OutlierValues, Focus: focus, FocusText: valueText(ind, focus)}
		if i != 2 {
			r.Marks = []Mark{{Label: "Université de Saint-Éluard", Value: b.Median * 1.04}, {Label: "Politechnika Źródłowa", Value: b.Q1 * 0.98}}
		}
		rows = append(rows, r)
	}
	return rows
}

func scaleOf(ind dataset.Indicator) float64 {
	switch ind.Key {
	case "intl_staff":
		return 20
	case "ssr":
		return 16
	case "income":
		return 90000
	}
	return 1
}

func fixtureCharts() []fixtureChart {
	return []fixtureChart{
		{"box", &BoxChart{FocusName: "Høgskolen i Vårdø", Panels: []BoxPanel{{Indicator: fxFNCI, Rows: fxBoxRows(fxFNCI, 1, 1.137)}}}},
		{"box-panels", &BoxChart{FocusName: "Høgskolen i Vårdø", Panels: []BoxPanel{
			{Indicator: fxFNCI, Rows: fxBoxRows(fxFNCI, 1, 1.137)},
			{Indicator: fxIntl, Rows: fxBoxRows(fxIntl, 11, 23.46)},
		}}},
		{"trend", &TrendChart{FocusName: "Høgskolen i Vårdø", Panels: []TrendPanel{fxTrendPanel(fxFNCI, 3)}}},
		{"trend-panels", &TrendChart{FocusName: "Høgskolen i Vårdø", Panels: []TrendPanel{fxTrendPanel(fxFNCI, 3), fxTrendPanel(fxIntl, 5)}}},
		{"trend-systems", &TrendChart{FocusName: "Høgskolen i Vårdø", Panels: []TrendPanel{fxTrendGroups(fxIntl, 31, 6), fxTrendGroups(fxFNCI, 37, 6), fxTrendGroups(fxInc, 41, 6)}}},
		{"scatter", fxScatter(40)},
		{"radar", fxRadar(true)},
		{"radar-range", fxRadar(false)},
		{"heatmap", fxHeatmap()},
		{"bars", fxBars()},
		{"box-vertical", &BoxChart{Vertical: true, FocusName: "Høgskolen i Vårdø", Panels: []BoxPanel{{Indicator: fxSSR, Rows: fxBoxRows(fxSSR, 21, 14.25)}}}},
	}
}

func fxTrendPanel(ind dataset.Indicator, seed uint64) TrendPanel {
	years := []int{2019, 2020, 2021, 2022, 2023}
	pn := TrendPanel{Indicator: ind, Years: years, Focus: TrendLine{}}
	s := scaleOf(ind)
	for gi, name := range []string{"Kestria national", "Northern research universities"} {
		b := TrendBand{Label: name}
		for i := range years {
			vals := fxValues(seed+uint64(10*gi+i), 30, s*(0.9+0.05*float64(i)+0.1*float64(gi)), s*0.2)
			bx := stats.BoxOf(vals, stats.Type7)
			b.Median, b.Q1, b.Q3 = append(b.Median, bx.Median), append(b.Q1, bx.Q1), append(b.Q3, bx.Q3)
		}
		pn.Bands = append(pn.Bands, b)
	}
	for i := range years {
		v := s * (0.85 + 0.09*float64(i))
		if i == 2 {
			v = math.NaN() // a missing year shows as a gap
		}
		pn.Focus.Values = append(pn.Focus.Values, v)
	}
	pn.Marks = []TrendLine{{Label: "Politechnika Źródłowa", Values: []float64{s * 1.2, s * 1.18, s * 1.15, s * 1.17, s * 1.1}}}
	return pn
}

// fxTrendGroups is a trend panel over n invented systems whose medians
// lie close together, the case where bands would blur into one mass.
func fxTrendGroups(ind dataset.Indicator, seed uint64, n int) TrendPanel {
	years := []int{2020, 2021, 2022, 2023, 2024, 2025}
	pn := TrendPanel{Indicator: ind, Years: years}
	s := scaleOf(ind)
	names := []string{"Kestria", "Aldmere", "Orvanne", "Nordvald", "Wieldania", "Lusmara"}
	for gi := 0; gi < n; gi++ {
		b := TrendBand{Label: names[gi%len(names)]}
		for i := range years {
			vals := fxValues(seed+uint64(10*gi+i), 25, s*(0.9+0.02*float64(i)+0.04*float64(gi)), s*0.2)
			bx := stats.BoxOf(vals, stats.Type7)
			b.Median, b.Q1, b.Q3 = append(b.Median, bx.Median), append(b.Q1, bx.Q1), append(b.Q3, bx.Q3)
		}
		pn.Bands = append(pn.Bands, b)
	}
	for i := range years {
		pn.Focus.Values = append(pn.Focus.Values, s*(1.05-0.02*float64(i)))
	}
	return pn
}

func fxScatter(n int) *ScatterChart {
	sc := &ScatterChart{XInd: fxIntl, YInd: fxFNCI}
	var ax, ay []float64
	for gi, name := range []string{"Kestria national", "Northern research universities", "Technical universities"} {
		g := ScatterGroup{Label: name}
		xs := fxValues(uint64(40+gi), n, 18+4*float64(gi), 6)
		noise := fxNoise(uint64(50+gi), n, 0.18)
		for i := range xs {
			g.X = append(g.X, xs[i])
			g.Y = append(g.Y, 0.55+0.025*xs[i]+noise[i])
		}
		ax, ay = append(ax, g.X...), append(ay, g.Y...)
		sc.Groups = append(sc.Groups, g)
	}
	sc.Focus, sc.HasFocus = ScatterMark{Label: "Høgskolen i Vårdø", X: 23.46, Y: 1.137}, true
	sc.Marks = []ScatterMark{{Label: "Université de Saint-Éluard", X: 24.1, Y: 1.15}, {Label: "Politechnika Źródłowa", X: 22.9, Y: 1.12}}
	if f, ok := stats.FitLine(ax, ay); ok {
		sc.Fit = &f
	}
	return sc
}

// fxNoise draws n invented normal deviates with standard deviation sd.
func fxNoise(seed uint64, n int, sd float64) []float64 {
	r := rand.New(rand.NewPCG(seed, 9))
	v := make([]float64, n)
	for i := range v {
		v[i] = sd * r.NormFloat64()
	}
	return v
}

func fxRadar(percentile bool) *RadarChart {
	if percentile {
		return &RadarChart{Percentile: true,
			Axes: []RadarAxis{{Label: "Citation impact", Outer: 100}, {Label: "International staff", Outer: 100}, {Label: "Students per academic", Outer: 100}, {Label: "Research income per academic", Outer: 100}, {Label: "Graduate employment within six months", Outer: 100}},
			Series: []RadarSeries{
				{Label: "Høgskolen i Vårdø: percentile in Kestria national", Focus: true, Values: []float64{71.05, 64.5, 38.2, 55, 80.3}},
				{Label: "Høgskolen i Vårdø: percentile in Northern research universities", Focus: true, Index: 1, Values: []float64{47.6, 52.4, 21.4, math.NaN(), 61.9}},
			},
			Note: "Percentile ranks run in each indicator's better direction: outward is better on every spoke."}
	}
	return &RadarChart{
		Axes: []RadarAxis{
			{Label: "Citation impact (index)", Inner: 0.42, Outer: 1.87, InnerText: "0.42", OuterText: "1.87"},
			{Label: "International staff (%)", Inner: 4.1, Outer: 38.9, InnerText: "4.1", OuterText: "38.9"},
			{Label: "Students per academic (ratio)", Inner: 31.2, Outer: 8.4, InnerText: "31.2", OuterText: "8.4"},
			{Label: "Research income per academic (PPP$)", Inner: 12000, Outer: 260000, InnerText: "12,000", OuterText: "260,000"},
		},
		Series: []RadarSeries{
			{Label: "Kestria national: median", Values: []float64{0.98, 18.5, 17.2, 88000}},
			{Label: "Northern research universities: median", Index: 1, Values: []float64{1.21, 22.5, 14.9, 131000}},
			{Label: "Høgskolen i Vårdø", Focus: true, Values: []float64{1.137, 23.46, 14.25, 101500}},
		},
	}
}

func fxHeatmap() *HeatmapChart {
	names := []string{"Université de Saint-Éluard", "Høgskolen i Vårdø", "Politechnika Źródłowa", "Kestria Institute of Technology", "University of Lesser Ostmark", "Ostmark College of Applied Sciences and Maritime Studies", "Vårdø School of Economics", "Northern Kestria University"}
	hc := &HeatmapChart{Group: "Kestria national", Columns: []string{"Citation impact", "International staff", "Students per academic", "Research income per academic", "Graduate employment"}}
	for i, n := range names {
		ps := fxValues(uint64(70+i), 5, 50, 30)
		for k := range ps {
			ps[k] = math.Min(100, ps[k])
		}
		if i == 3 {
			ps[2] = math.NaN()
		}
		// Drawing fixture: quarters by percentile (the model draws them by
		// the group's quartile values).
		qs := make([]int, len(ps))
		for k, p := range ps {
			qs[k] = stats.QuartileOf(p)
		}
		hc.Rows = append(hc.Rows, HeatRow{Label: n, Focus: i == 1, Named: i == 2, Percentiles: ps, Quarters: qs})
	}
	hc.Note = "Rows ordered by Citation impact; 8 of the group's 38 members shown."
	return hc
}

func fxBars() *BarsChart {
	bc := &BarsChart{Indicator: fxFNCI, Group: "Kestria national", Median: 1.02}
	vals := []float64{1.74, 1.61, 1.58, 1.58, 1.49, 1.33, 1.30, 1.21, 1.18}
	names := []string{"Kestria Institute of Technology", "Université de Saint-Éluard", "Vårdø School of Economics", "Northern Kestria University", "University of Lesser Ostmark", "Politechnika Źródłowa", "Ostmark College of Applied Sciences and Maritime Studies", "Vårdø Academy of Music", "Lesser Ostmark Polytechnic"}
	ranks := []int{1, 2, 3, 3, 5, 6, 7, 8, 9}
	for i := range vals {
		bc.Items = append(bc.Items, BarItem{Label: names[i], Rank: ranks[i], Value: vals[i], Named: i == 5})
	}
	bc.Items = append(bc.Items, BarItem{Label: "Høgskolen i Vårdø", Rank: 14, Value: 1.137, Focus: true, GapBefore: true})
	bc.Note = "Kestria national, Citation impact, 2023: 10 of 38 ranked highest first; values equal as printed share the better rank."
	return bc
}
