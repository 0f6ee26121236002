package dataset

import (
	"errors"
	"io/fs"
	"path"
	"strings"

	"peerpack/internal/brief"
	"peerpack/internal/diag"
	"peerpack/internal/yamlx"
)

// checkPath refuses data paths that would leave the brief's folder or are
// not file paths at all, naming the brief key that holds them. Paths are
// fs.FS paths: forward slashes, relative, no "." or ".." elements.
func checkPath(b *brief.Brief, key, p string) error {
	pos := b.PosOf(key)
	bad := func(why string) error {
		return diag.At(b.File, pos.Line, pos.Column, "%s %q %s", key, p, why)
	}
	file, _, _ := strings.Cut(p, "#")
	switch {
	case strings.TrimSpace(file) == "":
		return bad("is empty; name a file relative to the brief's folder")
	case strings.Contains(file, "://"):
		return bad("is a web address; peerpack reads only files in the brief's folder, so download the file and name it, e.g. values.csv")
	case strings.HasPrefix(file, "/") || (len(file) > 1 && file[1] == ':'):
		return bad("is an absolute path; write it relative to the brief's folder, e.g. data/values.csv")
	case strings.Contains(file, "\\"):
		return bad("uses backslashes; write the path with forward slashes, e.g. data/values.csv")
	}
	for _, el := range strings.Split(file, "/") {
		if el == ".." {
			return bad("leaves the brief's folder (..); data files must be in the brief's folder or below it (or pass --root)")
		}
	}
	if !fs.ValidPath(file) {
		return bad("is not a plain relative path; remove \"./\", doubled slashes and a trailing slash")
	}
	return nil
}

// checkExists reports a data file that is not there at the brief key that
// names it, suggesting the nearest file name in the same folder.
func checkExists(fsys fs.FS, b *brief.Brief, key, p string) error {
	file, _, _ := strings.Cut(p, "#")
	_, err := fs.Stat(fsys, file)
	if err == nil {
		return nil
	}
	pos := b.PosOf(key)
	if !errors.Is(err, fs.ErrNotExist) {
		return diag.At(b.File, pos.Line, pos.Column, "%s %q cannot be read: %v", key, p, err)
	}
	dir := path.Dir(file)
	var names []string
	if ents, err := fs.ReadDir(fsys, dir); err == nil {
		for _, e := range ents {
			if !e.IsDir() {
				names = append(names, path.Join(dir, e.Name()))
			}
		}
	}
	msg := "is not in the brief's folder"
	if dir != "." {
		msg = "does not exist below the brief's folder"
	}
	if s := yamlx.Nearest(file, names); s != "" {
		msg += "; did you mean " + quote(s) + "?"
	} else {
		msg += "; data paths are relative to the brief's folder"
	}
	return diag.At(b.File, pos.Line, pos.Column, "%s %q %s", key, p, msg)
}

// tidyPath removes what is unambiguous noise in a relative path ("./",
// doubled slashes, a trailing slash) so that "./values.csv" is read as
// values.csv; paths that would leave the folder are left as written for
// checkPath to refuse.
func tidyPath(p string) string {
	file, sheet, hasSheet := strings.Cut(p, "#")
	if file == "" || strings.HasPrefix(file, "/") || strings.Contains(file, "://") || strings.Contains(file, "\\") {
		return p
	}
	clean := path.Clean(file)
	if clean == "." || clean == ".." || strings.HasPrefix(clean, "../") {
		return p
	}
	if hasSheet {
		clean += "#" + sheet
	}
	return clean
}
