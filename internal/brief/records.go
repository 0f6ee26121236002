package brief

import (
	"fmt"
	"strings"

	"gopkg.in/yaml.v3"

	"peerpack/internal/yamlx"
)

// PaperSource is data.papers: a paper records file whose indicators
// (citation impact, top 10 % share, co-authorship, subject profile) are
// computed when the data is loaded. Written as a path, or as a mapping:
//
//	papers: {file: papers.csv, window: 5, counting: fractional, indicators: [citation_impact]}
type PaperSource struct {
	File string `yaml:"file"`
	// Window is the number of publication years per value (0: the whole
	// span, one value under the last year).
	Window int `yaml:"window"`
	// Counting is full (default) or fractional.
	Counting string `yaml:"counting"`
	// Baselines is a baselines table to use instead of computing one from
	// the file (an institution's own papers with the world's baselines).
	Baselines string `yaml:"baselines"`
	// Indicators restricts the computed indicators (default: every paper
	// indicator the dictionary defines).
	Indicators []string `yaml:"indicators"`
	Pos        Pos      `yaml:"-"`
}

// VoteSource is data.votes: a survey votes file whose esteem indicators
// are computed when the data is loaded. Written as a path, or as a mapping:
//
//	votes: {file: votes.csv, targets: targets.csv, cap: 5}
type VoteSource struct {
	File string `yaml:"file"`
	// Targets holds target shares of researchers by country (and field);
	// without it votes are unweighted.
	Targets string `yaml:"targets"`
	// Cap is the largest weight as a multiple of the mean (0: the default
	// of 5; negative: no cap).
	Cap        float64  `yaml:"cap"`
	Indicators []string `yaml:"indicators"`
	Pos        Pos      `yaml:"-"`
}

var paperKeys = []string{"file", "window", "counting", "baselines", "indicators"}
var voteKeys = []string{"file", "targets", "cap", "indicators"}

// decodeSource decodes a path or a mapping of the allowed keys.
func decodeSource(n *yaml.Node, what string, allowed []string, file *string, out any) error {
	switch n.Kind {
	case yaml.ScalarNode:
		*file = n.Value
		return nil
	case yaml.MappingNode:
		for i := 0; i+1 < len(n.Content); i += 2 {
			k := n.Content[i]
			ok := false
			for _, a := range allowed {
				ok = ok || a == k.Value
			}
			if !ok {
				msg := fmt.Sprintf("line %d: data.%s has no key %q (keys: %s)", k.Line, what, k.Value, strings.Join(allowed, ", "))
				if s := yamlx.Nearest(k.Value, allowed); s != "" {
					msg += fmt.Sprintf("; did you mean %q?", s)
				}
				return fmt.Errorf("%s", msg)
			}
		}
		if err := n.Decode(out); err != nil {
			return fmt.Errorf("line %d: data.%s: %v", n.Line, what, strings.TrimPrefix(err.Error(), "yaml: "))
		}
		return nil
	}
	return fmt.Errorf("line %d: data.%s is a path or a mapping, e.g. %s: {file: %s.csv}", n.Line, what, what, what)
}

// UnmarshalYAML accepts a path or a mapping.
func (p *PaperSource) UnmarshalYAML(n *yaml.Node) error {
	type plain PaperSource
	var v plain
	if err := decodeSource(n, "papers", paperKeys, &v.File, &v); err != nil {
		return err
	}
	*p = PaperSource(v)
	p.Pos = Pos{Line: n.Line, Column: n.Column}
	switch p.Counting {
	case "", "full", "fractional":
	default:
		return fmt.Errorf("line %d: data.papers counting is full or fractional, not %q", n.Line, p.Counting)
	}
	if p.Window < 0 {
		return fmt.Errorf("line %d: data.papers window is a number of years, 1 or more (leave it out for the whole span)", n.Line)
	}
	return nil
}

// UnmarshalYAML accepts a path or a mapping.
func (v *VoteSource) UnmarshalYAML(n *yaml.Node) error {
	type plain VoteSource
	var x plain
	if err := decodeSource(n, "votes", voteKeys, &x.File, &x); err != nil {
		return err
	}
	*v = VoteSource(x)
	v.Pos = Pos{Line: n.Line, Column: n.Column}
	return nil
}
