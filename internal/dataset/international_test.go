package dataset

import "testing"

// TestInternationalDollars: converted currency indicators and derived
// currency amounts over them are marked as PPP$; a derived ratio of money
// to money, a count and a derived currency amount over register money
// are not.
func TestInternationalDollars(t *testing.T) {
	files := testFiles()
	files["dict.yaml"] += "  - {key: fee_income, label: Fee income, unit: currency, better: higher, decimals: 0, derive: staff_fte * 1000}\n" +
		"  - {key: income_per_fte, label: Income per FTE, unit: currency, better: higher, decimals: 0, derive: income_per_paper * papers_per_fte}\n"
	d, _, err := load(t, testBrief, files)
	if err != nil {
		t.Fatal(err)
	}
	want := map[string]bool{"income": true, "income_per_paper": true, "income_per_fte": true,
		"papers": false, "cites_per_paper": false, "fee_income": false, "papers_per_fte": false}
	for key, w := range want {
		in, ok := d.Dictionary.Lookup(key)
		if !ok {
			t.Fatalf("no %s", key)
		}
		if in.InternationalDollars != w {
			t.Errorf("%s: InternationalDollars = %v, want %v", key, in.InternationalDollars, w)
		}
	}
}
