package main

import (
	"context"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"peerpack/internal/atomicfile"
	"peerpack/internal/dataset"
	"peerpack/internal/format"
	"peerpack/internal/limits"
	"peerpack/internal/records"
	"peerpack/internal/tabular"
)

func init() {
	commands = append(commands,
		&command{name: "papers", summary: "compute citation, collaboration and subject indicators from paper records", run: runPapers, usage: `Usage:
  peerpack papers PAPERS -o values.csv [--window N] [--fractional]
                  [--baselines-out baselines.csv] [--baselines baselines.csv]

Reads paper records (CSV or Parquet: paper,year,type,field,citations and
institutions,countries[,affiliation_types] as ;-separated lists, or one row
per paper and affiliation with institution,country[,affiliation_type]) and
writes indicator values in the long format (institution,year,indicator,value)
that a brief's data.values reads: papers, citation_impact (item-oriented
mean normalised citation score, 1.00 = world average), top10_share,
intl_coauthorship, industry_coauthorship (with affiliation types) and the
share of output in each OECD Frascati broad field (field_natural, ...).

The file is read twice, as a stream: once for the baselines (expected
citations and top 10 % threshold per field, year and type), once for the
institutions. With --baselines the first pass is replaced by a table written
earlier with --baselines-out (or computed elsewhere), so an institution's own
papers give the values the full run gives.

Examples:
  peerpack papers papers.csv -o paper-values.csv
  peerpack papers papers.parquet -o values.csv --window 3 --fractional
  peerpack papers world.csv -o world-values.csv --baselines-out baselines.csv
  peerpack papers our-papers.csv --baselines baselines.csv -o our-values.csv`},
		&command{name: "votes", summary: "compute esteem indicators from peer-survey votes", run: runVotes, usage: `Usage:
  peerpack votes VOTES --targets TARGETS --register REGISTER --year YEAR -o values.csv [--cap X]

Reads survey votes (respondent,respondent_country,field,institution, one row
per vote), weights respondents so that their countries match the target
shares of researchers (TARGETS: country,share; with a field column the
weights are raked to the country and field shares), caps weights at X times
the mean (default 5), and writes per institution: peer_esteem (weighted
votes, most voted = 100), peer_esteem_unweighted, esteem_votes,
esteem_votes_unweighted, esteem_home_share (share of its weighted votes from
its own country), esteem_regions (effective number of regions voting) and
peer_esteem_<field> for every field. Countries and regions come from the
register.

Examples:
  peerpack votes votes.csv --targets targets.csv --register institutions.csv --year 2025 -o esteem.csv`},
		&command{name: "sample", summary: "generate an invented paper or vote sample (for trials and benchmarks)", run: runSample, usage: `Usage:
  peerpack sample papers -o papers.csv [--papers N] [--fields N] [--institutions N] [--years N] [--seed S] [--pairs] [--industry]
  peerpack sample votes -o votes.csv --targets-out targets.csv [--respondents N] [--votes N] [--institutions N] [--seed S]

Writes an invented world of records, the same bytes for the same flags.
Fine fields have codes under the six Frascati broad fields (2.04.11 is
engineering and technology); institutions are R00001, ...; countries are
invented codes.

Examples:
  peerpack sample papers -o papers.csv --papers 100000
  peerpack sample papers -o world.csv --papers 11300000 --fields 344 --institutions 20000
  peerpack sample votes -o votes.csv --targets-out targets.csv`},
	)
}

// openInput returns an opener for a record file on disk.
func openInput(path string, lim limits.Limits) records.Opener {
	dir, base := filepath.Split(path)
	if dir == "" {
		dir = "."
	}
	return records.OpenFile(os.DirFS(dir), base, lim)
}

// sameAsInput refuses an output that is one of the inputs.
func sameAsInput(e *env, out string, inputs ...string) bool {
	oi, err := os.Stat(out)
	if err != nil {
		return false
	}
	for _, in := range inputs {
		if in == "" {
			continue
		}
		if ii, err := os.Stat(in); err == nil && os.SameFile(oi, ii) {
			e.errorf("-o %s is the input %s; write the output to another file, since an input is never overwritten\n", out, in)
			return true
		}
	}
	return false
}

func writeOut(ctx context.Context, path string, fill func(io.Writer) error) error {
	return atomicfile.Write(ctx, path, 0o644, fill)
}

func runPapers(ctx context.Context, e *env, args []string) int {
	c := findCommand("papers")
	fs := newFlags(c, e)
	out := fs.String("o", "", "the values file to write (CSV, long format; required)")
	window := fs.Int("window", 0, "years per value: one value for every end year over the N years ending there (default: the whole span, one value)")
	fractional := fs.Bool("fractional", false, "divide each paper equally among its institutions (default: full counting)")
	baseIn := fs.String("baselines", "", "use this baselines table (CSV or Parquet) instead of computing it from the file")
	baseOut := fs.String("baselines-out", "", "also write the baselines table (CSV) here")
	pos, code, ok := parseArgs(c, e, fs, args)
	if !ok {
		return code
	}
	if len(pos) != 1 || *out == "" {
		e.errorf("papers needs one papers file and -o OUTPUT.csv\nExample: peerpack papers papers.csv -o values.csv\n")
		return exitUsage
	}
	if *window < 0 {
		e.errorf("--window must be 1 or more years (or 0 for the whole span)\n")
		return exitUsage
	}
	if sameAsInput(e, *out, pos[0], *baseIn) || (*baseOut != "" && sameAsInput(e, *baseOut, pos[0], *baseIn)) {
		return exitUsage
	}
	opt := records.PaperOptions{Window: *window, Fractional: *fractional, Limits: e.limits}
	if *baseIn != "" {
		b, err := records.ReadBaselines(openInput(*baseIn, e.limits), e.limits)
		if err != nil {
			return reportError(e, err)
		}
		opt.Baselines = b
	}
	res, err := records.Papers(openInput(pos[0], e.limits), opt)
	if err != nil {
		return reportError(e, err)
	}
	if err := writeOut(ctx, *out, func(w io.Writer) error { return records.WriteValuesCSV(w, res.Values) }); err != nil {
		return reportError(e, err)
	}
	if *baseOut != "" {
		if err := writeOut(ctx, *baseOut, res.Baselines.WriteCSV); err != nil {
			return reportError(e, err)
		}
		e.infof("wrote %s (%s baselines)\n", *baseOut, format.Int(len(res.Baselines.Rows)))
	}
	e.infof("read %s papers (%s rows) from %d to %d; wrote %s values to %s\n", format.Int(int(res.Papers)), format.Int(int(res.Rows)), res.First, res.Last, format.Int(len(res.Values)), *out)
	paperNotes(e, res)
	return exitOK
}

func paperNotes(e *env, res *records.PaperResult) {
	if res.NoBaseline > 0 {
		e.infof("note: %s papers have no baseline for any of their fields (no citation impact or top 10 %% share)\n", format.Int(int(res.NoBaseline)))
	}
	if res.NoRatio > 0 {
		e.infof("note: %s papers are only in baselines without citations (no citation impact; counted in the top 10 %% share)\n", format.Int(int(res.NoRatio)))
	}
	if res.Unmapped > 0 {
		e.infof("note: %s papers have a field outside the six Frascati broad fields (codes start 1. to 6.); the subject shares do not add up to 100 %% for their institutions\n", format.Int(int(res.Unmapped)))
	}
}

func runVotes(ctx context.Context, e *env, args []string) int {
	c := findCommand("votes")
	fs := newFlags(c, e)
	out := fs.String("o", "", "the values file to write (CSV, long format; required)")
	targets := fs.String("targets", "", "target shares of researchers: country,share[,field] (without it votes are unweighted)")
	register := fs.String("register", "", "the register (CSV or XLSX) giving institutions' countries and regions")
	year := fs.Int("year", 0, "the year the values are written under (required)")
	capX := fs.Float64("cap", records.DefaultWeightCap, "largest weight as a multiple of the mean weight (0 or less: no cap)")
	pos, code, ok := parseArgs(c, e, fs, args)
	if !ok {
		return code
	}
	if len(pos) != 1 || *out == "" || *year == 0 {
		e.errorf("votes needs one votes file, --year YEAR and -o OUTPUT.csv\nExample: peerpack votes votes.csv --targets targets.csv --register institutions.csv --year 2025 -o esteem.csv\n")
		return exitUsage
	}
	if *year < dataset.MinYear || *year > dataset.MaxYear {
		e.errorf("--year %d is not a year between %d and %d\n", *year, dataset.MinYear, dataset.MaxYear)
		return exitUsage
	}
	if sameAsInput(e, *out, pos[0], *targets, *register) {
		return exitUsage
	}
	opt := records.VoteOptions{Year: *year, Cap: *capX, Limits: e.limits}
	if *capX <= 0 {
		opt.Cap = -1
	}
	if *register != "" {
		dir, base := filepath.Split(*register)
		if dir == "" {
			dir = "."
		}
		t, err := tabular.ReadTableWith(os.DirFS(dir), base, e.limits)
		if err != nil {
			return reportError(e, err)
		}
		reg, err := dataset.ReadRegister(t)
		if err != nil {
			return reportError(e, err)
		}
		opt.Institutions, opt.Regions = placesOf(reg)
	}
	var tg *records.Targets
	if *targets != "" {
		var err error
		if tg, err = records.ReadTargets(openInput(*targets, e.limits)); err != nil {
			return reportError(e, err)
		}
	}
	res, err := records.Votes(openInput(pos[0], e.limits), tg, opt)
	if err != nil {
		return reportError(e, err)
	}
	if err := writeOut(ctx, *out, func(w io.Writer) error { return records.WriteValuesCSV(w, res.Values) }); err != nil {
		return reportError(e, err)
	}
	how := "post-stratified by country"
	if res.Raked {
		how = fmt.Sprintf("raked to country and field shares in %d sweeps", res.Iterations)
	}
	if tg == nil {
		how = "unweighted"
	}
	e.infof("read %s votes from %s respondents (%s; Kish effective sample size %.1f); wrote %s values to %s\n",
		format.Int(res.Votes), format.Int(res.Respondents), how, res.Kish, format.Int(len(res.Values)), *out)
	for _, w := range res.Warnings {
		e.infof("warning: %s\n", w)
	}
	return exitOK
}

func runSample(ctx context.Context, e *env, args []string) int {
	c := findCommand("sample")
	fs := newFlags(c, e)
	out := fs.String("o", "", "the file to write (required)")
	targetsOut := fs.String("targets-out", "", "votes: also write the target shares here (required for votes)")
	papers := fs.Int("papers", 100_000, "papers: number of papers")
	fields := fs.Int("fields", 344, "papers: number of fine fields")
	insts := fs.Int("institutions", 2000, "number of institutions")
	years := fs.Int("years", 5, "papers: publication years (ending 2025)")
	seed := fs.Uint64("seed", 1, "the seed; the same seed and flags give the same file")
	pairs := fs.Bool("pairs", false, "papers: one row per paper and affiliation")
	industry := fs.Bool("industry", false, "papers: add affiliation types with industry partners")
	respondents := fs.Int("respondents", 2000, "votes: number of respondents")
	each := fs.Int("votes", 5, "votes: votes per respondent")
	pos, code, ok := parseArgs(c, e, fs, args)
	if !ok {
		return code
	}
	if len(pos) != 1 || (pos[0] != "papers" && pos[0] != "votes") || *out == "" {
		e.errorf("sample needs papers or votes and -o FILE\nExample: peerpack sample papers -o papers.csv\n")
		return exitUsage
	}
	if *papers < 1 || *fields < 1 || *insts < 1 || *years < 1 || *respondents < 1 || *each < 1 {
		e.errorf("sample sizes must be 1 or more\n")
		return exitUsage
	}
	o := records.SampleOptions{Papers: *papers, Fields: *fields, Institutions: *insts, Years: *years, Seed: *seed,
		Pairs: *pairs, Industry: *industry, Respondents: *respondents, VotesEach: *each}
	if pos[0] == "papers" {
		if err := writeOut(ctx, *out, func(w io.Writer) error { return records.SamplePapers(w, o) }); err != nil {
			return reportError(e, err)
		}
		e.infof("wrote %s (%s papers)\n", *out, format.Int(*papers))
		return exitOK
	}
	if *targetsOut == "" {
		e.errorf("sample votes needs --targets-out FILE for the target shares\n")
		return exitUsage
	}
	var tb strings.Builder
	if err := writeOut(ctx, *out, func(w io.Writer) error { return records.SampleVotes(w, &tb, o) }); err != nil {
		return reportError(e, err)
	}
	if err := writeOut(ctx, *targetsOut, func(w io.Writer) error { _, err := io.WriteString(w, tb.String()); return err }); err != nil {
		return reportError(e, err)
	}
	e.infof("wrote %s and %s\n", *out, *targetsOut)
	return exitOK
}

// placesOf gives the votes computation each institution's country and
// region, and each country's region, from the register.
func placesOf(reg *dataset.Register) (map[string]records.Place, map[string]string) {
	insts := map[string]records.Place{}
	regions := map[string]string{}
	for _, in := range reg.Institutions {
		insts[in.ID] = records.Place{Country: in.Country, Region: in.Region}
		if in.Region != "" {
			regions[in.Country] = in.Region
		}
	}
	return insts, regions
}
