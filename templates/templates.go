// Package templates holds peerpack's starting briefs, one per audience,
// embedded in the binary. A template's name is its file name under
// templates/ without the .md extension.
//
// Every template reads the demo scenario's files under the demo's file
// names, so `peerpack new --template NAME DIR` can write the template
// beside the demo data and the result builds at once; the user then swaps
// in their own data and edits the places the template marks with
// "edit:" comments.
package templates

import (
	"embed"
	"fmt"
	"io/fs"
	"sort"
	"strings"

	"peerpack/internal/demo"
)

//go:embed *.md
var files embed.FS

// EditMarker starts every comment in a template that tells the user what
// to change (as "# edit: ..." in the front matter and "<!-- edit: ... -->"
// in the body), so a tool can list them.
const EditMarker = "edit:"

// Names returns the template names, sorted.
func Names() []string {
	entries, _ := fs.ReadDir(files, ".")
	var out []string
	for _, e := range entries {
		if n, ok := strings.CutSuffix(e.Name(), ".md"); ok && !e.IsDir() {
			out = append(out, n)
		}
	}
	sort.Strings(out)
	return out
}

// Brief returns the text of the named template. An unknown name is an
// error that lists the names there are.
func Brief(name string) ([]byte, error) {
	if !validName(name) {
		return nil, unknown(name)
	}
	b, err := files.ReadFile(name + ".md")
	if err != nil {
		return nil, unknown(name)
	}
	return b, nil
}

func validName(name string) bool {
	return name != "" && !strings.ContainsAny(name, "/\\.")
}

func unknown(name string) error {
	return fmt.Errorf("there is no template %q; the templates are %s (see `peerpack new -h`)", name, strings.Join(Names(), ", "))
}

// Files returns everything `peerpack new --template NAME` writes: the demo
// scenario's data files with the template in place of the demo brief, under
// demo.BriefName.
func Files(name string) (map[string][]byte, error) {
	b, err := Brief(name)
	if err != nil {
		return nil, err
	}
	out := demo.Files()
	out[demo.BriefName] = b
	return out, nil
}

// Write writes Files(name) into dir with demo.Write's rules: nothing is
// written if any file there already has other content; identical files
// are left alone.
func Write(name, dir string) error {
	fs, err := Files(name)
	if err != nil {
		return err
	}
	return demo.WriteFiles(dir, fs)
}
