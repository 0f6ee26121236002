package records

import (
	"fmt"
	"io"
	"math"
	"sort"
	"strconv"
	"strings"

	"peerpack/internal/diag"
	"peerpack/internal/limits"
)

// The indicator keys computed from votes. Per-field esteem is
// KeyEsteem + "_" + the field's key (FieldKey).
const (
	KeyEsteem           = "peer_esteem"
	KeyEsteemUnweighted = "peer_esteem_unweighted"
	KeyVotes            = "esteem_votes"
	KeyVotesUnweighted  = "esteem_votes_unweighted"
	KeyHomeShare        = "esteem_home_share"
	KeyRegions          = "esteem_regions"
)

// VoteKeys lists the indicators votes always can give (per-field keys
// depend on the file).
func VoteKeys() []string {
	return []string{KeyEsteem, KeyEsteemUnweighted, KeyVotes, KeyVotesUnweighted, KeyHomeShare, KeyRegions}
}

// Weighting defaults. The cap at five times the mean weight is common
// practice, no source (survey practice trims weights somewhere between 3
// and 10 times the mean; Kish 1992, "Weighting for unequal Pi", discusses
// the loss that large weights cause). The raking tolerance is on the
// weighted shares, which are what a reader sees.
const (
	DefaultWeightCap = 5.0
	RakeTolerance    = 1e-10
	RakeMaxIter      = 1000
)

// Targets are target shares of researchers: by country, and by country
// and field when the file has a field column (raking then matches the
// country and the field margins).
type Targets struct {
	Country map[string]float64
	Field   map[string]float64 // nil: post-stratification by country only
}

// Place is an institution's or a respondent country's place: country and
// region from the register.
type Place struct{ Country, Region string }

// VoteOptions are the settings of one votes computation.
type VoteOptions struct {
	Year int
	// Cap is the largest weight as a multiple of the mean; 0 means
	// DefaultWeightCap, a negative value no cap.
	Cap float64
	// Institutions gives each institution's country and region; Regions
	// the region of each country (both from the register).
	Institutions map[string]Place
	Regions      map[string]string
	Limits       limits.Limits
}

// VoteResult is what a votes computation gives.
type VoteResult struct {
	Values                  []Value
	Respondents, Votes      int
	Excluded                int // respondents whose country has no target
	Iterations              int // raking sweeps (1 for post-stratification)
	Raked                   bool
	Capped                  int     // respondents whose weight was capped
	Kish                    float64 // effective sample size (sum w)^2 / sum w^2
	Fields                  []string
	Warnings                []string
	weights                 []float64
	respCountry, respField  []int32
	countryNames, fieldList []string
}

// ReadTargets reads a targets file: country,share[,field].
func ReadTargets(open Opener) (*Targets, error) {
	src, closer, err := open()
	if err != nil {
		return nil, err
	}
	defer closer.Close()
	col := columns(src.header())
	ci, ok1 := col["country"]
	si, ok2 := col["share"]
	fi, hasField := col["field"]
	if !ok1 || !ok2 {
		return nil, diag.At(src.name(), 1, 1, "a targets file has the columns country,share (the share of researchers in each country), optionally field for shares by country and field")
	}
	t := &Targets{Country: map[string]float64{}}
	if hasField {
		t.Field = map[string]float64{}
	}
	seen := map[string]int{}
	for {
		row, line, err := src.next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, err
		}
		c := strings.TrimSpace(string(row[ci]))
		v, err := strconv.ParseFloat(strings.TrimSpace(string(row[si])), 64)
		if err != nil || v < 0 || math.IsInf(v, 0) || math.IsNaN(v) {
			return nil, fieldError(src, line, si, "share %q is not a number of zero or more", row[si])
		}
		if c == "" {
			return nil, fieldError(src, line, ci, "the country is empty")
		}
		key := c
		if hasField {
			f := strings.TrimSpace(string(row[fi]))
			if f == "" {
				return nil, fieldError(src, line, fi, "the field is empty; with a field column every row gives the share of one country and field")
			}
			t.Field[f] += v
			key += "\x00" + f
		}
		if prev, dup := seen[key]; dup {
			return nil, fieldError(src, line, ci, "this target repeats line %d; give each one once", prev)
		}
		seen[key] = line
		t.Country[c] += v
	}
	if len(t.Country) == 0 {
		return nil, diag.At(src.name(), 1, 1, "the targets file has no rows")
	}
	return t, nil
}

// FieldKey turns a field name into an indicator key part: lower case,
// runs of other characters as one underscore.
func FieldKey(f string) string {
	var b strings.Builder
	under := false
	for _, r := range strings.ToLower(f) {
		if r >= 'a' && r <= 'z' || r >= '0' && r <= '9' {
			b.WriteRune(r)
			under = false
		} else if !under && b.Len() > 0 {
			b.WriteByte('_')
			under = true
		}
	}
	return strings.TrimSuffix(b.String(), "_")
}

// Votes computes the esteem indicators of a votes file.
func Votes(open Opener, targets *Targets, opt VoteOptions) (*VoteResult, error) {
	opt.Limits = opt.Limits.Or()
	if opt.Cap == 0 {
		opt.Cap = DefaultWeightCap
	}
	src, closer, err := open()
	if err != nil {
		return nil, err
	}
	defer closer.Close()
	col := columns(src.header())
	need := []string{"respondent", "respondent_country", "field", "institution"}
	idx := make([]int, len(need))
	var missing []string
	for i, n := range need {
		j, ok := col[n]
		if !ok {
			missing = append(missing, n)
		}
		idx[i] = j
	}
	if len(missing) > 0 {
		return nil, diag.At(src.name(), 1, 1, "a votes file has the columns respondent,respondent_country,field,institution (one row per vote); missing: %s", joinList(missing))
	}
	resp := newNames("respondent", opt.Limits.RecordKeys)
	ctry := newNames("country", opt.Limits.RecordKeys)
	flds := newNames("field", opt.Limits.RecordKeys)
	insts := newNames("institution", opt.Limits.RecordKeys)
	var respCountry, respField []int32
	var respLine []int
	type vote struct{ resp, field, inst int32 }
	var votes []vote
	for {
		row, line, err := src.next()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, err
		}
		var ids [4]int32
		for i, ns := range []*names{resp, ctry, flds, insts} {
			b := trimBytes(row[idx[i]])
			if len(b) == 0 {
				return nil, fieldError(src, line, idx[i], "the %s is empty; every vote names its respondent, the respondent's country, the field and the institution voted for", strings.ReplaceAll(need[i], "_", " "))
			}
			id, ok := ns.id(b)
			if !ok {
				return nil, fieldError(src, line, idx[i], "the file names %s", opt.Limits.Beyond(limits.RecordKeys, "check the column for stray text"))
			}
			ids[i] = id
		}
		if int(ids[0]) == len(respCountry) {
			respCountry = append(respCountry, ids[1])
			respField = append(respField, ids[2])
			respLine = append(respLine, line)
		} else if respCountry[ids[0]] != ids[1] {
			return nil, fieldError(src, line, idx[1], "respondent %s is from %s on line %d; a respondent has one country", resp.list[ids[0]], ctry.list[respCountry[ids[0]]], respLine[ids[0]])
		}
		votes = append(votes, vote{ids[0], ids[2], ids[3]})
	}
	if len(votes) == 0 {
		return nil, diag.At(src.name(), 1, 1, "the file holds no votes; add one row per vote below the header")
	}
	res := &VoteResult{Respondents: len(respCountry), Votes: len(votes),
		respCountry: respCountry, respField: respField, countryNames: ctry.list, fieldList: flds.list}
	if err := res.weigh(targets, opt.Cap); err != nil {
		return nil, diag.At(src.name(), 0, 0, "%v", err)
	}

	// Per institution: weighted and unweighted votes, per field, from home,
	// by region.
	nI, nF := len(insts.list), len(flds.list)
	wv := make([]float64, nI)
	uv := make([]float64, nI)
	fv := make([]float64, nI*nF)
	home := make([]float64, nI)
	region := make([]map[string]float64, nI)
	for _, v := range votes {
		w := res.weights[v.resp]
		if w == 0 {
			continue
		}
		wv[v.inst] += w
		uv[v.inst]++
		fv[int(v.inst)*nF+int(v.field)] += w
		rc := ctry.list[respCountry[v.resp]]
		if p, ok := opt.Institutions[insts.list[v.inst]]; ok && p.Country == rc {
			home[v.inst] += w
		}
		if region[v.inst] == nil {
			region[v.inst] = map[string]float64{}
		}
		reg, ok := opt.Regions[rc]
		if !ok {
			reg = "country " + rc
		}
		region[v.inst][reg] += w
	}
	maxOf := func(s []float64, stride, off int) float64 {
		m := 0.0
		for i := off; i < len(s); i += stride {
			m = math.Max(m, s[i])
		}
		return m
	}
	maxW, maxU := maxOf(wv, 1, 0), maxOf(uv, 1, 0)
	fmax := make([]float64, nF)
	fieldKeys := make([]string, nF)
	for f := range fmax {
		fmax[f] = maxOf(fv, nF, f)
		fieldKeys[f] = KeyEsteem + "_" + FieldKey(flds.list[f])
	}
	res.Fields = flds.list
	order := make([]int, nI)
	for i := range order {
		order[i] = i
	}
	sort.Slice(order, func(a, b int) bool { return insts.list[order[a]] < insts.list[order[b]] })
	for _, i := range order {
		if uv[i] == 0 {
			continue
		}
		id := insts.list[i]
		add := func(key string, v float64) {
			res.Values = append(res.Values, Value{Institution: id, Year: opt.Year, Indicator: key, Value: v})
		}
		if maxW > 0 {
			add(KeyEsteem, 100*wv[i]/maxW)
		}
		add(KeyEsteemUnweighted, 100*uv[i]/maxU)
		add(KeyVotes, wv[i])
		add(KeyVotesUnweighted, uv[i])
		if _, ok := opt.Institutions[id]; ok && wv[i] > 0 {
			add(KeyHomeShare, 100*home[i]/wv[i])
		}
		if wv[i] > 0 {
			// Spread over regions: the effective number of regions,
			// 1 / sum of squared shares (Hill 1973, the diversity number of
			// order 2; the inverse Simpson index).
			var ss float64
			for _, g := range sortedKeys(region[i]) {
				p := region[i][g] / wv[i]
				ss += p * p
			}
			add(KeyRegions, 1/ss)
		}
		for f := 0; f < nF; f++ {
			if fmax[f] > 0 {
				add(fieldKeys[f], 100*fv[i*nF+f]/fmax[f])
			}
		}
	}
	// A register institution that no respondent names gets no value at
	// all, not 0: the survey says nothing about it (a respondent names the
	// few institutions they know best, so silence is not a measured zero),
	// and the coverage of the esteem indicators then reports it as missing.
	sort.SliceStable(res.Values, func(a, b int) bool {
		if res.Values[a].Institution != res.Values[b].Institution {
			return res.Values[a].Institution < res.Values[b].Institution
		}
		return res.Values[a].Indicator < res.Values[b].Indicator
	})
	return res, nil
}

func trimBytes(b []byte) []byte {
	for len(b) > 0 && (b[0] == ' ' || b[0] == '\t') {
		b = b[1:]
	}
	for len(b) > 0 && (b[len(b)-1] == ' ' || b[len(b)-1] == '\t') {
		b = b[:len(b)-1]
	}
	return b
}

func sortedKeys(m map[string]float64) []string {
	k := make([]string, 0, len(m))
	for s := range m {
		k = append(k, s)
	}
	sort.Strings(k)
	return k
}

// weigh sets respondent weights: post-stratification by country, or
// raking over country and field; then the cap and Kish's effective sample
// size. Weights are scaled to a mean of 1 over the respondents counted.
func (res *VoteResult) weigh(t *Targets, capMul float64) error {
	n := len(res.respCountry)
	res.weights = make([]float64, n)
	if t == nil {
		// No targets: every respondent counts once (unweighted).
		for i := range res.weights {
			res.weights[i] = 1
		}
		res.Warnings = append(res.Warnings, "no target shares given: votes are unweighted")
		res.kish()
		return nil
	}
	// Country margin: targets of the countries with respondents.
	nc := len(res.countryNames)
	cTarget := make([]float64, nc)
	present := make([]bool, nc)
	for _, c := range res.respCountry {
		present[c] = true
	}
	var missingT []string
	for c, name := range res.countryNames {
		if v, ok := t.Country[name]; ok && v > 0 {
			cTarget[c] = v
		} else if present[c] {
			missingT = append(missingT, name)
		}
	}
	var noResp []string
	for name := range t.Country {
		found := false
		for _, cn := range res.countryNames {
			found = found || cn == name
		}
		if !found && t.Country[name] > 0 {
			noResp = append(noResp, name)
		}
	}
	sort.Strings(noResp)
	if len(missingT) > 0 {
		res.Warnings = append(res.Warnings, fmt.Sprintf("respondents from %s have no target share and are left out", joinList(missingT)))
	}
	if len(noResp) > 0 {
		res.Warnings = append(res.Warnings, fmt.Sprintf("no respondent from %s: their target share is spread over the other countries", joinList(noResp)))
	}
	normalise(cTarget)
	counted := 0
	for i, c := range res.respCountry {
		if cTarget[c] > 0 {
			res.weights[i] = 1
			counted++
		}
	}
	res.Excluded = n - counted
	if counted == 0 {
		return fmt.Errorf("no respondent's country has a target share; the targets name the countries of the votes file")
	}
	var fTarget []float64
	if t.Field != nil {
		res.Raked = true
		fTarget = make([]float64, len(res.fieldList))
		var noTarget []string
		for f, name := range res.fieldList {
			fTarget[f] = t.Field[name]
			if fTarget[f] == 0 {
				noTarget = append(noTarget, name)
			}
		}
		if len(noTarget) > 0 {
			return fmt.Errorf("the targets give no share for the field %s; give every field of the votes a share, or drop the field column to weight by country only", joinList(noTarget))
		}
		normalise(fTarget)
	}
	total := float64(counted)
	scale := func(group []int32, target []float64) {
		sums := make([]float64, len(target))
		for i, g := range group {
			sums[g] += res.weights[i]
		}
		for i, g := range group {
			if res.weights[i] > 0 && sums[g] > 0 {
				res.weights[i] *= target[g] * total / sums[g]
			}
		}
	}
	gap := func(group []int32, target []float64) float64 {
		sums := make([]float64, len(target))
		for i, g := range group {
			sums[g] += res.weights[i]
		}
		worst := 0.0
		for g := range target {
			if target[g] > 0 || sums[g] > 0 {
				worst = math.Max(worst, math.Abs(sums[g]/total-target[g]))
			}
		}
		return worst
	}
	if fTarget == nil {
		// Post-stratification: one step gives every country its share.
		scale(res.respCountry, cTarget)
		res.Iterations = 1
	} else {
		// Raking (iterative proportional fitting, Deming and Stephan
		// 1940): alternate the country and field adjustments until both
		// margins are within RakeTolerance.
		converged := false
		for it := 1; it <= RakeMaxIter; it++ {
			scale(res.respCountry, cTarget)
			scale(res.respField, fTarget)
			res.Iterations = it
			if gap(res.respCountry, cTarget) < RakeTolerance && gap(res.respField, fTarget) < RakeTolerance {
				converged = true
				break
			}
		}
		if !converged {
			return fmt.Errorf("raking did not reach the tolerance of %g in %d sweeps (largest gap %.3g); some country and field combinations have no respondents, so the two sets of targets cannot both be met; weight by country only or merge small fields",
				RakeTolerance, RakeMaxIter, math.Max(gap(res.respCountry, cTarget), gap(res.respField, fTarget)))
		}
	}
	if capMul > 0 {
		limit := capMul // the mean weight is 1
		for i, w := range res.weights {
			if w > limit {
				res.weights[i] = limit
				res.Capped++
			}
		}
		if res.Capped > 0 {
			res.Warnings = append(res.Warnings, fmt.Sprintf("%d respondents' weights were capped at %g times the mean weight; the weighted shares then differ slightly from the targets", res.Capped, capMul))
		}
	}
	res.kish()
	return nil
}

func (res *VoteResult) kish() {
	res.Kish = KishESS(res.weights)
}

// KishESS is Kish's effective sample size (Kish 1965, Survey Sampling):
// (sum of weights)^2 / sum of squared weights.
func KishESS(w []float64) float64 {
	var s, s2 float64
	for _, x := range w {
		s += x
		s2 += x * x
	}
	if s2 == 0 {
		return 0
	}
	return s * s / s2
}

func normalise(v []float64) {
	t := 0.0
	for _, x := range v {
		t += x
	}
	if t == 0 {
		return
	}
	for i := range v {
		v[i] /= t
	}
}

// IsPercent tells whether an indicator from records is on the 0..100
// scale (shares and most-voted = 100 scores).
func IsPercent(key string) bool {
	switch key {
	case KeyTop10Share, KeyIntlCoauthorship, KeyIndustryCoauthorship, KeyHomeShare, KeyEsteem, KeyEsteemUnweighted:
		return true
	}
	return strings.HasPrefix(key, "field_") || strings.HasPrefix(key, KeyEsteem+"_")
}
