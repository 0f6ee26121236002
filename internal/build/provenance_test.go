package build

import (
	"fmt"
	"hash/crc32"
	"io/fs"
	"os"
	"os/exec"
	"strings"
	"testing"

	"peerpack/internal/demo"
)

// The closing section names every data file the demo was built from with
// its CRC-32C checksum, computed here from the files' bytes with the
// standard library's Castagnoli table (RFC 3720's CRC-32C), so a reader can
// tell which data a pack rests on; every page's footer points there.
func TestDemoNamesItsSources(t *testing.T) {
	in, p := demoPack(t)
	if len(in.Sources) < 4 {
		t.Fatalf("sources recorded: %+v; want register, values, dictionary and PPP at least", in.Sources)
	}
	path := t.TempDir() + "/demo.pdf"
	if err := os.WriteFile(path, p.PDF, 0o644); err != nil {
		t.Fatal(err)
	}
	out, err := exec.Command(tool(t, "pdftotext"), path, "-").Output()
	if err != nil {
		t.Fatal(err)
	}
	text := strings.Join(strings.Fields(string(out)), " ")
	if !strings.Contains(text, "Sources and rebuilding") || !strings.Contains(text, "Data version") {
		t.Fatal("the closing section has no sources and rebuilding part")
	}
	tab := crc32.MakeTable(crc32.Castagnoli)
	for _, name := range []string{in.Brief.Data.Register, in.Brief.Data.Dictionary, in.Brief.Data.PPP, in.Brief.Data.Values[0]} {
		raw, err := fs.ReadFile(demo.FS(), name)
		if err != nil {
			t.Fatal(err)
		}
		sum := fmt.Sprintf("%08x", crc32.Checksum(raw, tab))
		if !strings.Contains(text, name) || !strings.Contains(text, sum) {
			t.Errorf("closing does not list %s with checksum %s", name, sum)
		}
	}
}
