package figures

import (
	"fmt"
	"math"
	"testing"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
)

// nearTieWorld: ten members of one group with one indicator declared at
// two decimals, two of them (P05 1.9189 and P06 1.9234) printed alike as
// 1.92, and one outsider (P11) at exactly 1.92; the same values in 2023
// and 2024, the focus P05.
func nearTieWorld(t *testing.T, better dataset.Polarity) *Model {
	t.Helper()
	values := []float64{2.50, 2.31, 2.10, 1.97, 1.9189, 1.9234, 1.80, 1.52, 1.40, 1.20, 1.92}
	insts := make([]dataset.Institution, len(values))
	var members []string
	for i := range insts {
		id := fmt.Sprintf("P%02d", i+1)
		insts[i] = dataset.Institution{ID: id, Name: "Institution " + id, Country: "Aldor", Region: "North"}
		if i < 10 {
			members = append(members, id)
		}
	}
	inds := []dataset.Indicator{{Key: "score", Unit: dataset.UnitScore, Better: better, Decimals: 2}}
	d := dataset.New(dataset.NewRegister("near.csv", insts, nil), dataset.NewDictionary("near.yaml", inds), []int{2023, 2024})
	for i, v := range values {
		if better == dataset.LowerIsBetter {
			v = 4 - v // the same order, mirrored; still two decimals apart
		}
		d.Set(0, i, 2023, v)
		d.Set(0, i, 2024, v)
	}
	b := &brief.Brief{File: "near.md", Focus: "P05", Year: 2024, Years: brief.Span{First: 2023, Last: 2024},
		Named: []string{"P11"}, Quantiles: "type7",
		Groups: []brief.GroupSpec{{Name: "Ten", Members: members}}}
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	return m
}

// TestRanksAtDeclaredPrecision: values that print alike at the
// indicator's declared decimals are a tie. Computed by hand (standard
// competition ranking and the mean percentile rank, README statistics;
// the rule itself is common practice, no source): four members print
// above 1.92 (2.50, 2.31, 2.10, 1.97) and four below (1.80, 1.52, 1.40,
// 1.20), so 1.9234 and 1.9189 both rank 5th of 10 with 2 ties and
// percentile 100 x (4 + 2/2) / 10 = 50 (unrounded they were 5th at 55
// and 6th at 45). The outsider at 1.92 ties with both: 5th of 11,
// percentile 100 x (4 + 3/2) / 11 = 50. The type 7 median of the
// unrounded values, (1.9189 + 1.9234) / 2 = 1.92115, prints 1.92, so
// both are on the median: the second quarter (unrounded, 1.9189 would
// fall below it into the third). In the constant panel of 2023 and 2024
// the focus P05 is 5th at both ends (unrounded it was 6th).
func TestRanksAtDeclaredPrecision(t *testing.T) {
	for _, better := range []dataset.Polarity{dataset.HigherIsBetter, dataset.LowerIsBetter} {
		t.Run(string(better), func(t *testing.T) {
			m := nearTieWorld(t, better)
			d, ok := m.Distribution("Ten", "score", 2024)
			want := 1.92115
			if better == dataset.LowerIsBetter {
				want = 4 - want
			}
			if !ok || math.Abs(d.Median-want) > 1e-12 {
				t.Fatalf("median %v, want the unrounded %v", d.Median, want)
			}
			check := func(what string, p *Position, rank, of, ties int, pct float64) {
				t.Helper()
				if p.Rank != rank || p.Of != of || p.Ties != ties || math.Abs(p.Percentile-pct) > 1e-9 || p.Quartile != 2 {
					t.Errorf("%s: rank %d of %d, ties %d, percentile %v, quarter %d; want %d of %d, %d ties, %v, quarter 2",
						what, p.Rank, p.Of, p.Ties, p.Percentile, p.Quartile, rank, of, ties, pct)
				}
			}
			focus, _ := m.Position("Ten", "score", 4, 2024) // P05, stored
			check("P05 (focus)", focus, 5, 10, 2, 50)
			other, _ := m.PlaceOf("Ten", "score", 5, 2024) // P06, on demand
			check("P06 (on demand)", other, 5, 10, 2, 50)
			out, _ := m.Position("Ten", "score", 10, 2024) // P11, not a member
			check("P11 (outsider)", out, 5, 11, 3, 100*5.5/11)
			// Member lists: the tie shares rank 5, in register order, and
			// the next value ranks 7th; values stay unrounded.
			ps := m.MemberPlaces("Ten", "score", 2024)
			var got []string
			for _, p := range ps {
				got = append(got, fmt.Sprintf("%s:%d", m.Data.Register.Institutions[p.Institution].ID, p.Rank))
			}
			wantList := "[P01:1 P02:2 P03:3 P04:4 P05:5 P06:5 P07:7 P08:8 P09:9 P10:10]"
			if fmt.Sprint(got) != wantList {
				t.Errorf("member places %v, want %s", got, wantList)
			}
			if v := ps[4].Value; v != 1.9189 && v != 4-1.9189 {
				t.Errorf("member value %v: values must stay unrounded", v)
			}
			tr, ok := m.Trend("Ten", "score", 4)
			if !ok || tr.PanelOf != 10 || tr.PanelStartRank != 5 || tr.PanelEndRank != 5 || tr.RankChange != 0 {
				t.Errorf("trend of P05: %+v; want panel of 10, 5th at both ends", tr)
			}
		})
	}
}
