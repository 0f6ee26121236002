package charts

import (
	"math"
	"sort"

	"peerpack/internal/brief"
	"peerpack/internal/figures"
)

// noRegion labels the points of institutions whose register row gives no
// region.
const noRegion = "Region not given"

// newEsteem plans the esteem chart: each member of the block's groups is
// one point, its esteem position (y) against the share of its weighted
// votes that came from respondents in its own country (x), coloured by
// the institution's region. A high position resting on home votes reads
// differently from one resting on votes from abroad; the chart shows the
// two together rather than folding them into one score. It is a scatter
// whose series are regions rather than groups, so it draws with the
// scatter's plotter and legend.
func newEsteem(m *figures.Model, spec *brief.ChartBlock, th Theme) (Chart, error) {
	inds, groups, marks, err := chartSubjects(m, spec)
	if err != nil {
		return nil, err
	}
	if len(inds) != 2 {
		return nil, specError(spec, "an esteem chart takes exactly two indicators, the home-country share of votes (x) then the esteem position (y); found %d", len(inds))
	}
	year := chartYear(m, spec)
	sc := &ScatterChart{XInd: inds[0], YInd: inds[1], Theme: th}
	seen := map[int]bool{}
	byRegion := map[string]*ScatterGroup{}
	for _, g := range groups {
		for _, pr := range m.MemberPairs(g.Name, sc.XInd.Key, sc.YInd.Key, year) {
			if seen[pr.Institution] || math.IsNaN(pr.X) || math.IsNaN(pr.Y) {
				continue
			}
			seen[pr.Institution] = true
			region := m.Data.Register.Institutions[pr.Institution].Region
			if region == "" {
				region = noRegion
			}
			sg := byRegion[region]
			if sg == nil {
				sg = &ScatterGroup{Label: region}
				byRegion[region] = sg
			}
			sg.X, sg.Y = append(sg.X, pr.X), append(sg.Y, pr.Y)
			sg.N++
		}
	}
	// Regions in name order (institutions without one last), so a
	// region keeps its colour from one pack to the next.
	names := make([]string, 0, len(byRegion))
	for r := range byRegion {
		names = append(names, r)
	}
	sort.Slice(names, func(i, j int) bool {
		if (names[i] == noRegion) != (names[j] == noRegion) {
			return names[j] == noRegion
		}
		return names[i] < names[j]
	})
	for _, r := range names {
		sc.Groups = append(sc.Groups, *byRegion[r])
	}
	sc.markFocusAndNamed(m, marks, year)
	return sc, nil
}
