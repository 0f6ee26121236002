package layout

import (
	"fmt"
	"path"
	"strings"

	"peerpack/internal/format"
	"peerpack/internal/provenance"
)

// provenance sets "Sources and rebuilding" in the closing section: the
// files the pack was built from with their sizes and checksums, the data
// version they make together, the sources the dictionary names, the
// command that builds the pack again, and whom to ask. Every page's
// footer points here for sources, so the section must hold them.
func (w *writer) provenance() {
	w.sectionHeading("Sources and rebuilding", 2)
	files := w.in.Sources
	built := "This pack"
	if d := w.dateLine(); d != "" {
		built += ", dated " + d + ","
	}
	built += " was built"
	if w.in.Version != "" {
		built += " by peerpack " + w.in.Version
	}
	if len(files) > 0 {
		built += fmt.Sprintf(" from the %s below. Data version %s: a checksum of the files' names, sizes and contents, which changes when any of them does (CRC-32C; it detects change, it does not prove origin).", format.Plural(len(files), "file", "files"), provenance.Version(files))
	} else {
		built += "."
	}
	w.plain(built)
	if len(files) > 0 {
		g := grid{
			head:    []string{"File", "Holds", "Size", "Checksum"},
			align:   []byte{'L', 'L', 'R', 'L'},
			caption: "Files the pack was built from",
			natural: true,
		}
		for _, f := range files {
			g.rows = append(g.rows, []cell{{text: f.Name}, {text: w.fileRole(f.Name)}, {text: format.Bytes(int(f.Size))}, {text: f.Checksum()}})
		}
		w.setTable(g)
	}
	if s := w.dictionarySources(); s != "" {
		w.plain(s)
	}
	how := "run " + w.in.Rebuild
	if w.in.Rebuild == "" {
		how = "run peerpack build " + path.Base(w.b.File) + " in the brief's folder"
	}
	w.plain("To build it again from the same files, " + how + ". Set SOURCE_DATE_EPOCH to the build time, as seconds since 1970, and the same files give the same PDF byte for byte; a different data version means the figures may differ.")
	who := strings.TrimSpace(w.b.Contact)
	if who == "" {
		who = strings.TrimSpace(w.b.Author)
	}
	if who == "" {
		who = strings.TrimSpace(w.b.Theme.Organisation)
	}
	if who != "" {
		w.plain("Questions about this pack: " + who + ".")
	}
}

// fileRole says what an input file holds, from the brief's data section.
func (w *writer) fileRole(name string) string {
	d := w.b.Data
	same := func(p string) bool { return p != "" && (p == name || path.Clean(p) == path.Clean(name)) }
	switch {
	case same(d.Register):
		n := w.m.Data.Register.Len()
		return fmt.Sprintf("register: %s %s", format.Int(n), format.Plural(n, "institution", "institutions"))
	case same(d.Dictionary):
		n := len(w.m.Data.Dictionary.Indicators)
		return fmt.Sprintf("dictionary: %s %s", format.Int(n), format.Plural(n, "indicator", "indicators"))
	case same(d.PPP):
		return "purchasing-power-parity factors"
	case same(d.Papers.File):
		return "paper records"
	case same(d.Papers.Baselines):
		return "expected-citation baselines"
	case same(d.Votes.File):
		return "survey votes"
	case same(d.Votes.Targets):
		return "survey target shares"
	}
	for _, v := range d.Values {
		if same(v) {
			if len(w.m.Data.Years) > 0 {
				return fmt.Sprintf("indicator values, %d–%d", w.m.Data.Years[0], w.m.Data.Years[len(w.m.Data.Years)-1])
			}
			return "indicator values"
		}
	}
	return "other input"
}

// dictionarySources names the sources the dictionary gives for the
// indicators the pack shows, each with how many indicators it supplies.
func (w *writer) dictionarySources() string {
	shown := w.packIndicators()
	count := map[string]int{}
	var order []string
	for _, ind := range w.m.Data.Dictionary.Indicators {
		src := strings.TrimSpace(ind.Source)
		if !shown[ind.Key] || src == "" {
			continue
		}
		if count[src] == 0 {
			order = append(order, src)
		}
		count[src]++
	}
	if len(order) == 0 {
		return ""
	}
	parts := make([]string, len(order))
	for i, s := range order {
		parts[i] = fmt.Sprintf("%s, %s %s", strings.TrimRight(s, "."), format.Int(count[s]), format.Plural(count[s], "indicator", "indicators"))
	}
	return "Sources the dictionary names for the indicators shown: " + strings.Join(parts, "; ") + "."
}
