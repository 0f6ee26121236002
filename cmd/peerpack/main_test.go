package main

import (
	"bytes"
	"context"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"peerpack/internal/pdfcheck"
)

func runArgs(args ...string) (code int, stdout, stderr string) {
	var o, e bytes.Buffer
	code = run(context.Background(), &env{stdout: &o, stderr: &e}, args)
	return code, o.String(), e.String()
}

// Exit codes: 0 ok, 1 bad input or failed build, 2 wrong usage (the
// convention of Go's own tools and of BSD sysexits' EX_USAGE spirit,
// common practice, no source).
func TestUsageAndExitCodes(t *testing.T) {
	cases := []struct {
		args     []string
		code     int
		inStderr string
		inStdout string
	}{
		{nil, 2, "Usage:", ""},
		{[]string{"biuld"}, 2, `Did you mean "build"?`, ""},
		{[]string{"build"}, 2, "build needs one brief and -o OUTPUT.pdf", ""},
		{[]string{"build", "a.md", "b.md", "-o", "x.pdf"}, 2, "build needs one brief", ""},
		{[]string{"build", "--nope", "a.md"}, 2, "flag provided but not defined: -nope", ""},
		{[]string{"check"}, 2, "check needs one brief", ""},
		{[]string{"new", "dir"}, 2, "new needs --template NAME", ""},
		{[]string{"new", "--template", "nosuch", t.TempDir()}, 2, "governing-body", ""},
		{[]string{"batch", "--out", "x"}, 2, "batch needs a brief", ""},
		{[]string{"version"}, 0, "", "peerpack "},
		{[]string{"--version"}, 0, "", "peerpack "},
		{[]string{"help"}, 0, "", "Commands:"},
		{[]string{"help", "build"}, 0, "", "Examples:"},
		{[]string{"build", "-h"}, 0, "", "--figures"},
		{[]string{"check", "does-not-exist.md"}, 1, "does-not-exist.md", ""},
	}
	for _, c := range cases {
		code, out, errs := runArgs(c.args...)
		if code != c.code {
			t.Errorf("%v: exit %d, want %d (stderr %q)", c.args, code, c.code, errs)
		}
		if c.inStderr != "" && !strings.Contains(errs, c.inStderr) {
			t.Errorf("%v: stderr %q lacks %q", c.args, errs, c.inStderr)
		}
		if c.inStdout != "" && !strings.Contains(out, c.inStdout) {
			t.Errorf("%v: stdout %q lacks %q", c.args, out, c.inStdout)
		}
	}
}

// The README's first command, then the new-user path: write the demo,
// check it, start from each template, build it.
func TestDemoAndTemplatesFromTheCommandLine(t *testing.T) {
	dir := t.TempDir()
	t.Setenv("SOURCE_DATE_EPOCH", "1764547200")
	pdf := filepath.Join(dir, "demo.pdf")
	if code, _, errs := runArgs("demo", "-o", pdf, "--figures", filepath.Join(dir, "f.csv"), "--workbook", filepath.Join(dir, "f.xlsx")); code != 0 {
		t.Fatalf("demo: exit %d: %s", code, errs)
	}
	for _, f := range []string{"demo.pdf", "f.csv", "f.xlsx"} {
		if fi, err := os.Stat(filepath.Join(dir, f)); err != nil || fi.Size() == 0 {
			t.Errorf("%s not written: %v", f, err)
		}
	}
	scen := filepath.Join(dir, "scenario")
	if code, _, errs := runArgs("demo", "--write", scen); code != 0 {
		t.Fatalf("demo --write: %s", errs)
	}
	if code, out, errs := runArgs("check", filepath.Join(scen, "brief.md")); code != 0 || !strings.Contains(out, "The brief would build.") {
		t.Errorf("check of the written demo: exit %d\n%s\n%s", code, out, errs)
	}
	// Writing again over identical files is harmless; over an edited one it
	// must refuse and change nothing.
	if code, _, errs := runArgs("demo", "--write", scen); code != 0 {
		t.Errorf("demo --write over identical files: exit %d %q", code, errs)
	}
	edited := filepath.Join(scen, "brief.md")
	os.WriteFile(edited, []byte("my own brief"), 0o644)
	if code, _, errs := runArgs("demo", "--write", scen); code != 1 || !strings.Contains(errs, "brief.md") {
		t.Errorf("demo --write over an edited brief must refuse: exit %d %q", code, errs)
	}
	if b, _ := os.ReadFile(edited); string(b) != "my own brief" {
		t.Error("the edited brief was overwritten")
	}
	for _, name := range []string{"governing-body", "country-competition", "client-report"} {
		d := filepath.Join(dir, name)
		if code, _, errs := runArgs("new", "--template", name, d); code != 0 {
			t.Fatalf("new %s: %s", name, errs)
		}
		if code, _, errs := runArgs("build", filepath.Join(d, "brief.md"), "-o", filepath.Join(d, "pack.pdf"), "--quiet"); code != 0 {
			t.Errorf("build %s: exit %d\n%s", name, code, errs)
			continue
		}
		// Every template's pack passes pdfcpu's strict ISO 32000-1 checks.
		if raw, err := os.ReadFile(filepath.Join(d, "pack.pdf")); err != nil {
			t.Error(err)
		} else if err := pdfcheck.Strict(raw); err != nil {
			t.Errorf("%s: %v", name, err)
		}
	}
	if raw, err := os.ReadFile(pdf); err != nil {
		t.Error(err)
	} else if err := pdfcheck.Strict(raw); err != nil {
		t.Errorf("demo: %v", err)
	}
}
