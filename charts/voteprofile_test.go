package charts

import (
	"math"
	"strings"
	"testing"

	"peerpack/internal/figures"
)

// TestVoteProfileReadsTheModel: the vote profile draws, on each field's
// spoke, the focus's value and each group's median as the figures model
// holds them, on one scale from 0 to a round rim above the largest (the
// rule of ceilStep: 1, 2, 2.5 or 5 times a power of ten, four rings;
// common practice, no source), and its caption counts each group's
// members with votes from the model's distributions.
func TestVoteProfileReadsTheModel(t *testing.T) {
	m, b := buildModel(t, 60, "\n```chart\nkind: vote-profile\nindicators: [peer_esteem_natural, peer_esteem_health, peer_esteem_social]\ngroups: [Kestria national, Aldmere national]\n```\n")
	spec := chartBlocks(b)[0]
	ch, err := New(m, spec, Theme{})
	if err != nil {
		t.Fatal(err)
	}
	vp, ok := ch.(*VoteProfileChart)
	if !ok {
		t.Fatalf("a vote-profile block planned a %T", ch)
	}
	top := 0.0
	for gi, g := range []string{"Kestria national", "Aldmere national"} {
		s := vp.Series[gi]
		if s.Focus || s.Label != g+": median" {
			t.Fatalf("series %d is %q, want the median of %s", gi, s.Label, g)
		}
		for i, key := range spec.Indicators {
			d, ok := m.Distribution(g, key, m.Year)
			if !ok || s.Values[i] != d.Median {
				t.Errorf("%s %s: drawn %v, model median %v", g, key, s.Values[i], d.Median)
			}
			top = math.Max(top, d.Median)
		}
	}
	f := vp.Series[2]
	if !f.Focus {
		t.Fatal("the last series is not the focus")
	}
	for i, key := range spec.Indicators {
		p, ok := m.Position("Kestria national", key, m.Focus, m.Year)
		if !ok || f.Values[i] != p.Value {
			t.Errorf("focus %s: drawn %v, model %v", key, f.Values[i], p.Value)
		}
		top = math.Max(top, p.Value)
	}
	for _, ax := range vp.Axes {
		if ax.Inner != 0 || ax.Outer != 4*ceilStep(top/4) || ax.Outer < top {
			t.Errorf("axis %s runs %v to %v; want 0 to %v (largest value %v)", ax.Label, ax.Inner, ax.Outer, 4*ceilStep(top/4), top)
		}
	}
	// Every one of the fixture's 30 members of each country has votes.
	want := "Kestria national (30 institutions with votes) and Aldmere national (30), 2025; Høgskolen i Vårdø against each group's median in each field, where the most voted institution scores 100."
	for _, g := range []string{"Kestria national", "Aldmere national"} {
		if d, _ := m.Distribution(g, "peer_esteem_natural", m.Year); d.N != 30 {
			t.Fatalf("%s: model n %d, the caption below expects 30", g, d.N)
		}
	}
	if got := vp.Caption(); got != want {
		t.Errorf("caption\n got %q\nwant %q", got, want)
	}
	if !strings.Contains(vp.Note, "the most voted institution in the field = 100") || !strings.Contains(vp.Note, "from 0 at the centre to") {
		t.Errorf("note %q does not say what the scores are and state the scale", vp.Note)
	}
}

// TestVoteProfileWithoutVotes: a focus that no respondent named has no
// esteem values (missing, not 0); the profile draws the medians only and
// its caption and note say so rather than printing values.
func TestVoteProfileWithoutVotes(t *testing.T) {
	m, b := buildModel(t, 60, "\n```chart\nkind: vote-profile\nindicators: [peer_esteem_natural, peer_esteem_health, peer_esteem_social]\ngroups: [Kestria national]\n```\n")
	for _, key := range []string{"peer_esteem_natural", "peer_esteem_health", "peer_esteem_social"} {
		ind := m.Data.Dictionary.Index(key)
		for _, y := range fixtureYears {
			m.Data.Set(ind, m.Focus, y, math.NaN())
		}
	}
	ch, err := New(m, chartBlocks(b)[0], Theme{})
	if err != nil {
		t.Fatal(err)
	}
	vp := ch.(*VoteProfileChart)
	if got := vp.Caption(); !strings.Contains(got, "Høgskolen i Vårdø was named by no respondent, so only the group's median is drawn") {
		t.Errorf("caption %q", got)
	}
	if strings.Contains(vp.Note, "values beside the points") {
		t.Errorf("note %q speaks of values the chart does not print", vp.Note)
	}
	// The scale comes from the medians alone.
	top := 0.0
	for _, key := range []string{"peer_esteem_natural", "peer_esteem_health", "peer_esteem_social"} {
		d, _ := m.Distribution("Kestria national", key, m.Year)
		top = math.Max(top, d.Median)
	}
	if got := vp.Axes[0].Outer; got != 4*ceilStep(top/4) {
		t.Errorf("rim %v, want %v from the largest median %v", got, 4*ceilStep(top/4), top)
	}
}

// TestVoteProfileWithoutData: esteem indicators with no values at all
// (the brief computes none from votes) are an error at the block saying
// where they come from.
func TestVoteProfileWithoutData(t *testing.T) {
	m, b := buildModel(t, 60, "\n```chart\nkind: vote-profile\nindicators: [peer_esteem_natural, peer_esteem_health, peer_esteem_social]\ngroups: [Kestria national]\nyear: 2025\n```\n")
	for _, key := range []string{"peer_esteem_natural", "peer_esteem_health", "peer_esteem_social"} {
		ind := m.Data.Dictionary.Index(key)
		for i := range m.Data.Register.Institutions {
			m.Data.Set(ind, i, 2025, math.NaN())
		}
	}
	m2, err := figures.Compute(m.Data, b)
	if err != nil {
		t.Fatal(err)
	}
	_, err = New(m2, chartBlocks(b)[0], Theme{})
	want := "vote-profile chart: no institution has a value of peer_esteem_natural, peer_esteem_health, peer_esteem_social in 2025; these come from survey votes: give data.votes in the brief and list them under its indicators (or leave indicators out to compute all)"
	if err == nil || !strings.Contains(err.Error(), want) {
		t.Errorf("got %v\nwant %s", err, want)
	}
}
