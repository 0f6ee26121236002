package demo

import (
	"bytes"
	"crypto/sha256"
	"flag"
	"fmt"
	"image/png"
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
		// The logo's PNG bytes depend on compress/flate, which a Go
		// release may tune; TestLogo checks its pixels instead.
		if name == LogoName {
			continue
		}
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

func TestLogo(t *testing.T) {
	img, err := png.Decode(bytes.NewReader(Files()[LogoName]))
	if err != nil {
		t.Fatalf("logo.png: %v", err)
	}
	if b := img.Bounds(); b.Dx() != 240 || b.Dy() != 240 {
		t.Errorf("logo is %v, want 240 x 240", b)
	}
	// The tallest bar is amber, the background teal.
	if r, g, b, _ := img.At(180, 100).RGBA(); r>>8 != 0xe0 || g>>8 != 0x9f || b>>8 != 0x3e {
		t.Errorf("amber bar pixel is %x %x %x", r>>8, g>>8, b>>8)
	}
	if r, g, b, _ := img.At(5, 5).RGBA(); r>>8 != 0x0f || g>>8 != 0x5e || b>>8 != 0x6b {
		t.Errorf("background pixel is %x %x %x", r>>8, g>>8, b>>8)
	}
}
