package narrative

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/dataset"
	"peerpack/internal/diag"
	"peerpack/internal/figures"
	"peerpack/internal/format"
	"peerpack/internal/yamlx"
)

// Commentary is the written commentary of one pack.
type Commentary struct {
	// Summary is the executive summary for the first page: the overall
	// position, the strengths and risks, the headline movement and the key
	// caveats.
	Summary []Paragraph
	// Blocks holds the text of every commentary block of the brief.
	Blocks map[*brief.CommentaryBlock][]Paragraph
	// Clusters holds the peer-group text of every clusters block.
	Clusters map[*brief.ClustersBlock][]Paragraph
	// Sentences lists every sentence in pack order (the summary, then the
	// blocks in brief order), for the sources appendix.
	Sentences []Sentence
	// Composite is the text of the composite section (composite.go), when
	// the brief builds a composite.
	Composite []Paragraph

	// rankBands is the brief's rank_bands, needed to re-read banded ranks;
	// wording is the language the sentences were written in, needed to
	// recognise indicator names inside them.
	rankBands int
	wording   Wording
}

// Compose writes the executive summary and the text of every commentary
// block of b from the figures model, checks that every figure a sentence
// cites exists, and adds the sentences to the model as commentary rows
// (see rows.go). An unknown indicator or group in a block, or years
// outside the brief's span, is reported at the block's position.
func Compose(m *figures.Model, b *brief.Brief) (*Commentary, error) {
	if m == nil || b == nil || m.Data == nil || m.Data.Register == nil || m.Data.Dictionary == nil {
		return nil, errors.New("internal error: commentary needs a computed figures model and its brief")
	}
	w, err := WordingFor(b.Language)
	if err != nil {
		p := b.Lines["language"]
		return nil, diag.At(b.File, p.Line, p.Column, "%v", err)
	}
	c := newComposer(m, b, w)
	out := &Commentary{Blocks: map[*brief.CommentaryBlock][]Paragraph{}, Clusters: map[*brief.ClustersBlock][]Paragraph{}, rankBands: b.RankBands, wording: w}
	out.Summary = c.write(c.executiveScope())

	var probs diag.List
	n := 0
	executivePlaced := false
	for _, blk := range b.Blocks {
		cb, ok := blk.(*brief.CommentaryBlock)
		if !ok {
			continue
		}
		n++
		sc, err := c.scopeOf(cb, fmt.Sprintf("block-%02d", n))
		if err != nil {
			probs.Add(err)
			continue
		}
		if cb.Style == "summary" && !executivePlaced {
			// The brief's first summary block takes the place of the
			// executive summary (the layout then sets no second one), so
			// it carries what the executive summary always carries: the
			// short caveats of its own figures, whatever its topics.
			executivePlaced = true
			sc.executive = true
			sc.topics["caveats"] = true
		}
		out.Blocks[cb] = c.write(sc)
	}
	if err := probs.Err(); err != nil {
		return nil, err
	}
	out.dedupe(b, executivePlaced)
	nc := 0
	for _, blk := range b.Blocks {
		if pb, ok := blk.(*brief.ClustersBlock); ok && m.Peers != nil {
			nc++
			out.Clusters[pb] = c.peersParagraphs(fmt.Sprintf("clusters-%02d", nc))
		}
	}
	out.Sentences = collect(out.Summary)
	for _, blk := range b.Blocks {
		switch v := blk.(type) {
		case *brief.CommentaryBlock:
			out.Sentences = append(out.Sentences, collect(out.Blocks[v])...)
		case *brief.ClustersBlock:
			out.Sentences = append(out.Sentences, collect(out.Clusters[v])...)
		}
	}
	if m.HasComposite() {
		out.Composite = c.composite()
		out.Sentences = append(out.Sentences, collect(out.Composite)...)
	}
	if err := checkCites(m, out.Sentences); err != nil {
		return nil, err
	}
	rows := commentaryRows(out.Sentences)
	if len(rows) > 0 {
		if _, done := m.Lookup(rows[0].Key); done {
			return nil, errors.New("internal error: commentary was already composed for this figures model; compose once per model so the figures file has each sentence once")
		}
	}
	m.Add(rows...)
	return out, nil
}

// dedupe drops every paragraph the pack has already printed under the same
// run-in heading (two blocks asking for the same competitor systems), so
// no paragraph appears twice. The
// executive summary counts as printed only when no summary block stands in
// for it (the layout prints one or the other).
func (out *Commentary) dedupe(b *brief.Brief, executivePlaced bool) {
	seen := map[string]bool{}
	if !executivePlaced {
		for _, p := range out.Summary {
			seen[p.Heading+"\x00"+p.Text()] = true
		}
	}
	for _, blk := range b.Blocks {
		cb, ok := blk.(*brief.CommentaryBlock)
		if !ok {
			continue
		}
		var kept []Paragraph
		for _, p := range out.Blocks[cb] {
			if t := p.Heading + "\x00" + p.Text(); !seen[t] {
				seen[t] = true
				kept = append(kept, p)
			}
		}
		out.Blocks[cb] = kept
	}
}

func collect(ps []Paragraph) []Sentence {
	var out []Sentence
	for _, p := range ps {
		out = append(out, p.Sentences...)
	}
	return out
}

// checkCites fails on the first sentence citing a figure the model does
// not have: a sentence must never rest on a number nobody can look up.
func checkCites(m *figures.Model, ss []Sentence) error {
	for _, s := range ss {
		for _, k := range s.Cites {
			if _, ok := m.Lookup(k); !ok {
				return fmt.Errorf("commentary (%s): the sentence %q cites the figure %s, which the figures model does not have", s.Part, s.Text, k)
			}
		}
	}
	return nil
}

// composer holds what every planner needs while writing one pack.
type composer struct {
	m     *figures.Model
	b     *brief.Brief
	w     Wording
	focus string // the focus institution's name as sentences use it
	part  string
	// introduced records, per part, the groups the focus has been said
	// not to belong to, so the long form is written once; said records
	// what a part has already stated (the year, a value), so sentences
	// do not repeat it.
	introduced map[string]bool
	said       map[string]bool
	// turns counts, per part and kind of sentence, the sentences written,
	// so that consecutive sentences of a kind take different phrasings.
	turns map[string]int
}

func newComposer(m *figures.Model, b *brief.Brief, w Wording) *composer {
	c := &composer{m: m, b: b, w: w, introduced: map[string]bool{}, said: map[string]bool{}, turns: map[string]int{}}
	if m.Focus >= 0 && m.Focus < m.Data.Register.Len() {
		in := m.Data.Register.Institutions[m.Focus]
		c.focus = in.Name
		if s, ok := in.Attr("short_name"); ok && strings.TrimSpace(s) != "" {
			c.focus = strings.TrimSpace(s)
		}
	}
	return c
}

// next returns the seed and turn for the next sentence of a kind in the
// current part: the seed is the part's, so the phrasings of one part
// rotate (Wording picks (variant(seed) + turn) mod n), and two sentences
// of a kind in a row never read alike.
func (c *composer) next(kind string) (string, int) {
	k := c.part + "/" + kind
	t := c.turns[k]
	c.turns[k] = t + 1
	return k, t
}

// noise is the brief's noise rule in percentile points
// (brief.NoiseRule, default PercentileNoise).
func (c *composer) noise() float64 { return c.b.NoiseRule() }

// floor is the brief's small-group floor (brief.SmallGroupFloor, default
// SmallGroup): a distribution with fewer values gets ranks "of n" and no
// quarters or percentiles.
func (c *composer) floor() int {
	if c.m.Floor > 0 {
		return c.m.Floor
	}
	return c.b.SmallGroupFloor()
}

// small reports whether a distribution is below the small-group floor.
func (c *composer) small(d *figures.Distribution) bool { return d != nil && d.N > 0 && d.N < c.floor() }

// edge is the quarter boundary a percentile lies within the noise rule
// of: 1 for the top quarter's (75), 4 for the bottom quarter's (25), 0
// for neither. Such a position is "at the edge of" that quarter rather
// than in or out of it.
func (c *composer) edge(pct float64) int {
	switch n := c.noise(); {
	case n <= 0 || math.IsNaN(pct):
		return 0
	case math.Abs(pct-75) <= n:
		return 1
	case math.Abs(pct-25) <= n:
		return 4
	}
	return 0
}

// edgeClaims: the percentile lies within the noise rule of the boundary
// edge names (bounds included).
func (c *composer) edgeClaims(pct figures.Key, edge int) []Claim {
	b := 75.0
	if edge == 4 {
		b = 25
	}
	n := c.noise()
	return []Claim{Claimed(Fig(pct), OpGreaterEq, Num(b-n)), Claimed(Fig(pct), OpLessEq, Num(b+n))}
}

// quarterClaims: the quarter a value is said to be in, checked against
// the group's quartile values (the one boundary rule, stats.QuartileByValue:
// a value on a quartile is in the better quarter). The model places a
// value in a quarter as printed, value and quartiles at the indicator's
// declared decimals, so a comparison that holds only as printed (1.92
// against a median of 1.92115) is recorded on the printed numbers.
func (c *composer) quarterClaims(ind dataset.Indicator, value Operand, group, key string, year, q int) []Claim {
	q1, med, q3 := Fig(distKey(group, key, year, mQ1)), Fig(distKey(group, key, year, mMedian)), Fig(distKey(group, key, year, mQ3))
	var out []Claim
	claim := func(l Operand, op string, r Operand) {
		cl := Claimed(l, op, r)
		if ok, err := cl.Holds(c.m); err == nil && !ok {
			if lv, err := l.value(c.m); err == nil {
				if rv, err := r.value(c.m); err == nil {
					cl = Claimed(Num(format.Round(lv, ind.Decimals)), op, Num(format.Round(rv, ind.Decimals)))
				}
			}
		}
		out = append(out, cl)
	}
	if ind.Better == dataset.LowerIsBetter {
		switch q {
		case 1:
			claim(value, OpLessEq, q1)
		case 2:
			claim(value, OpGreater, q1)
			claim(value, OpLessEq, med)
		case 3:
			claim(value, OpGreater, med)
			claim(value, OpLessEq, q3)
		case 4:
			claim(value, OpGreater, q3)
		}
		return out
	}
	switch q {
	case 1:
		claim(value, OpGreaterEq, q3)
	case 2:
		claim(value, OpLess, q3)
		claim(value, OpGreaterEq, med)
	case 3:
		claim(value, OpLess, med)
		claim(value, OpGreaterEq, q1)
	case 4:
		claim(value, OpLess, q1)
	}
	return out
}

// phrase is how sentences name a group: the brief's phrase, else the
// wording's default for the group's name.
func (c *composer) phrase(g *figures.Group) string { return c.w.GroupPhrase(g) }

// say makes a sentence of the current part.
func (c *composer) say(about, text string, cites ...figures.Key) Sentence {
	return Sentence{Text: text, Cites: cites, About: about, Part: c.part}
}

// scope is what one piece of commentary covers.
type scope struct {
	part  string
	style string
	inds  []dataset.Indicator
	// groups are the groups positions are written for; systems the
	// competitor systems (groups expanded from "each").
	groups  []*figures.Group
	systems []*figures.Group
	// ref is the group summaries and changes are stated against: the
	// first group of the scope the focus belongs to.
	ref  *figures.Group
	year int
	// first and last are the block's years; 0 means each trend's own
	// span within the brief's years.
	first, last int
	topics      map[string]bool
	executive   bool
}

func (s *scope) has(topic string) bool { return s.topics[topic] }

// defaultTopics are the topics a style writes when a block names none.
var defaultTopics = map[string][]string{
	"summary": {"position", "strengths", "change", "caveats"},
	"detail":  {"position", "change", "gaps", "competition", "caveats"},
	"bullets": {"position", "change", "gaps", "competition", "caveats"},
}

func topicSet(style string, topics []string) map[string]bool {
	if len(topics) == 0 {
		topics = defaultTopics[style]
	}
	set := map[string]bool{}
	for _, t := range topics {
		set[t] = true
	}
	return set
}

// executiveScope is the executive summary's scope: the indicators and
// groups of the brief's first summary-style commentary block when it has
// one (the author's choice of headline indicators), else every indicator
// and group; it always ends with the short caveats of its own figures
// (the standing cautions are the closing section's).
func (c *composer) executiveScope() *scope {
	sc := &scope{part: "summary", style: "summary", inds: c.m.Data.Dictionary.Indicators, year: c.m.Year,
		topics: topicSet("summary", nil), executive: true}
	groups := c.m.Groups
	for _, blk := range c.b.Blocks {
		cb, ok := blk.(*brief.CommentaryBlock)
		if !ok || cb.Style != "summary" {
			continue
		}
		if own, err := c.scopeOf(cb, "summary"); err == nil {
			if len(cb.Indicators) > 0 {
				sc.inds = own.inds
			}
			if len(cb.Groups) > 0 {
				groups = append(append([]*figures.Group(nil), own.groups...), own.systems...)
				if sameSet(own.groups, own.systems) {
					groups = own.groups
				}
			}
			if own.has("gaps") {
				sc.topics["gaps"] = true
			}
		}
		break
	}
	c.splitGroups(sc, groups)
	return sc
}

func sameSet(a, b []*figures.Group) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

// scopeOf resolves a commentary block's scope against the model.
func (c *composer) scopeOf(cb *brief.CommentaryBlock, part string) (*scope, error) {
	var probs diag.List
	bad := func(format string, args ...any) {
		probs.Addf(c.b.File, cb.At.Line, cb.At.Column, format, args...)
	}
	style := cb.Style
	if style == "" {
		style = "detail"
	}
	sc := &scope{part: part, style: style, year: c.m.Year, topics: topicSet(style, cb.Topics)}
	dict := c.m.Data.Dictionary
	if len(cb.Indicators) == 0 {
		sc.inds = dict.Indicators
	}
	for _, k := range cb.Indicators {
		ind, ok := dict.Lookup(k)
		if !ok {
			msg := fmt.Sprintf("commentary block names indicator %q, which the dictionary does not have", k)
			if s := yamlx.Nearest(k, dict.Keys()); s != "" {
				msg += fmt.Sprintf("; did you mean %q?", s)
			}
			bad("%s", msg)
			continue
		}
		sc.inds = append(sc.inds, ind)
	}
	groups := c.m.Groups
	if len(cb.Groups) > 0 {
		groups = nil
		var names []string
		for _, g := range c.m.Groups {
			names = append(names, g.Name)
		}
		for _, name := range cb.Groups {
			gs := c.m.GroupsOf(name)
			if len(gs) == 0 {
				msg := fmt.Sprintf("commentary block names group %q, which the brief does not define", name)
				if s := yamlx.Nearest(name, names); s != "" {
					msg += fmt.Sprintf("; did you mean %q?", s)
				}
				bad("%s", msg)
			}
			groups = append(groups, gs...)
		}
	}
	c.splitGroups(sc, groups)
	if cb.Years != nil {
		sc.first, sc.last = cb.Years.First, cb.Years.Last
		if !c.hasYear(sc.first) || !c.hasYear(sc.last) {
			bad("commentary years [%d, %d] must be years of the brief's span with data (%s)", sc.first, sc.last, c.yearList())
		}
	}
	if err := probs.Err(); err != nil {
		return nil, err
	}
	return sc, nil
}

func (c *composer) hasYear(y int) bool {
	for _, x := range c.m.Years {
		if x == y {
			return true
		}
	}
	return false
}

func (c *composer) yearList() string {
	s := make([]string, len(c.m.Years))
	for i, y := range c.m.Years {
		s[i] = fmt.Sprint(y)
	}
	return strings.Join(s, ", ")
}

// splitGroups separates competitor systems from the other groups and picks
// the reference group. When a scope has only systems, positions are
// written for them too.
func (c *composer) splitGroups(sc *scope, groups []*figures.Group) {
	for _, g := range groups {
		if g.Kind == "each" {
			sc.systems = append(sc.systems, g)
		} else {
			sc.groups = append(sc.groups, g)
		}
	}
	if len(sc.groups) == 0 {
		sc.groups = sc.systems
	}
	if sc.style == "summary" {
		// A summary leads with the standing among the brief's chosen
		// peers (a members list) when it has them.
		for _, g := range sc.groups {
			if g.Kind == "members" {
				sc.ref = g
				return
			}
		}
	}
	for _, g := range sc.groups {
		if g.FocusIn {
			sc.ref = g
			return
		}
	}
	if len(sc.groups) > 0 {
		sc.ref = sc.groups[0]
	}
}
