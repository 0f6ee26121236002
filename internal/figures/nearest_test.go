package figures

import (
	"strings"
	"testing"
)

// A nearest-profile group whose focus lacks one of the indicators is built
// on the others, and its definition says which was left out, so a batch
// over a whole sector does not stop at the first focus with a gap.
func TestNearestLeavesOutWhatTheFocusLacks(t *testing.T) {
	d, _ := loadFixture(t)
	b := briefWith(t, "focus: OR03\nyear: 2025\ngroups:\n  - name: Like us\n    nearest: {count: 3, indicators: [fwci, intl_share]}\n", "")
	m, err := Compute(d, b)
	if err != nil {
		t.Fatal(err)
	}
	g, ok := m.Group("Like us")
	if !ok || len(g.Members) == 0 {
		t.Fatalf("no group built: %+v", g)
	}
	if !strings.Contains(g.Defined, "nearest OR03 on intl_share in 2025") || !strings.Contains(g.Defined, "fwci left out because OR03 reports no value of it in 2025") {
		t.Errorf("definition %q", g.Defined)
	}
}
