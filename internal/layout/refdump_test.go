package layout

import (
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// fixtureColumnCSV writes the fixture's 2025 values of an indicator for
// the Valmoria group, the input of the R reference in testdata/layout.
func fixtureColumnCSV(t testing.TB, ind string) string {
	in := fixtureInput(t, 60)
	_, vals := in.Model.Members("Valmoria", ind, 2025)
	var b strings.Builder
	b.WriteString("value\n")
	for _, v := range vals {
		fmt.Fprintf(&b, "%.17g\n", v)
	}
	return b.String()
}

// TestFixtureValuesUnchanged guards the R reference: the committed CSV is
// exactly what the fixture generates. Regenerate with -update and rerun
// the Rscript command in testdata/layout/README.
func TestFixtureValuesUnchanged(t *testing.T) {
	path := filepath.Join(fixtureDir, "valmoria_fnci_2025.csv")
	got := fixtureColumnCSV(t, "fnci")
	if os.Getenv("PEERPACK_UPDATE") == "1" {
		if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if string(want) != got {
		t.Fatal("the fixture's values changed; regenerate valmoria_fnci_2025.csv (PEERPACK_UPDATE=1) and the R reference")
	}
}
