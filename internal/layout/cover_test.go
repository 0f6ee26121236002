package layout

import (
	"bytes"
	"strconv"
	"strings"
	"testing"
	"testing/fstest"
)

// A long organisation name on the cover wraps short of the logo panel
// instead of running under it. The logo is 300 x 150 px: at 150 dpi
// (naturalSize) 50.8 x 25.4 mm, fitted into the 44 x 20 mm box as 40 x
// 20 mm, in a panel with 3 mm padding whose right edge is the right
// margin (20 mm): the panel starts at 210 - 20 - 46 = 144 mm = 408.2 pt.
func TestCoverOrganisationClearsLogo(t *testing.T) {
	org := "Université de Saint-Éluard, Office of Strategic Planning, Institutional Research and International Benchmarking"
	src := bytes.Replace(fixtureBody(t, "# Results\n\nImpact is {=value fnci}.\n"),
		[]byte("organisation: Université de Saint-Éluard"), []byte("organisation: "+org+"\n  logo: logo.png"), 1)
	in := fixtureInputFrom(t, 30, src)
	in.FS = fstest.MapFS{"logo.png": {Data: testPNG(t, 300, 150)}}
	out, err := Render(in)
	if err != nil {
		t.Fatal(err)
	}
	html := runTool(t, out, "pdftotext", "-bbox")
	cover := html[:strings.Index(html, "</page>")]
	const panelLeft = 144 * 72 / 25.4
	words := 0
	for _, m := range wordBox.FindAllStringSubmatch(cover, -1) {
		y1, _ := strconv.ParseFloat(m[4], 64)
		x1, _ := strconv.ParseFloat(m[3], 64)
		if y1 > 42*72/25.4 { // below the logo panel (14 + 26 mm)
			continue
		}
		words++
		if x1 > panelLeft {
			t.Errorf("cover word %q ends at %.1f pt, under the logo (from %.1f pt)", m[5], x1, panelLeft)
		}
	}
	if words < 10 {
		t.Fatalf("only %d words of the organisation found at the top of the cover", words)
	}
	if !strings.Contains(strings.Join(strings.Fields(runTool(t, out, "pdftotext")), " "), "BENCHMARKING") {
		t.Error("the organisation's last word is missing: it was cut instead of wrapped")
	}
}
