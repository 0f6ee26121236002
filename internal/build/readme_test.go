package build

import (
	"os"
	"regexp"
	"testing"
	"testing/fstest"

	"peerpack/internal/demo"
)

// The README's example brief (its front matter and one block of each
// kind) builds against the demo data, so the documentation names real
// keys, groups and measures.
func TestReadmeExampleBriefBuilds(t *testing.T) {
	raw, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Skip("README not found")
	}
	fm := regexp.MustCompile("(?s)```yaml\n(---\ntitle:.*?\n---\n)```").FindSubmatch(raw)
	body := regexp.MustCompile("(?s)````markdown\n(.*?)````").FindSubmatch(raw)
	if fm == nil || body == nil {
		t.Fatal("the README has no example brief")
	}
	fsys := fstest.MapFS{}
	for name, data := range demo.Files() {
		fsys[name] = &fstest.MapFile{Data: data}
	}
	fsys["readme.md"] = &fstest.MapFile{Data: append(append(append([]byte{}, fm[1]...), "\n# Example\n\n"...), body[1]...)}
	in, err := Load(Source{FS: fsys, Brief: "readme.md", Display: "README example"}, nil)
	if err != nil {
		t.Fatalf("the README's example brief does not load against the demo data:\n%v", err)
	}
	if _, err := Pack(in, demoCreated, "test"); err != nil {
		t.Fatalf("the README's example brief does not build:\n%v", err)
	}
}
