package charts

import (
	"math"

	"peerpack/internal/figures"
)

// Charts that show every member (bars, heatmap) place them with
// figures.MemberPlaces: the one definition of rank and percentile the
// tables and the stored positions use, so a rank printed on a chart is the
// rank in the tables.

// percentileOf finds an institution's percentile among placements.
func percentileOf(ps []figures.MemberPlace, inst int) float64 {
	for _, p := range ps {
		if p.Institution == inst {
			return p.Percentile
		}
	}
	return math.NaN()
}
