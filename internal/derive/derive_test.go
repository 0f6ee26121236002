package derive

import (
	"math"
	"strings"
	"testing"
)

func vars(m map[string]float64) func(string) float64 {
	return func(n string) float64 {
		if v, ok := m[n]; ok {
			return v
		}
		return math.NaN()
	}
}

func TestEval(t *testing.T) {
	env := vars(map[string]float64{"papers": 450, "staff": 300, "zero": 0, "a": 2, "b": 8, "c": 5, "gone": math.NaN()})
	for _, tc := range []struct {
		src  string
		want float64
		out  Outcome
	}{
		// Expected values worked by hand; each is exact in binary floating
		// point or compared with a tolerance of 1e-12.
		{"papers / staff", 1.5, OK},
		{"ratio of papers to staff", 1.5, OK},
		{"papers per staff", 1.5, OK},
		{"share of staff in papers", 300.0 / 450 * 100, OK},
		{"sum of a, b, c", 15, OK},
		{"difference of b and a", 6, OK},
		{"a + b * c", 42, OK},
		{"(a + b) * c", 50, OK},
		{"-a - -b", 6, OK},
		{"b / a / a", 2, OK},
		{"a - b - c", -11, OK},
		{"2.5e2 / 100", 2.5, OK},
		{"ratio of (sum of a, b) to c", 2, OK},
		{"a + b per c", 2, OK},
		{"papers / zero", math.NaN(), DivideByZero},
		{"papers / (a - a)", math.NaN(), DivideByZero},
		{"papers / gone", math.NaN(), MissingInput},
		{"gone / zero", math.NaN(), MissingInput},
		{"unknown_key + 1", math.NaN(), MissingInput},
		{"1e308 * 10", math.NaN(), DivideByZero},
	} {
		e, err := Parse(tc.src)
		if err != nil {
			t.Errorf("%s: %v", tc.src, err)
			continue
		}
		v, out := e.Eval(env)
		if out != tc.out {
			t.Errorf("%s: outcome %v, want %v", tc.src, out, tc.out)
		}
		if math.IsInf(v, 0) {
			t.Errorf("%s: infinity", tc.src)
		}
		if tc.out == OK && math.Abs(v-tc.want) > 1e-12 {
			t.Errorf("%s = %v, want %v", tc.src, v, tc.want)
		}
		if tc.out != OK && !math.IsNaN(v) {
			t.Errorf("%s = %v, want NaN", tc.src, v)
		}
	}
}

func TestSugarFormsAsKeys(t *testing.T) {
	// ratio, share, sum and difference start a form only before "of".
	e, err := Parse("ratio + share * sum - difference")
	if err != nil {
		t.Fatal(err)
	}
	if got := strings.Join(e.Refs(), ","); got != "ratio,share,sum,difference" {
		t.Errorf("refs %s", got)
	}
	if e, _ := Parse("share of a in b"); !e.Percent {
		t.Error("share of ... in ... not marked as a percent")
	}
	if e, _ := Parse("a / b * 100"); e.Percent {
		t.Error("plain arithmetic marked as a percent")
	}
}

func TestParseErrors(t *testing.T) {
	for _, tc := range []struct {
		src  string
		col  int
		want string
	}{
		// Columns counted by hand.
		{"", 1, "the expression is empty"},
		{"a +", 4, "expected a number, a key or \"(\", found end of expression"},
		{"ratio of a b", 12, "expected \"to\" in \"ratio of X to Y\""},
		{"share of a to b", 12, "expected \"in\" in \"share of X in Y\""},
		{"difference of a, b", 16, "expected \"and\""},
		{"sum of a", 9, "sum of needs at least two terms"},
		{"(a + b", 7, "expected \")\" to close the parenthesis at column 1"},
		{"a b", 3, "unexpected \"b\" after a complete expression"},
		{"a % b", 3, "% is not an operator here"},
		{"a ^ 2", 3, "unexpected character '^'"},
		{"2x", 1, "a key cannot start with a digit"},
		{"a per of", 7, "\"of\" is a connecting word"},
		{"a; b", 2, "unexpected \";\""},
		{strings.Repeat("(", 100) + "a" + strings.Repeat(")", 100), 0, "nests deeper than 64 levels"},
		{strings.Repeat("-", 100) + "a", 0, "nests deeper than 64 levels"},
		{strings.Repeat("a+", 1001) + "a", 1, "over the limit of 2000"},
	} {
		_, err := Parse(tc.src)
		e, ok := err.(*Error)
		if !ok {
			t.Errorf("%q: got %v", tc.src, err)
			continue
		}
		if (tc.col != 0 && e.Col != tc.col) || !strings.Contains(e.Msg, tc.want) {
			t.Errorf("%q: got column %d %q, want column %d %q", tc.src, e.Col, e.Msg, tc.col, tc.want)
		}
	}
}

func TestOrder(t *testing.T) {
	defs := map[string]*Expr{}
	for k, src := range map[string]string{
		"c": "a + b",
		"d": "c * 2",
		"b": "ratio of x to y",
		"e": "d per c",
	} {
		e, err := Parse(src)
		if err != nil {
			t.Fatal(err)
		}
		defs[k] = e
	}
	order, err := Order([]string{"e", "d", "c", "b"}, defs)
	if err != nil {
		t.Fatal(err)
	}
	pos := map[string]int{}
	for i, k := range order {
		pos[k] = i
	}
	for _, dep := range [][2]string{{"b", "c"}, {"c", "d"}, {"d", "e"}, {"c", "e"}} {
		if pos[dep[0]] > pos[dep[1]] {
			t.Errorf("%s after %s in %v", dep[0], dep[1], order)
		}
	}

	cyc := map[string]*Expr{}
	for k, src := range map[string]string{"a": "b + 1", "b": "c * 2", "c": "a / 3", "z": "a"} {
		cyc[k], _ = Parse(src)
	}
	_, err = Order([]string{"z", "a", "b", "c"}, cyc)
	ce, ok := err.(*CycleError)
	if !ok || strings.Join(ce.Path, " -> ") != "a -> b -> c -> a" {
		t.Errorf("got %v", err)
	}
	self := map[string]*Expr{}
	self["s"], _ = Parse("s + 1")
	if _, err := Order([]string{"s"}, self); err == nil || !strings.Contains(err.Error(), "s -> s") {
		t.Errorf("self cycle: %v", err)
	}
}

func FuzzDerive(f *testing.F) {
	for _, s := range []string{"ratio of a to b", "share of a in b", "sum of a, b, c", "difference of a and b", "a per b", "-(a + 2.5e3) / b * 100", "((a))", "a per of"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		e, err := Parse(s)
		if err != nil {
			pe, ok := err.(*Error)
			if !ok || pe.Msg == "" || pe.Col < 1 {
				t.Fatalf("%q: bad error %#v", s, err)
			}
			return
		}
		lookup := func(n string) float64 {
			if len(n)%3 == 0 {
				return 0
			}
			return float64(len(n))
		}
		v, out := e.Eval(lookup)
		if math.IsInf(v, 0) {
			t.Fatalf("%q gave an infinity", s)
		}
		if (out == OK) == math.IsNaN(v) {
			t.Fatalf("%q: outcome %v with value %v", s, out, v)
		}
		// The printed form parses back to the same value.
		e2, err := Parse(e.Root.String())
		if err != nil {
			t.Fatalf("%q printed as %q does not parse: %v", s, e.Root.String(), err)
		}
		if v2, _ := e2.Eval(lookup); !(v2 == v || math.IsNaN(v) && math.IsNaN(v2)) {
			t.Fatalf("%q printed as %q evaluates to %v, not %v", s, e.Root.String(), v2, v)
		}
	})
}
