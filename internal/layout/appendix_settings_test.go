package layout

import (
	"strings"
	"testing"

	"peerpack/internal/demo"
)

// annexBrief is the demo brief's front matter without its composite,
// plus the given settings, over a body of one methodology annex.
func annexBrief(t *testing.T, settings string) map[string][]byte {
	t.Helper()
	files := demo.Files()
	src := string(files[demo.BriefName])
	end := strings.Index(src[4:], "\n---\n") + 4
	front := src[:end]
	if i, j := strings.Index(front, "\ncomposite:"), strings.Index(front, "\ntheme:"); i > 0 && j > i {
		front = front[:i] + front[j:]
	}
	files[demo.BriefName] = []byte(front + "\n" + settings + "---\n\n# Methodology\n\n```appendix\nkind: methodology\n```\n")
	return files
}

// The methodology annex quotes the brief's own noise and small-group
// settings, the ones the commentary applies, not the defaults; without
// them it quotes the defaults (5 points, 10 members).
func TestMethodologyQuotesTheBriefsSettings(t *testing.T) {
	if testing.Short() {
		t.Skip("lays out the demo scenario")
	}
	for _, tc := range []struct {
		settings string
		want     []string
		not      []string
	}{
		{"", []string{
			"fewer than 5 percentile points (this pack's noise setting)",
			"Where fewer than 10 members report an indicator (this pack's small-group setting)",
			"The smallest group, Chosen peers, has 7 members, so it is always read by rank.",
		}, nil},
		{"noise: 7.5\nsmall_group: 6\n", []string{
			"fewer than 7.5 percentile points (this pack's noise setting)",
			"Where fewer than 6 members report an indicator (this pack's small-group setting)",
			"The smallest group, Chosen peers, has 7 members.",
		}, []string{"fewer than 5 percentile", "fewer than 10 members", "always read by rank"}},
	} {
		out, _ := scenarioPack(t, annexBrief(t, tc.settings))
		annex := bodyText(t, out)
		annex = annex[strings.LastIndex(annex, "Limits of these figures"):]
		for _, s := range tc.want {
			if !strings.Contains(annex, s) {
				t.Errorf("settings %q: the annex lacks %q:\n%s", tc.settings, s, annex)
			}
		}
		for _, s := range tc.not {
			if strings.Contains(annex, s) {
				t.Errorf("settings %q: the annex still says %q", tc.settings, s)
			}
		}
	}
}
