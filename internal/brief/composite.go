package brief

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"

	"gopkg.in/yaml.v3"

	"peerpack/internal/diag"
	"peerpack/internal/yamlx"
)

// CompositeSpec is the brief's composite: section, a composite score built
// from pillars of weighted indicators (internal/composite computes it).
// Everything is checked here except what needs the dictionary and the
// groups (indicator keys, polarity, the distance group), which
// figures.Compute checks at the positions recorded here.
type CompositeSpec struct {
	// Normalise is zscore, minmax, percentile, distance or zscore-cdf;
	// DistanceGroup names the reference group of distance.
	Normalise     string
	DistanceGroup string
	Pillars       []CompositePillar
	// Aggregate is arithmetic (default) or geometric, across pillars.
	Aggregate string
	// MinShare is the share of the composite's indicators an institution
	// needs to be scored (default 2/3); Impute how its gaps are filled:
	// none (default), group-median or pillar-mean.
	MinShare float64
	Impute   string
	// Skew is none (default), log or winsorise, with SkewValues the most
	// values winsorised per indicator.
	Skew       string
	SkewValues int
	// Uncertainty: Runs (default 1000; 0 for none), WeightSpread (each
	// weight times a factor in [1 - spread, 1 + spread], default 0.25),
	// the normalisations and imputations runs draw from (default the
	// chosen one), Seed (default 1).
	Runs           int
	WeightSpread   float64
	Normalisations []string
	Imputations    []string
	Seed           uint64
	// HeadroomPlaces is how many places up headroom aims for (default 5)
	// when ranks are not banded; with rank_bands it aims at the next band.
	HeadroomPlaces int
	// Pos is where composite: was written; At holds the positions of its
	// keys ("normalise", "uncertainty.runs", ...).
	Pos Pos
	At  map[string]Pos

	node *yaml.Node
}

// CompositePillar is one pillar: indicators with weights within it.
type CompositePillar struct {
	Key, Label string
	Weight     float64
	Indicators []WeightedIndicator
	Pos        Pos
}

// WeightedIndicator is an indicator key with its weight in a pillar.
type WeightedIndicator struct {
	Key    string
	Weight float64
	Pos    Pos
}

// Composite defaults (ours, stated in the README).
const (
	DefaultCompositeRuns   = 1000
	DefaultWeightSpread    = 0.25
	DefaultMinShare        = 2.0 / 3
	DefaultHeadroomPlaces  = 5
	DefaultWinsoriseValues = 5
	MaxCompositeRuns       = 100000
)

// Composite option names, for messages and checks.
var (
	CompositeNormalisations = []string{"zscore", "minmax", "percentile", "distance", "zscore-cdf"}
	CompositeImputations    = []string{"none", "group-median", "pillar-mean"}
	CompositeAggregations   = []string{"arithmetic", "geometric"}
	CompositeSkew           = []string{"none", "log", "winsorise"}
)

// UnmarshalYAML keeps the node; decodeComposite reads it with positions
// once the brief's file name is known.
func (c *CompositeSpec) UnmarshalYAML(n *yaml.Node) error {
	c.node = n
	c.Pos = Pos{Line: n.Line, Column: n.Column}
	return nil
}

type compositeYAML struct {
	Normalise   normaliseYAML   `yaml:"normalise"`
	Pillars     []pillarYAML    `yaml:"pillars"`
	Aggregate   string          `yaml:"aggregate"`
	Missing     missingYAML     `yaml:"missing"`
	Skew        skewYAML        `yaml:"skew"`
	Uncertainty uncertaintyYAML `yaml:"uncertainty"`
	Headroom    headroomYAML    `yaml:"headroom"`
}

type missingYAML struct {
	MinShare *float64 `yaml:"min_share"`
	Impute   string   `yaml:"impute"`
}

type skewYAML struct {
	Treat string `yaml:"treat"`
}

type uncertaintyYAML struct {
	Runs      *int     `yaml:"runs"`
	Weights   *float64 `yaml:"weights"`
	Normalise []string `yaml:"normalise"`
	Impute    []string `yaml:"impute"`
	Seed      *int     `yaml:"seed"`
}

type headroomYAML struct {
	Places int `yaml:"places"`
}

type pillarYAML struct {
	Key        string      `yaml:"key"`
	Label      string      `yaml:"label"`
	Weight     *float64    `yaml:"weight"`
	Indicators weightsYAML `yaml:"indicators"`
}

// normaliseYAML is a method name or {distance: GROUP}.
type normaliseYAML struct {
	Method, Group string
}

func (v *normaliseYAML) UnmarshalYAML(n *yaml.Node) error {
	switch {
	case n.Kind == yaml.ScalarNode:
		v.Method = n.Value
		return nil
	case n.Kind == yaml.MappingNode && len(n.Content) == 2 && n.Content[0].Value == "distance" && n.Content[1].Kind == yaml.ScalarNode:
		v.Method, v.Group = "distance", n.Content[1].Value
		return nil
	}
	return &yamlx.Error{Line: n.Line, Column: n.Column, Msg: "normalise must be one of " + strings.Join(CompositeNormalisations, ", ") + ", or {distance: GROUP} to measure against a group's median"}
}

// weightsYAML is a mapping of indicator keys to weights, positions kept.
type weightsYAML []WeightedIndicator

func (w *weightsYAML) UnmarshalYAML(n *yaml.Node) error {
	if n.Kind != yaml.MappingNode {
		return &yamlx.Error{Line: n.Line, Column: n.Column, Msg: "indicators must be a mapping of indicator keys to weights, e.g. {citation_impact: 2, top10_share: 1}"}
	}
	for i := 0; i+1 < len(n.Content); i += 2 {
		k, v := n.Content[i], n.Content[i+1]
		f, err := strconv.ParseFloat(v.Value, 64)
		if v.Kind != yaml.ScalarNode || (v.Tag != "!!int" && v.Tag != "!!float") || err != nil {
			return &yamlx.Error{Line: v.Line, Column: v.Column, Msg: fmt.Sprintf("the weight of %s must be a number, found %q", k.Value, v.Value)}
		}
		*w = append(*w, WeightedIndicator{Key: k.Value, Weight: f, Pos: Pos{Line: k.Line, Column: k.Column}})
	}
	return nil
}

// decodeComposite reads the composite: section strictly, with positions.
func (b *Brief) decodeComposite() error {
	c := b.Composite
	if c == nil || c.node == nil {
		return nil
	}
	var raw compositeYAML
	if err := yamlx.Decode(b.File, c.node, &raw); err != nil {
		var ye *yamlx.Error
		if errors.As(err, &ye) {
			if ye.File == "" {
				ye.File = b.File
			}
			if strings.HasPrefix(ye.Msg, "unknown key ") {
				if i := strings.Index(ye.Msg, ";"); i > 0 && !strings.Contains(ye.Msg[:i], " in ") {
					ye.Msg = ye.Msg[:i] + " in composite" + ye.Msg[i:]
				}
			}
		}
		return err
	}
	c.At = map[string]Pos{}
	recordLines(c.node, "", c.At)
	var l diag.List
	at := func(key string) Pos {
		if p, ok := c.At[key]; ok {
			return p
		}
		return c.Pos
	}
	bad := func(key, format string, args ...any) {
		p := at(key)
		l.Addf(b.File, p.Line, p.Column, format, args...)
	}
	oneOf := func(key, what, v string, valid []string) string {
		for _, s := range valid {
			if v == s {
				return v
			}
		}
		msg := fmt.Sprintf("%s %q is not available; use %s", what, v, strings.Join(valid, ", "))
		if s := yamlx.Nearest(v, valid); s != "" {
			msg = fmt.Sprintf("%s %q is not available; did you mean %q? (%s)", what, v, s, strings.Join(valid, ", "))
		}
		bad(key, "%s", msg)
		return v
	}
	c.Normalise, c.DistanceGroup = "zscore", ""
	if raw.Normalise.Method != "" {
		c.Normalise = oneOf("normalise", "normalisation", raw.Normalise.Method, CompositeNormalisations)
		c.DistanceGroup = raw.Normalise.Group
		if c.Normalise == "distance" && c.DistanceGroup == "" {
			bad("normalise", "distance needs the group whose median is the reference: normalise: {distance: GROUP}")
		}
	}
	c.Aggregate = "arithmetic"
	if raw.Aggregate != "" {
		c.Aggregate = oneOf("aggregate", "aggregation", raw.Aggregate, CompositeAggregations)
	}
	c.MinShare = DefaultMinShare
	if raw.Missing.MinShare != nil {
		c.MinShare = *raw.Missing.MinShare
		if !(c.MinShare >= 0 && c.MinShare <= 1) {
			bad("missing.min_share", "min_share is the share of the composite's indicators an institution must report, between 0 and 1 (e.g. 0.67)")
		}
	}
	c.Impute = "none"
	if raw.Missing.Impute != "" {
		c.Impute = oneOf("missing.impute", "imputation", raw.Missing.Impute, CompositeImputations)
	}
	c.Skew, c.SkewValues = "none", 0
	if t := strings.Fields(raw.Skew.Treat); len(t) > 0 {
		c.Skew = oneOf("skew.treat", "skew treatment", t[0], CompositeSkew)
		if c.Skew == "winsorise" {
			c.SkewValues = DefaultWinsoriseValues
		}
		if len(t) == 2 && c.Skew == "winsorise" {
			n, err := strconv.Atoi(t[1])
			if err != nil || n < 1 || n > 50 {
				bad("skew.treat", "winsorise takes the most values to replace per indicator, 1 to 50, e.g. winsorise 3")
			}
			c.SkewValues = n
		} else if len(t) > 1 {
			bad("skew.treat", "skew treatment is none, log, winsorise or winsorise N (e.g. winsorise 3)")
		}
	}
	u := raw.Uncertainty
	c.Runs, c.WeightSpread, c.Seed = DefaultCompositeRuns, DefaultWeightSpread, 1
	if u.Runs != nil {
		c.Runs = *u.Runs
		if c.Runs < 0 || c.Runs > MaxCompositeRuns {
			bad("uncertainty.runs", "runs must lie between 0 (no uncertainty analysis) and %d", MaxCompositeRuns)
		}
	}
	if u.Weights != nil {
		c.WeightSpread = *u.Weights
		if !(c.WeightSpread >= 0 && c.WeightSpread < 1) {
			bad("uncertainty.weights", "weights is how far each weight may move, as a share of itself, at least 0 and under 1 (e.g. 0.25 for ±25 %%)")
		}
	}
	if u.Seed != nil {
		if *u.Seed < 0 {
			bad("uncertainty.seed", "seed must be a whole number, 0 or more")
		}
		c.Seed = uint64(*u.Seed)
	}
	for _, m := range u.Normalise {
		c.Normalisations = append(c.Normalisations, oneOf("uncertainty.normalise", "normalisation", m, CompositeNormalisations))
		if m == "distance" && c.DistanceGroup == "" {
			bad("uncertainty.normalise", "distance needs a reference group; set normalise: {distance: GROUP} to name it")
		}
	}
	for _, m := range u.Impute {
		c.Imputations = append(c.Imputations, oneOf("uncertainty.impute", "imputation", m, CompositeImputations))
	}
	c.HeadroomPlaces = DefaultHeadroomPlaces
	if raw.Headroom.Places != 0 {
		c.HeadroomPlaces = raw.Headroom.Places
		if c.HeadroomPlaces < 1 {
			bad("headroom.places", "headroom places must be 1 or more")
		}
	}
	if c.Aggregate == "geometric" {
		for _, m := range append([]string{c.Normalise}, c.Normalisations...) {
			if m == "zscore" || m == "minmax" {
				bad("aggregate", "geometric aggregation needs positive values, and %s gives zero or negative ones; normalise with percentile or zscore-cdf, or aggregate arithmetically", m)
				break
			}
		}
	}
	// pillars
	var seqNode *yaml.Node
	for i := 0; i+1 < len(c.node.Content); i += 2 {
		if c.node.Content[i].Value == "pillars" {
			seqNode = c.node.Content[i+1]
		}
	}
	if len(raw.Pillars) == 0 {
		bad("pillars", "a composite needs pillars, e.g. pillars: [{key: research, label: Research, weight: 1, indicators: {citation_impact: 1}}]")
	}
	seen := map[string]Pos{}
	inPillar := map[string]string{}
	for i, rp := range raw.Pillars {
		p := CompositePillar{Key: rp.Key, Label: rp.Label, Indicators: rp.Indicators, Weight: 1}
		if seqNode != nil && i < len(seqNode.Content) {
			p.Pos = Pos{Line: seqNode.Content[i].Line, Column: seqNode.Content[i].Column}
		}
		if !validKey(p.Key) {
			l.Addf(b.File, p.Pos.Line, p.Pos.Column, "pillar %d needs a key of letters, digits and _, e.g. key: research", i+1)
		} else if prev, ok := seen[p.Key]; ok {
			l.Addf(b.File, p.Pos.Line, p.Pos.Column, "pillar key %q is used twice (first at line %d)", p.Key, prev.Line)
		} else if p.Key == "overall" {
			l.Addf(b.File, p.Pos.Line, p.Pos.Column, "pillar key \"overall\" is taken by the composite score itself; choose another")
		}
		seen[p.Key] = p.Pos
		if p.Label == "" {
			p.Label = p.Key
		}
		if rp.Weight != nil {
			p.Weight = *rp.Weight
		}
		if !(p.Weight > 0) || math.IsInf(p.Weight, 0) {
			l.Addf(b.File, p.Pos.Line, p.Pos.Column, "pillar %s: weight must be a positive number (weights are relative; they are scaled to sum to one)", p.Key)
		}
		if len(p.Indicators) == 0 {
			l.Addf(b.File, p.Pos.Line, p.Pos.Column, "pillar %s has no indicators; add indicators: {KEY: WEIGHT, ...}", p.Key)
		}
		for _, wi := range p.Indicators {
			if !(wi.Weight > 0) || math.IsInf(wi.Weight, 0) {
				l.Addf(b.File, wi.Pos.Line, wi.Pos.Column, "indicator %s: weight must be a positive number", wi.Key)
			}
			if other, ok := inPillar[wi.Key]; ok {
				l.Addf(b.File, wi.Pos.Line, wi.Pos.Column, "indicator %s is already in pillar %s; an indicator enters a composite once", wi.Key, other)
			}
			inPillar[wi.Key] = p.Key
		}
		c.Pillars = append(c.Pillars, p)
	}
	return l.Err()
}

func validKey(s string) bool {
	if s == "" {
		return false
	}
	for _, r := range s {
		if !(r == '_' || r >= 'a' && r <= 'z' || r >= 'A' && r <= 'Z' || r >= '0' && r <= '9') {
			return false
		}
	}
	return true
}

// CompositeBlock sets the composite section in the body: the commentary
// on the focus's composite (rank with interval, sensitivity, headroom,
// movement), the weights stated as value judgements, the charts and the
// composite's cautions. It needs a composite: section in the front matter.
type CompositeBlock struct {
	BlockBase `yaml:",inline"`
	// Neighbours is how many institutions either side of the focus the
	// rank-interval chart shows (default 6).
	Neighbours int `yaml:"neighbours"`
	// Show lists the parts to set, in the order given; default all.
	Show []string `yaml:"show"`
}

// Kind implements Block.
func (*CompositeBlock) Kind() string { return "composite" }

// CompositeParts are the parts a composite block can show, in the default
// order.
var CompositeParts = []string{"text", "intervals", "weights", "flow", "contributions", "headroom", "cautions"}

// DefaultNeighbours is the rank-interval chart's default reach either side
// of the focus.
const DefaultNeighbours = 6

func (b *Brief) validateCompositeBlock(v *CompositeBlock, l *diag.List) {
	p := v.Position()
	if b.Composite == nil {
		l.Addf(b.File, p.Line, p.Column, "a composite block needs a composite: section in the front matter (pillars of weighted indicators); see \"Composite scores\" in the README")
	}
	if v.Neighbours == 0 {
		v.Neighbours = DefaultNeighbours
	} else if v.Neighbours < 1 || v.Neighbours > 30 {
		l.Addf(b.File, p.Line, p.Column, "composite block: neighbours must lie between 1 and 30")
	}
	if len(v.Show) == 0 {
		v.Show = append([]string(nil), CompositeParts...)
	}
	for _, s := range v.Show {
		if !oneOf(s, CompositeParts) {
			msg := fmt.Sprintf("composite block: %q is not a part it can show; parts are %s", s, quoteList(CompositeParts))
			if n := yamlx.Nearest(s, CompositeParts); n != "" {
				msg = fmt.Sprintf("composite block: %q is not a part it can show; did you mean %q?", s, n)
			}
			l.Addf(b.File, p.Line, p.Column, "%s", msg)
		}
	}
}
