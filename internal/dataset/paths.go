package dataset

import (
	"errors"
	"fmt"
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
	fi, err := fs.Stat(fsys, file)
	pos := b.PosOf(key)
	if err == nil {
		// Checked before anything opens the file: opening a pipe blocks
		// until a writer comes, and a device such as /dev/zero never ends.
		if kind := NotAFile(fi.Mode()); kind != "" {
			return diag.At(b.File, pos.Line, pos.Column, "%s %q is %s, not a file; name a data file (CSV, XLSX or YAML) in the brief's folder", key, p, kind)
		}
		return nil
	}
	if !errors.Is(err, fs.ErrNotExist) {
		return diag.At(b.File, pos.Line, pos.Column, "%s %q %s", key, p, OpenProblem(err))
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
	// "does not exist" rather than "is not in the folder": a file deleted
	// or renamed since the last build (under --watch) is not elsewhere.
	msg := "does not exist in the brief's folder"
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

// NotAFile names what a file mode is when it is not a regular file ("a
// folder", "a device", "a named pipe", "a socket"), or "" for a regular
// file.
func NotAFile(m fs.FileMode) string {
	switch {
	case m.IsRegular():
		return ""
	case m.IsDir():
		return "a folder"
	case m&fs.ModeDevice != 0 || m&fs.ModeCharDevice != 0:
		return "a device"
	case m&fs.ModeNamedPipe != 0:
		return "a named pipe"
	case m&fs.ModeSocket != 0:
		return "a socket"
	}
	return "not a regular file"
}

// OpenProblem words why an input that exists cannot be opened, for the
// messages of every input (brief, data files, images): os.Root's refusal
// of a symbolic link that leads out of the folder ("path escapes from
// parent", which os does not export as a value) and permission problems
// get their cause and remedy instead of the raw system text.
func OpenProblem(err error) string {
	switch {
	case strings.Contains(err.Error(), "path escapes from parent"):
		return "is a symbolic link (or lies behind one) that leads out of the brief's folder, and peerpack reads only files inside it; copy the file into the folder, or pass --root with a folder that holds both"
	case errors.Is(err, fs.ErrPermission):
		return "cannot be read: permission denied; check the file's permissions"
	}
	var pe *fs.PathError
	if errors.As(err, &pe) {
		err = pe.Err
	}
	return fmt.Sprintf("cannot be read: %v", err)
}
