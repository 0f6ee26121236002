package layout

import (
	"os"
	"path/filepath"
	"testing"
)

func TestRenderFixture(t *testing.T) {
	in := fixtureInput(t, 60)
	out, err := Render(in)
	if err != nil {
		t.Fatal(err)
	}
	if dir := os.Getenv("PEERPACK_SAMPLE_DIR"); dir != "" {
		os.WriteFile(filepath.Join(dir, "layout-fixture.pdf"), out, 0o644)
	}
}
