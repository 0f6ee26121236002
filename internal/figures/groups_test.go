package figures

import (
	"math"
	"slices"
	"testing"
)

func ids(m *Model, insts []int) []string {
	out := make([]string, len(insts))
	for i, inst := range insts {
		out[i] = m.InstitutionID(inst)
	}
	return out
}

// Group resolution on the fixture, against the register read by hand
// (testdata/figures/register.csv); ZU01 is outside the ranked population.
func TestGroupsResolve(t *testing.T) {
	d, b := loadFixture(t)
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	var names []string
	for _, g := range m.Groups {
		names = append(names, g.Name)
	}
	wantNames := []string{"Everyone", "Home sector", "Competitor systems: Aldmere", "Competitor systems: Orvanne", "Chosen peers", "Profile peers", "Outside the north"}
	if !slices.Equal(names, wantNames) {
		t.Fatalf("groups %q, want %q (brief order, each expanded in place, sorted by value)", names, wantNames)
	}
	cases := []struct {
		name    string
		members []string
		focusIn bool
	}{
		{"Everyone", []string{"KE01", "KE02", "KE03", "KE04", "AL01", "AL02", "AL03", "OR01", "OR02", "OR03", "OR04"}, true},
		{"Home sector", []string{"KE01", "KE02", "KE03", "KE04"}, true},
		{"Competitor systems: Aldmere", []string{"AL01", "AL02", "AL03"}, false},
		{"Competitor systems: Orvanne", []string{"OR01", "OR02", "OR03", "OR04"}, false},
		{"Chosen peers", []string{"KE01", "AL03", "OR01"}, false},
		{"Profile peers", []string{"KE01", "KE04", "AL02", "OR01"}, false},
		// over: all keeps ZU01; region is not North
		{"Outside the north", []string{"KE03", "KE04", "AL02", "AL03", "OR01", "OR02", "OR03", "OR04", "ZU01"}, false},
	}
	for _, c := range cases {
		g, _ := m.Group(c.name)
		if got := ids(m, g.Members); !slices.Equal(got, c.members) {
			t.Errorf("%s: members %v, want %v", c.name, got, c.members)
		}
		if g.FocusIn != c.focusIn {
			t.Errorf("%s: focus_in %v, want %v", c.name, g.FocusIn, c.focusIn)
		}
		if r, ok := m.Lookup(Key{Section: SectionGroup, Group: c.name, Measure: "n_members"}); !ok || int(r.Value) != len(c.members) {
			t.Errorf("%s: n_members row %v %v", c.name, r, ok)
		}
	}
	chosen, _ := m.Group("Chosen peers")
	if len(chosen.Dropped) != 1 || m.InstitutionID(chosen.Dropped[0].Institution) != "ZU01" {
		t.Errorf("Chosen peers should drop ZU01 (outside the ranked population): %+v", chosen.Dropped)
	}
	if gs := m.GroupsOf("Competitor systems"); len(gs) != 2 {
		t.Errorf("GroupsOf(each name) = %d groups, want 2", len(gs))
	}
	peers, _ := m.Group("Profile peers")
	for i := 1; i < len(peers.Nearest); i++ {
		if peers.Nearest[i].Distance < peers.Nearest[i-1].Distance {
			t.Error("Nearest must run from the nearest outwards")
		}
	}
}

// An institution outside a group is placed among the members without
// changing the group's distribution: of = members with a value + 1.
func TestPositionOutsideGroup(t *testing.T) {
	d, b := loadFixture(t)
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	al01 := d.Register.Index("AL01")
	p, ok := m.Position("Home sector", "fnci", al01, 2025)
	dist, _ := m.Distribution("Home sector", "fnci", 2025)
	if !ok || p.InGroup || p.Of != dist.N+1 {
		t.Fatalf("AL01 in Home sector: %+v (n=%d)", p, dist.N)
	}
	insts, vals := m.Members("Home sector", "fnci", 2025)
	if len(vals) != dist.N || slices.Contains(insts, al01) {
		t.Fatal("members must not include an outsider")
	}
	// The same placement computed on demand.
	q, ok := m.PlaceOf("Home sector", "fnci", al01, 2025)
	if !ok || *q != *p {
		t.Errorf("PlaceOf = %+v, stored %+v", q, p)
	}
}

// PlaceOf for an untracked institution equals the stored position it gets
// once it is named.
func TestPlaceOfMatchesTracked(t *testing.T) {
	d, b := loadFixture(t)
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	b.Named = append(b.Named, "OR02", "KE03")
	m2, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	for _, id := range []string{"OR02", "KE03"} {
		inst := d.Register.Index(id)
		if m.Tracked(inst) || !m2.Tracked(inst) {
			t.Fatalf("%s tracking wrong", id)
		}
		for _, g := range m.Groups {
			for _, ind := range d.Dictionary.Keys() {
				for _, y := range m.Years {
					want, _ := m2.Position(g.Name, ind, inst, y)
					got, ok := m.PlaceOf(g.Name, ind, inst, y)
					if !ok || !samePosition(got, want) {
						t.Fatalf("%s %s %s %d: on demand %+v, stored %+v", id, g.Name, ind, y, got, want)
					}
				}
			}
		}
	}
}

func samePosition(a, b *Position) bool {
	eq := func(x, y float64) bool { return x == y || math.IsNaN(x) && math.IsNaN(y) }
	return a.Rank == b.Rank && a.Of == b.Of && a.InGroup == b.InGroup && a.HasValue == b.HasValue &&
		a.Quartile == b.Quartile && eq(a.Value, b.Value) && eq(a.Percentile, b.Percentile) &&
		eq(a.Z, b.Z) && eq(a.GapMedian, b.GapMedian) && eq(a.GapQ3, b.GapQ3)
}

// Gaps are the amount still to gain, by polarity (definition in
// DEVELOPERS.md; common practice, no source).
func TestGapsByPolarity(t *testing.T) {
	d, b := loadFixture(t)
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	ke02 := d.Register.Index("KE02")
	for _, ind := range d.Dictionary.Indicators {
		for _, g := range m.Groups {
			p, _ := m.Position(g.Name, ind.Key, ke02, 2025)
			dist, _ := m.Distribution(g.Name, ind.Key, 2025)
			if !p.HasValue || dist.N == 0 {
				continue
			}
			var wantMed, wantQ float64
			switch ind.Better {
			case "higher":
				wantMed, wantQ = math.Max(0, dist.Median-p.Value), math.Max(0, dist.Q3-p.Value)
			case "lower":
				wantMed, wantQ = math.Max(0, p.Value-dist.Median), math.Max(0, p.Value-dist.Q1)
			default:
				if !math.IsNaN(p.GapMedian) || !math.IsNaN(p.GapQ3) {
					t.Errorf("%s %s: neutral indicators have no gap", g.Name, ind.Key)
				}
				continue
			}
			if p.GapMedian != wantMed || p.GapQ3 != wantQ {
				t.Errorf("%s %s: gaps %v %v, want %v %v", g.Name, ind.Key, p.GapMedian, p.GapQ3, wantMed, wantQ)
			}
		}
	}
}

// With many tracked institutions the positions come from a sort and binary
// searches instead of one counting pass; both must agree.
func TestManyTrackedAgrees(t *testing.T) {
	d, b := loadFixture(t)
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	b.Named = nil
	for _, in := range d.Register.Institutions {
		b.Named = append(b.Named, in.ID)
	}
	if len(b.Named) <= manyTracked {
		t.Fatalf("fixture has only %d institutions; the test needs more than %d", len(b.Named), manyTracked)
	}
	many, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	for k, p := range m.pos {
		q, ok := many.pos[k]
		if !ok || !samePosition(p, q) {
			t.Fatalf("%+v: %+v vs %+v", k, p, q)
		}
	}
}

// MemberPlaces agrees with the stored positions of tracked members (rank,
// percentile and quarter: one rule for charts and tables) and runs best
// first.
func TestMemberPlaces(t *testing.T) {
	d, b := loadFixture(t)
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	for _, g := range m.Groups {
		for _, ind := range d.Dictionary.Keys() {
			mp := m.MemberPlaces(g.Name, ind, 2025)
			for i, p := range mp {
				if i > 0 && p.Rank < mp[i-1].Rank {
					t.Fatalf("%s %s: not best first", g.Name, ind)
				}
				if pos, ok := m.Position(g.Name, ind, p.Institution, 2025); ok {
					if pos.Rank != p.Rank || pos.Of != p.Of || pos.Percentile != p.Percentile || pos.Quartile != p.Quartile {
						t.Fatalf("%s %s %s: %+v vs stored %+v", g.Name, ind, m.InstitutionID(p.Institution), p, pos)
					}
				}
			}
		}
	}
}
