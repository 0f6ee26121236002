package layout

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"peerpack/internal/brief"
	"peerpack/internal/figures"
)

// FuzzRenderBody lays out arbitrary Markdown bodies under the fixture's
// front matter: layout must never fail with an internal error (a panic or
// the two passes disagreeing), whatever the text.
func FuzzRenderBody(f *testing.F) {
	src, err := os.ReadFile(filepath.Join(fixtureDir, "brief.md"))
	if err != nil {
		f.Fatal(err)
	}
	end := bytes.Index(src[4:], []byte("\n---\n")) + 4 + 5
	front := src[:end]
	for _, seed := range []string{
		"# A\n\ntext {=value fnci}\n",
		"- a\n  - b\n    > c\n",
		"| a | b |\n|---|--:|\n| {=rank fnci} | 2 |\n",
		"```columns\ncount: 2\n```\n\npara\n\n## h\n\n```pagebreak\n```\n",
		"x[^1]\n\n[^1]: note\n\n***\n\n    code\n",
		strings.Repeat("word ", 2000),
		"# " + strings.Repeat("long heading ", 40),
		"![img](nothing.png)\n",
	} {
		f.Add(seed)
	}
	d := fixtureDataset(40)
	f.Fuzz(func(t *testing.T, body string) {
		if len(body) > 20000 {
			return
		}
		b, err := brief.Parse("brief.md", append(append([]byte(nil), front...), body...))
		if err != nil {
			return
		}
		m, err := figures.Compute(d, b)
		if err != nil {
			return
		}
		_, err = Render(Input{Brief: b, Model: m})
		if err != nil && strings.Contains(err.Error(), "internal error") {
			t.Fatalf("%v\nbody: %q", err, body)
		}
	})
}
