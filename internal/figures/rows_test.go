package figures

import (
	"math"
	"testing"
)

// The figures file's order is documented in DEVELOPERS.md (section, group,
// indicator, institution id, year as a number, measure; strings in byte
// order; common practice, no source). Rows produces it without sorting
// rows, from hand-ordered measure lists and integer-ranked entities; this
// test compares every neighbouring pair with the plain comparison of the
// documented order, and checks each row is found again by Lookup.
func TestRowsInKeyOrder(t *testing.T) {
	d, b := loadFixture(t)
	fixture, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	// Later stages add rows of other sections and, here, one into a
	// computed section, which must land at its place.
	fixture.Add(
		Row{Key: Key{Section: SectionCommentary, Group: "summary", Institution: "#0001", Measure: "sentence"}, Text: "One sentence.", IsText: true},
		Row{Key: Key{Section: SectionComposite, Group: "All", Indicator: "score", Institution: "ZU02", Measure: "value"}, Value: 0.5},
		Row{Key: Key{Section: SectionPosition, Group: "All", Indicator: "fnci", Institution: "ZU02", Year: 2023, Measure: "extra"}, Value: 2},
	)
	wd, wb := worldFixture(600, 8, 4)
	readAllCorrelations(wb)
	world, err := Compute(wd, wb)
	if err != nil {
		t.Fatal(err)
	}
	for name, m := range map[string]*Model{"fixture": fixture, "world": world} {
		t.Run(name, func(t *testing.T) {
			var prev *Row
			n := 0
			sections := map[string]int{}
			for r := range m.Rows() {
				n++
				sections[r.Section]++
				if prev != nil && compareKeys(prev.Key, r.Key) >= 0 {
					t.Fatalf("row %d: %s follows %s", n, r.Key, prev.Key)
				}
				if !r.IsText && (math.IsNaN(r.Value) || math.IsInf(r.Value, 0) || math.Signbit(r.Value) && r.Value == 0) {
					t.Fatalf("row %s has the value %v", r.Key, r.Value)
				}
				got, ok := m.Lookup(r.Key)
				if !ok || got != r {
					t.Fatalf("Lookup(%s) = %+v, %v; want %+v", r.Key, got, ok, r)
				}
				rr := r
				prev = &rr
			}
			for _, s := range []string{SectionCorrelation, SectionDistribution, SectionGroup, SectionPopulation, SectionPosition, SectionTrend} {
				if sections[s] == 0 {
					t.Errorf("no %s rows", s)
				}
			}
			if name == "fixture" && (sections[SectionCommentary] != 1 || sections[SectionComposite] != 1) {
				t.Errorf("added rows not streamed: %v", sections)
			}
		})
	}
}

// Keys that name no figure are not found, however close they come to one.
func TestLookupMisses(t *testing.T) {
	d, b := loadFixture(t)
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	var some Row
	for r := range m.Rows() {
		if r.Section == SectionPosition && r.Measure == "value" {
			some = r
			break
		}
	}
	if some.Section == "" {
		t.Fatal("no position value row")
	}
	miss := func(change func(*Key)) {
		t.Helper()
		k := some.Key
		change(&k)
		if r, ok := m.Lookup(k); ok {
			t.Errorf("Lookup(%s) found %+v", k, r)
		}
	}
	miss(func(k *Key) { k.Year = 1900 })
	miss(func(k *Key) { k.Measure = "valu" })
	miss(func(k *Key) { k.Institution = "NOPE" })
	miss(func(k *Key) { k.Group += "x" })
	miss(func(k *Key) { k.Section = SectionTrend })
	miss(func(k *Key) { k.Section = "unknown" })
	miss(func(k *Key) { k.Section, k.Measure = SectionDistribution, "median" }) // a distribution has no institution
}
