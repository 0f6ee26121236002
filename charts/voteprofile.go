package charts

import (
	"math"
	"strconv"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/figures"
	"peerpack/internal/format"
	"peerpack/internal/records"
)

// Captioner is a chart that writes its own caption from the figures it
// draws; the layout uses it when the block gives no caption.
type Captioner interface {
	Caption() string
}

// VoteProfileChart is an institution's vote profile: its peer esteem in
// each broad field (the survey's weighted votes from respondents in that
// field, the most voted institution in the field = 100) against the
// groups' medians, drawn as a radar on one scale from zero.
type VoteProfileChart struct {
	*RadarChart
	// Text is the caption written from the figures.
	Text string
}

// Caption implements Captioner.
func (v *VoteProfileChart) Caption() string { return v.Text }

// fieldEsteem tells whether an indicator key is the esteem of one field
// computed from survey votes (records.KeyEsteem + "_" + field).
func fieldEsteem(key string) bool {
	field, ok := strings.CutPrefix(key, records.KeyEsteem+"_")
	return ok && field != "" && key != records.KeyEsteemUnweighted
}

// newVoteProfile plans a vote profile. Every spoke is one field's esteem
// indicator, in the block's order; the spokes share one scale from 0 at
// the centre (the per-field scores are all on the same 0-100 footing), so
// the radar is the common-scale radar with a note on what the scores are
// and a caption naming the groups, how many institutions have votes and
// the year.
func newVoteProfile(m *figures.Model, spec *brief.ChartBlock, th Theme) (Chart, error) {
	inds, err := chartIndicators(m, spec)
	if err != nil {
		return nil, err
	}
	for _, ind := range inds {
		if !fieldEsteem(ind.Key) {
			return nil, specError(spec, "%s is not a field's esteem from survey votes; a vote profile draws one spoke per field, with the indicators %s_<field> that data.votes computes (for example %s_natural)", ind.Key, records.KeyEsteem, records.KeyEsteem)
		}
	}
	if len(inds) < 3 {
		return nil, specError(spec, "a vote profile needs the esteem of at least three fields; found %d", len(inds))
	}
	groups, err := chartGroups(m, spec)
	if err != nil {
		return nil, err
	}
	year := chartYear(m, spec)
	if !anyValue(m, inds, groups, year) {
		keys := make([]string, len(inds))
		for i, ind := range inds {
			keys[i] = ind.Key
		}
		return nil, specError(spec, "no institution has a value of %s in %d; these come from survey votes: give data.votes in the brief and list them under its indicators (or leave indicators out to compute all)", strings.Join(keys, ", "), year)
	}
	focusName := institution(m, m.Focus).Name
	rc := &RadarChart{Theme: th}
	if _, err := commonRadar(m, spec, rc, inds, groups, year, focusName); err != nil {
		return nil, err
	}
	voted := false
	for _, s := range rc.Series {
		if s.Focus {
			for _, v := range s.Values {
				voted = voted || !math.IsNaN(v)
			}
		}
	}
	rc.Note = "Esteem in a field: weighted votes from the survey's respondents in that field, the most voted institution in the field = 100. " + rc.Note
	if !voted {
		rc.Note = "Esteem in a field: weighted votes from the survey's respondents in that field, the most voted institution in the field = 100. Every spoke shares one scale, from 0 at the centre to " +
			ringText(inds[0], rc.Axes[0].Outer, rc.CommonStep) + " at the rim (rings every " + ringText(inds[0], rc.CommonStep, rc.CommonStep) + ")."
	}
	return &VoteProfileChart{RadarChart: rc, Text: voteProfileCaption(m, inds, groups, year, focusName, voted)}, nil
}

// anyValue tells whether any group has a value of any of the indicators
// in the year, or the focus has one.
func anyValue(m *figures.Model, inds []dataset.Indicator, groups []*figures.Group, year int) bool {
	for _, ind := range inds {
		if _, ok := valueOf(m, ind, m.Focus, year); ok {
			return true
		}
		for _, g := range groups {
			if d, ok := m.Distribution(g.Name, ind.Key, year); ok && d.N > 0 {
				return true
			}
		}
	}
	return false
}

// voteProfileCaption writes the caption from the figures: each group with
// the number of its members that have votes, the year, and what the
// polygons are.
func voteProfileCaption(m *figures.Model, inds []dataset.Indicator, groups []*figures.Group, year int, focusName string, voted bool) string {
	var parts []string
	for i, g := range groups {
		n := 0
		for _, ind := range inds {
			if d, ok := m.Distribution(g.Name, ind.Key, year); ok {
				n = max(n, d.N)
			}
		}
		what := format.Int(n)
		if i == 0 {
			if n == 1 {
				what += " institution with votes"
			} else {
				what += " institutions with votes"
			}
		}
		parts = append(parts, g.Name+" ("+what+")")
	}
	list := strings.Join(parts, ", ")
	if len(parts) > 1 {
		list = strings.Join(parts[:len(parts)-1], ", ") + " and " + parts[len(parts)-1]
	}
	median := "the group's median"
	if len(groups) > 1 {
		median = "each group's median"
	}
	s := list + ", " + strconv.Itoa(year) + "; "
	if !voted {
		return s + focusName + " was named by no respondent, so only " + median + " is drawn in each field."
	}
	return s + focusName + " against " + median + " in each field, where the most voted institution scores 100."
}
