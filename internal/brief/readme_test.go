package brief

import (
	"os"
	"regexp"
	"strings"
	"testing"
)

// The README documents the brief with one example of the front matter and
// of every block kind; they must parse, so the documentation cannot drift
// from the decoder.
func TestReadmeExamplesParse(t *testing.T) {
	raw, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Skip("README not found")
	}
	readme := string(raw)
	fm := regexp.MustCompile("(?s)```yaml\n(---\ntitle:.*?\n---\n)```").FindStringSubmatch(readme)
	if fm == nil {
		t.Fatal("the README has no front matter example")
	}
	body := regexp.MustCompile("(?s)````markdown\n(.*?)````").FindStringSubmatch(readme)
	if body == nil {
		t.Fatal("the README has no block examples")
	}
	b, err := Parse("README.md", []byte(fm[1]+"\n"+body[1]))
	if err != nil {
		t.Fatalf("README examples do not parse:\n%v", err)
	}
	seen := map[string]bool{}
	for _, blk := range b.Blocks {
		seen[blk.Kind()] = true
		if c, ok := blk.(*ChartBlock); ok {
			seen["chart:"+c.Type] = true
		}
	}
	for _, k := range BlockKinds {
		if !seen[k] {
			t.Errorf("the README has no example of the %s block", k)
		}
	}
	for _, k := range ChartKinds {
		if !seen["chart:"+k] {
			t.Errorf("the README has no example of the %s chart", k)
		}
	}
	if !strings.Contains(readme, "{=value citation_impact}") {
		t.Error("the README has no inline figure example")
	}
}
