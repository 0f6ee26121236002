package dataset

import (
	"strconv"
	"strings"
	"testing"
)

// TestManyUnknownIDs: a values file for another register names thousands
// of unknown ids; they are reported by count, not remembered one by one.
func TestManyUnknownIDs(t *testing.T) {
	files := testFiles()
	var b strings.Builder
	b.WriteString("institution,year,indicator,value,note\n")
	for i := 0; i < 3000; i++ {
		b.WriteString("X" + strconv.Itoa(i) + ",2024,papers,1,\n")
	}
	files["long.csv"] = b.String()
	_, _, err := load(t, testBrief, files)
	if err == nil {
		t.Fatal("no error")
	}
	msg := err.Error()
	for _, want := range []string{
		`long.csv:2:1: unknown institution id "X0": it is not in the register (reg.csv)`,
		`long.csv:22:1: and 980 more unknown institution ids over 980 rows, the first here; with this many, check that the brief names the register these values belong to (reg.csv)`,
		`long.csv:1002:1: and 2000 more rows from here on with ids or keys that are neither in the register nor in the dictionary (over 1000 different wrong names in all)`,
	} {
		if !strings.Contains(msg, want) {
			t.Errorf("lacks %s:\n%s", want, msg)
		}
	}
	if strings.Contains(msg, "not shown") || strings.Count(msg, "\n") > 30 {
		t.Errorf("too many lines:\n%s", msg)
	}
}
