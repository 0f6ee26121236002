package main

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

// checkDoc is the README's field list for `check --json`, read back with
// unknown fields refused so that a field renamed in the code but not in
// the README (and here) fails.
type checkDoc struct {
	FormatVersion int    `json:"format_version"`
	Brief         string `json:"brief"`
	WouldBuild    bool   `json:"would_build"`
	Problems      []struct {
		File    string `json:"file"`
		Line    int    `json:"line"`
		Column  int    `json:"column"`
		Message string `json:"message"`
	} `json:"problems"`
	ProblemsNotShown int `json:"problems_not_shown"`
	Files            []struct {
		Role string `json:"role"`
		Path string `json:"path"`
		Rows int    `json:"rows"`
	} `json:"files"`
	Institutions int   `json:"institutions"`
	Countries    int   `json:"countries"`
	Years        []int `json:"years"`
	Coverage     []struct {
		Indicator string      `json:"indicator"`
		Label     string      `json:"label"`
		Unit      string      `json:"unit"`
		Derived   bool        `json:"derived"`
		PPP       bool        `json:"ppp"`
		Years     []yearShare `json:"years"`
	} `json:"coverage"`
	Groups []struct {
		Name     string `json:"name"`
		Members  int    `json:"members"`
		Defined  string `json:"defined"`
		FocusIn  bool   `json:"focus_is_member"`
		Coverage []struct {
			Indicator string      `json:"indicator"`
			Years     []yearShare `json:"years"`
		} `json:"coverage"`
	} `json:"groups"`
	Population *struct {
		Rules    []string `json:"rules"`
		Included int      `json:"included"`
		Excluded []struct {
			Institution string   `json:"institution"`
			Name        string   `json:"name"`
			Reasons     []string `json:"reasons"`
		} `json:"excluded"`
		Unchecked     int  `json:"unchecked"`
		FocusExcluded bool `json:"focus_excluded"`
	} `json:"population"`
	Suspicious []struct {
		Kind        string `json:"kind"`
		Indicator   string `json:"indicator"`
		Institution string `json:"institution"`
		Year        int    `json:"year"`
		Where       string `json:"where"`
		Message     string `json:"message"`
	} `json:"suspicious"`
	Notes       []string `json:"notes"`
	IgnoredHTML []struct {
		Line   int `json:"line"`
		Column int `json:"column"`
	} `json:"ignored_html"`
	StillToEdit []struct {
		Line int    `json:"line"`
		Text string `json:"text"`
	} `json:"still_to_edit"`
	Derived []struct {
		Indicator    string `json:"indicator"`
		Expr         string `json:"expression"`
		Computed     int    `json:"computed"`
		MissingInput int    `json:"missing_input"`
		DivideByZero int    `json:"divide_by_zero"`
	} `json:"derived"`
}

type yearShare struct {
	Year   int      `json:"year"`
	Values *int     `json:"values"`
	Share  *float64 `json:"share"`
}

func decodeCheck(t *testing.T, out string) checkDoc {
	t.Helper()
	dec := json.NewDecoder(strings.NewReader(out))
	dec.DisallowUnknownFields()
	var d checkDoc
	if err := dec.Decode(&d); err != nil {
		t.Fatalf("check --json output is not the documented document: %v\n%s", err, out)
	}
	if d.FormatVersion != 1 {
		t.Errorf("format_version %d, want 1", d.FormatVersion)
	}
	return d
}

// Every malformed-input case reports, as its first JSON problem, the same
// first line the plain check prints (GNU "file:line:column: message"
// form, from memory), with the same exit code.
func TestCheckJSONCatalogue(t *testing.T) {
	cases, _ := filepath.Glob("../../testdata/bad/*/*")
	for _, dir := range cases {
		if fi, err := os.Stat(dir); err != nil || !fi.IsDir() {
			continue
		}
		t.Run(filepath.Base(filepath.Dir(dir))+"/"+filepath.Base(dir), func(t *testing.T) {
			raw, err := os.ReadFile(filepath.Join(dir, "expect.txt"))
			if err != nil {
				t.Fatal(err)
			}
			lines := strings.Split(strings.TrimRight(string(raw), "\n"), "\n")
			want, wantCode := lines[0], 1
			if want == "ok" {
				wantCode = 0
			}
			if len(lines) > 1 && strings.HasPrefix(lines[1], "exit ") {
				wantCode, _ = strconv.Atoi(strings.TrimPrefix(lines[1], "exit "))
			}
			if wantCode == exitUsage {
				return // a usage error is not a check report
			}
			args := []string{"check", "--json", "brief.md"}
			if extra, err := os.ReadFile(filepath.Join(dir, "args.txt")); err == nil {
				args = append(args, strings.Fields(string(extra))...)
			}
			t.Chdir(dir)
			var stdout, stderr bytes.Buffer
			code := run(context.Background(), &env{stdout: &stdout, stderr: &stderr}, args)
			if code != wantCode {
				t.Errorf("exit code %d, want %d\n%s", code, wantCode, stderr.String())
			}
			d := decodeCheck(t, stdout.String())
			if want == "ok" {
				if !d.WouldBuild || len(d.Problems) != 0 {
					t.Errorf("a valid case: would_build %v, problems %v", d.WouldBuild, d.Problems)
				}
				return
			}
			if d.WouldBuild || len(d.Problems) == 0 {
				t.Fatalf("would_build %v with %d problems", d.WouldBuild, len(d.Problems))
			}
			p := d.Problems[0]
			got := p.Message
			if p.File != "" {
				pos := p.File
				if p.Line > 0 {
					pos += fmt.Sprintf(":%d", p.Line)
					if p.Column > 0 {
						pos += fmt.Sprintf(":%d", p.Column)
					}
				}
				got = pos + ": " + got
			}
			got = strings.SplitN(got, "\n", 2)[0]
			if got != want {
				t.Errorf("first problem\n got: %s\nwant: %s", got, want)
			}
		})
	}
}

// The demo's report: strict JSON by Python's json module (RFC 8259 has no
// NaN or Infinity; parse_constant refuses them), and the figures it
// carries agree with the plain report.
func TestCheckJSONDemo(t *testing.T) {
	dir := t.TempDir()
	if code, _, errs := runArgs("demo", "--write", dir); code != 0 {
		t.Fatalf("demo --write: %s", errs)
	}
	brief := filepath.Join(dir, "brief.md")
	code, out, errs := runArgs("check", "--json", brief)
	if code != 0 {
		t.Fatalf("check --json of the demo: exit %d\n%s", code, errs)
	}
	d := decodeCheck(t, out)
	if !d.WouldBuild || len(d.Problems) != 0 || len(d.Files) == 0 || d.Institutions == 0 || len(d.Coverage) == 0 || len(d.Groups) == 0 {
		t.Errorf("demo report incomplete: would_build %v, %d problems, %d files, %d institutions, %d indicators, %d groups",
			d.WouldBuild, len(d.Problems), len(d.Files), d.Institutions, len(d.Coverage), len(d.Groups))
	}
	_, plain, _ := runArgs("check", brief)
	if !strings.Contains(plain, fmt.Sprintf("%s institutions in %d countries", thousandsForTest(d.Institutions), d.Countries)) {
		t.Errorf("JSON says %d institutions in %d countries; the plain report:\n%s", d.Institutions, d.Countries, plain)
	}
	for _, c := range d.Coverage {
		for _, y := range c.Years {
			if y.Share != nil && (*y.Share < 0 || *y.Share > 1) {
				t.Errorf("%s %d: share %v outside 0..1", c.Indicator, y.Year, *y.Share)
			}
			if y.Share != nil && y.Values != nil && d.Institutions > 0 {
				if diff := *y.Share - float64(*y.Values)/float64(d.Institutions); diff > 1e-12 || diff < -1e-12 {
					t.Errorf("%s %d: share %v is not %d of %d", c.Indicator, y.Year, *y.Share, *y.Values, d.Institutions)
				}
			}
		}
	}
	py, err := exec.LookPath("python3")
	if err != nil {
		t.Skip("python3 not installed; the Go decoding above still ran")
	}
	cmd := exec.Command(py, "-c", `import json,sys
def bad(c): raise ValueError("not JSON: " + c)
json.loads(sys.stdin.read(), parse_constant=bad)`)
	cmd.Stdin = strings.NewReader(out)
	if msg, err := cmd.CombinedOutput(); err != nil {
		t.Errorf("Python's json module refuses the report: %v\n%s", err, msg)
	}
}

// thousandsForTest groups digits by three with commas, as the plain
// report prints counts (common practice, no source).
func thousandsForTest(n int) string {
	s := strconv.Itoa(n)
	for i := len(s) - 3; i > 0; i -= 3 {
		s = s[:i] + "," + s[i:]
	}
	return s
}
