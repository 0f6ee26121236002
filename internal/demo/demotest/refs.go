// Package demotest checks that a brief refers only to things the demo
// scenario has: its files, institution ids, register fields and values,
// indicator keys and group names. The demo's and the templates' tests use
// it so that every shipped brief builds against the demo data; it is a
// plain cross-reference check and knows nothing of statistics.
package demotest

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"io/fs"
	"sort"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/yamlx"
)

// Scenario is the demo data as the cross-reference check needs it.
type Scenario struct {
	Files map[string][]byte
	// IDs are the register ids; Fields maps each register column to the
	// set of values it takes.
	IDs    map[string]bool
	Fields map[string]map[string]bool
	// Indicators are the dictionary keys; Size holds the keys of size
	// measures (counts and money amounts with no better direction), which
	// the scenario shows as context only.
	Indicators map[string]bool
	Size       map[string]bool
}

// Load reads the register and dictionary out of the scenario's files.
func Load(fsys fs.FS, register, dictionary string) (*Scenario, error) {
	s := &Scenario{Files: map[string][]byte{}, IDs: map[string]bool{}, Fields: map[string]map[string]bool{}, Indicators: map[string]bool{}, Size: map[string]bool{}}
	names, err := fs.Glob(fsys, "*")
	if err != nil {
		return nil, err
	}
	for _, n := range names {
		b, err := fs.ReadFile(fsys, n)
		if err != nil {
			return nil, err
		}
		s.Files[n] = b
	}
	rows, err := csv.NewReader(bytes.NewReader(s.Files[register])).ReadAll()
	if err != nil {
		return nil, fmt.Errorf("%s: %v", register, err)
	}
	if len(rows) < 2 {
		return nil, fmt.Errorf("%s: no institutions", register)
	}
	header := rows[0]
	for _, h := range header {
		s.Fields[h] = map[string]bool{}
	}
	for _, r := range rows[1:] {
		for i, v := range r {
			s.Fields[header[i]][v] = true
		}
		s.IDs[r[0]] = true
	}
	node, err := yamlx.Parse(dictionary, s.Files[dictionary], 0)
	if err != nil {
		return nil, err
	}
	var dict struct {
		Indicators []dataset.Indicator `yaml:"indicators"`
	}
	if err := yamlx.Decode(dictionary, node, &dict); err != nil {
		return nil, err
	}
	for _, ind := range dict.Indicators {
		s.Indicators[ind.Key] = true
		if ind.Better == dataset.Neutral && (ind.Unit == dataset.UnitCount || ind.Unit == dataset.UnitCurrency) {
			s.Size[ind.Key] = true
		}
	}
	return s, nil
}

// SizeRanked lists the blocks of b that rank a size measure as if it were
// quality: a position or peers table, a bars chart or heatmap (ranks and
// percentiles), or commentary on strengths and gaps. Size (staff,
// students, papers, income) is context in the scenario, never ranked as
// quality; distributions, trends, scatters and group medians may show it.
func (s *Scenario) SizeRanked(b *brief.Brief) []string {
	var out []string
	for _, blk := range b.Blocks {
		var inds []string
		switch v := blk.(type) {
		case *brief.ChartBlock:
			if v.Type == "bars" || v.Type == "heatmap" {
				inds = v.Indicators
			}
		case *brief.TableBlock:
			if v.Type == "" || v.Type == "position" || v.Type == "peers" {
				inds = v.Indicators
			}
		case *brief.CommentaryBlock:
			for _, t := range v.Topics {
				if t == "strengths" || t == "gaps" {
					inds = v.Indicators
				}
			}
		}
		for _, k := range inds {
			if s.Size[k] {
				out = append(out, fmt.Sprintf("line %d (%s block): ranks %s, a size measure shown for context only", blk.Position().Line, blk.Kind(), k))
			}
		}
	}
	return out
}

// Check returns one line per reference in b that the scenario cannot
// satisfy; none means every name the brief uses exists.
func (s *Scenario) Check(b *brief.Brief) []string {
	var probs []string
	bad := func(format string, args ...any) { probs = append(probs, fmt.Sprintf(format, args...)) }
	file := func(what, p string) {
		if p != "" && s.Files[p] == nil {
			bad("data.%s: no file %q in the scenario", what, p)
		}
	}
	file("register", b.Data.Register)
	file("dictionary", b.Data.Dictionary)
	file("ppp", b.Data.PPP)
	file("papers", b.Data.Papers.File)
	file("votes", b.Data.Votes.File)
	for _, v := range b.Data.Values {
		file("values", v)
	}
	id := func(where, v string) {
		if !s.IDs[v] {
			bad("%s: no institution %q in the register", where, v)
		}
	}
	ind := func(where, k string) {
		if !s.Indicators[k] {
			bad("%s: no indicator %q in the dictionary", where, k)
		}
	}
	filter := func(where string, f *brief.Filter) map[string][]string {
		out := map[string][]string{}
		if f == nil {
			return out
		}
		for _, c := range f.Conds {
			vals, ok := s.Fields[c.Attr]
			if !ok {
				bad("%s: no register field %q", where, c.Attr)
				continue
			}
			for _, v := range c.Values {
				if !vals[v] {
					bad("%s: register field %q never takes the value %q", where, c.Attr, v)
				}
			}
			if !c.Not {
				out[c.Attr] = c.Values
			}
		}
		return out
	}
	id("focus", b.Focus)
	for _, n := range b.Named {
		id("named", n)
	}
	groups := map[string]bool{}
	for i, g := range b.Groups {
		where := fmt.Sprintf("groups[%d]", i)
		restrict := filter(where+".where", g.Where)
		for _, m := range g.Members {
			id(where+".members", m)
		}
		if g.Nearest != nil {
			for _, k := range g.Nearest.Indicators {
				ind(where+".nearest.indicators", k)
			}
			filter(where+".nearest.where", g.Nearest.Where)
		}
		if g.Each == "" {
			groups[g.Name] = true
			continue
		}
		vals, ok := s.Fields[g.Each]
		if !ok {
			bad("%s.each: no register field %q", where, g.Each)
			continue
		}
		expand := restrict[g.Each]
		if expand == nil {
			for v := range vals {
				expand = append(expand, v)
			}
			sort.Strings(expand)
		}
		for _, v := range expand {
			if g.Name == "" {
				groups[v] = true
			} else {
				groups[g.Name+": "+v] = true
			}
		}
	}
	if b.Population != nil {
		for _, r := range b.Population.MinTotal {
			ind("population.min_total", r.Indicator)
		}
		for _, r := range b.Population.MaxValue {
			ind("population.max_value", r.Indicator)
		}
		for _, a := range b.Population.Require {
			if s.Fields[a] == nil {
				bad("population.require: no register field %q", a)
			}
		}
	}
	for _, blk := range b.Blocks {
		var inds, gs, labels []string
		switch v := blk.(type) {
		case *brief.ChartBlock:
			inds, gs, labels = v.Indicators, v.Groups, v.Label
		case *brief.TableBlock:
			inds, gs = v.Indicators, v.Groups
		case *brief.CommentaryBlock:
			inds, gs = v.Indicators, v.Groups
		}
		where := fmt.Sprintf("line %d (%s block)", blk.Position().Line, blk.Kind())
		for _, k := range inds {
			ind(where, k)
		}
		for _, g := range gs {
			if !groups[g] {
				bad("%s: no group %q (groups are %v)", where, g, sortedKeys(groups))
			}
		}
		for _, l := range labels {
			id(where+" label", l)
		}
	}
	if b.Theme.Logo != "" && s.Files[b.Theme.Logo] == nil {
		bad("theme.logo: no file %q in the scenario", b.Theme.Logo)
	}
	return probs
}

func sortedKeys(m map[string]bool) []string {
	out := make([]string, 0, len(m))
	for k := range m {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}

// Unscoped lists the commentary blocks that name no indicators although
// they write about positions or changes. Such a block writes about every
// indicator in the dictionary, pages of text no governing body reads, so
// shipped briefs always say which indicators a block covers; a block of
// caveats alone needs no list.
func Unscoped(b *brief.Brief) []string {
	var out []string
	for _, blk := range b.Blocks {
		c, ok := blk.(*brief.CommentaryBlock)
		if !ok || len(c.Indicators) > 0 {
			continue
		}
		if len(c.Topics) == 1 && c.Topics[0] == "caveats" {
			continue
		}
		out = append(out, fmt.Sprintf("line %d: commentary block names no indicators; list the few it should discuss", c.At.Line))
	}
	return out
}
