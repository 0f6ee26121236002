package demo

import (
	"crypto/sha256"
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

var update = flag.Bool("update", false, "rewrite testdata/scenario.sha256 from the current generator")

// TestScenarioChecksums pins every scenario file to a SHA-256 checksum, so
// that a change to the scenario (which moves every number in the demo pack
// and in tests built on it) is always deliberate: rerun with -update and
// review the pack. The checksums were recorded on amd64; the Go
// specification allows fused multiply-add on some other architectures,
// which could in rare cases change a last printed digit there.
func TestScenarioChecksums(t *testing.T) {
	var b strings.Builder
	for _, name := range Names() {
		fmt.Fprintf(&b, "%x  %s\n", sha256.Sum256(Files()[name]), name)
	}
	path := filepath.Join("testdata", "scenario.sha256")
	if *update {
		if err := os.WriteFile(path, []byte(b.String()), 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test ./internal/demo -run Checksums -update to create it)", err)
	}
	if got := b.String(); got != string(want) {
		t.Errorf("the scenario changed:\n got\n%s\nwant\n%s\nIf the change is intended, rerun with -update and look at the demo pack.", got, want)
	}
}
