package limits

import (
	"strings"
	"testing"

	"peerpack/internal/yamlx"
)

// The defaults must admit a world-sized dataset: 21,500 institutions,
// 20 indicators, 10 years, 4.3 million long rows in one file of about
// 110 MB (the scale the project is built for; common practice, no source).
func TestDefaultsAdmitTheWorld(t *testing.T) {
	d := Default()
	checks := []struct {
		name  Name
		found int64
	}{
		{Institutions, 21_500},
		{Indicators, 20},
		{Years, 10},
		{Rows, 4_300_000},
		{FileBytes, 110 << 20},
		{Values, 21_500 * 20 * 10},
		{SheetCells, 215_000 * 22}, // the world in wide shape as a sheet
		{Columns, 22},
	}
	for _, c := range checks {
		if d.Exceeded(c.name, c.found) {
			t.Errorf("default %s = %d refuses a world-sized %d", c.name, d.Get(c.name), c.found)
		}
	}
	if d.YAMLBytes != yamlx.MaxBytes || d.YAMLDepth != yamlx.MaxDepth || d.YAMLScalar != yamlx.MaxScalar || d.YAMLNodes != yamlx.MaxNodes {
		t.Errorf("YAML defaults differ from yamlx's constants: %+v", d)
	}
	for _, n := range Names() {
		if d.Get(n) <= 0 {
			t.Errorf("limit %s has no default", n)
		}
	}
}

func TestParse(t *testing.T) {
	cases := []struct {
		spec string
		name Name
		want int64
	}{
		{"rows=20M", Rows, 20_000_000},
		{"rows=20m", Rows, 20_000_000},
		{"ROWS = 7", Rows, 7},
		{"file=2G", FileBytes, 2 << 30},
		{"file=2GiB", FileBytes, 2 << 30},
		{"file=512KB", FileBytes, 512 << 10},
		{"cell=100B", CellBytes, 100},
		{"institutions=50k", Institutions, 50_000},
		{"groups=3,charts=4", Charts, 4},
		{"groups=3,charts=4", Groups, 3},
		{"yaml-depth=8", YAMLDepth, 8},
		{"", Rows, Default().Rows},
		{"rows=5,", Rows, 5},
	}
	for _, c := range cases {
		l, err := Parse(c.spec)
		if err != nil {
			t.Errorf("Parse(%q): %v", c.spec, err)
			continue
		}
		if got := l.Get(c.name); got != c.want {
			t.Errorf("Parse(%q).%s = %d, want %d", c.spec, c.name, got, c.want)
		}
	}
}

func TestParseErrors(t *testing.T) {
	cases := []struct{ spec, want string }{
		{"row=5", `unknown limit "row"; did you mean "rows"? (limits: file, rows, columns, cell, sheet-cells, institutions, indicators, years, values, groups, charts, blocks, yaml, yaml-depth, yaml-scalar, yaml-nodes, record-file, record-rows, record-keys)`},
		{"zzzzzz=5", `unknown limit "zzzzzz" (limits: file, rows`},
		{"rows", `limit "rows" has no value; write name=value, e.g. rows=20M`},
		{"rows=", `limit rows=: the value is empty`},
		{"rows=0", `limit rows=0: a limit must be at least 1`},
		{"rows=-3", `limit rows=-3: a limit must be at least 1`},
		{"rows=1.5M", `limit rows=1.5M: "1.5M" is not a whole number`},
		{"rows=5MB", `limit rows=5MB: this limit counts items, not bytes`},
		{"rows=5T", `limit rows=5T: "5T" is not a whole number`},
		{"file=5iB", `limit file=5iB: unknown suffix "iB"`},
		{"file=99999999G", `limit file=99999999G: 99999999G is larger than any input peerpack can hold`},
		// More digits than an int64 holds (2^63 - 1 = 9,223,372,036,854,775,807,
		// from memory) is too large, not "not a whole number".
		{"file=99999999999999999999G", `limit file=99999999999999999999G: 99999999999999999999G is larger than any input peerpack can hold; the most is 1,099,511,627,776`},
		{"rows=99999999999999999999", `limit rows=99999999999999999999: 99999999999999999999 is larger than any input peerpack can hold`},
	}
	for _, c := range cases {
		_, err := Parse(c.spec)
		if err == nil {
			t.Errorf("Parse(%q) accepted", c.spec)
			continue
		}
		if !strings.HasPrefix(err.Error(), c.want) {
			t.Errorf("Parse(%q):\n got %s\nwant %s...", c.spec, err, c.want)
		}
	}
}

func TestOver(t *testing.T) {
	l, _ := Parse("rows=5000000,institutions=200000,cell=1K")
	cases := []struct{ got, want string }{
		{l.Beyond(Rows, "split the file"), "more than the limit of 5,000,000 rows; split the file, or raise the limit with --limit rows=10M"},
		{l.Over(Institutions, 250_000, ""), "250,000 institutions, over the limit of 200,000; raise it with --limit institutions=250000"},
		{l.Over(CellBytes, 1500, ""), "1,500 bytes (1.5 KiB), over the limit of 1 KiB; raise it with --limit cell=2K"},
		{Default().Over(FileBytes, 1<<30+5, ""), "1,073,741,829 bytes (1.0 GiB), over the limit of 1 GiB; raise it with --limit file=2G"},
	}
	for _, c := range cases {
		if c.got != c.want {
			t.Errorf("\n got %s\nwant %s", c.got, c.want)
		}
	}
	// The suggested override must parse back and admit what was found.
	for _, found := range []int64{1500, 1 << 20, 3<<30 + 1} {
		msg := Default().Over(FileBytes, found, "")
		i := strings.Index(msg, "--limit ")
		over, err := Parse(msg[i+len("--limit "):])
		if err != nil || over.Exceeded(FileBytes, found) {
			t.Errorf("suggestion in %q does not admit %d (%v)", msg, found, err)
		}
	}
}

func TestCheck(t *testing.T) {
	l, _ := Parse("groups=2")
	if err := l.Check("brief.md", 4, 1, Groups, 2, "the brief defines", ""); err != nil {
		t.Errorf("at the limit: %v", err)
	}
	err := l.Check("brief.md", 4, 1, Groups, 3, "the brief defines", "narrow each: or remove groups")
	want := "brief.md:4:1: the brief defines 3 groups, over the limit of 2; narrow each: or remove groups, or raise the limit with --limit groups=3"
	if err == nil || err.Error() != want {
		t.Errorf("\n got %v\nwant %s", err, want)
	}
}

func TestOrFillsZeros(t *testing.T) {
	l := Limits{Rows: 7}.Or()
	if l.Rows != 7 || l.Columns != Default().Columns {
		t.Errorf("Or: %+v", l)
	}
}

func TestGroup(t *testing.T) {
	for n, want := range map[int64]string{0: "0", 999: "999", 1000: "1,000", 1234567: "1,234,567", -4500: "-4,500"} {
		if got := Group(n); got != want {
			t.Errorf("Group(%d) = %s, want %s", n, got, want)
		}
	}
}

func TestDescribe(t *testing.T) {
	lines := Describe()
	if len(lines) != len(Names()) || !strings.HasPrefix(lines[1], "rows          10,000,000 rows: ") {
		t.Errorf("Describe: %q", lines)
	}
}

func FuzzParse(f *testing.F) {
	for _, s := range []string{"rows=20M", "file=2GiB,cell=1K", "x", "rows=", "=5", ",,,", "cell=9999999999999999999G"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		l, err := Parse(s)
		if err != nil {
			return
		}
		for _, n := range Names() {
			if v := l.Get(n); v < 1 || v > maxValue {
				t.Fatalf("Parse(%q) gave %s = %d", s, n, v)
			}
		}
	})
}
