package build

import (
	"bytes"
	"context"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"peerpack/internal/figures"
	"peerpack/internal/narrative"
)

// A commentary that fails its own check stops the build before a page is
// laid out, and the pack already on disk stays as it was; the real check
// passes on the demo (common practice, no source: a false sentence must
// never reach the reader).
func TestFailedVerifyStopsTheBuild(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "pack.pdf")
	if _, err := Build(context.Background(), demoSource(), Options{Output: out, Created: demoCreated}); err != nil {
		t.Fatal(err)
	}
	before, _ := os.ReadFile(out)
	calls := 0
	verifyCommentary = func(m *figures.Model, c *narrative.Commentary) error {
		calls++
		return errors.New(`commentary (block-01): the claim "cites.001 > 50" does not hold`)
	}
	defer func() { verifyCommentary = narrative.Verify }()
	_, err := Build(context.Background(), demoSource(), Options{Output: out, Created: demoCreated})
	if err == nil || !strings.Contains(err.Error(), "does not hold") || !strings.Contains(err.Error(), "no pack was written") {
		t.Fatalf("got %v", err)
	}
	if calls != 1 {
		t.Errorf("the check ran %d times", calls)
	}
	if after, _ := os.ReadFile(out); !bytes.Equal(before, after) {
		t.Error("the previous pack was changed by a build whose commentary failed its check")
	}
	// check runs it too
	in, err := Load(demoSource(), nil)
	if err != nil {
		t.Fatal(err)
	}
	if err := CheckBuild(in, "test"); err == nil {
		t.Error("check passed a commentary that failed its check")
	}
}
