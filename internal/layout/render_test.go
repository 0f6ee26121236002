package layout

import (
	"os"

	"path/filepath"
	"peerpack/internal/narrative"
	"testing"
)

// TestRenderFixture writes the fixture pack to PEERPACK_SAMPLE_DIR, when
// set, for looking at (pdftoppm -png -r 60).
func TestRenderFixture(t *testing.T) {
	in := fixtureInput(t, 60)
	if com, err := narrative.Compose(in.Model, in.Brief); err == nil {
		in.Commentary = com
	}
	out, err := Render(in)
	if err != nil {
		t.Fatal(err)
	}
	if dir := os.Getenv("PEERPACK_SAMPLE_DIR"); dir != "" {
		if err := os.WriteFile(filepath.Join(dir, "layout-fixture.pdf"), out, 0o644); err != nil {
			t.Fatal(err)
		}
	}
}
