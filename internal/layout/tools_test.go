package layout

import (
	"os"
	"os/exec"
	"path/filepath"
	"testing"
)

// runTool runs a poppler-utils or qpdf command on a PDF written to a
// temporary file and returns its standard output. The test is skipped when
// the tool is not installed (Debian packages poppler-utils and qpdf).
func runTool(t *testing.T, pdf []byte, name string, args ...string) string {
	t.Helper()
	if _, err := exec.LookPath(name); err != nil {
		t.Skipf("%s not installed", name)
	}
	path := filepath.Join(t.TempDir(), "out.pdf")
	if err := os.WriteFile(path, pdf, 0o644); err != nil {
		t.Fatal(err)
	}
	args = append(args, path)
	if name == "pdftotext" {
		args = append(args, "-")
	}
	out, err := exec.Command(name, args...).CombinedOutput()
	if err != nil {
		t.Fatalf("%s %v: %v\n%s", name, args, err, out)
	}
	return string(out)
}
