// Package atomicfile writes a file so that readers see either the old
// content or the complete new content, never a partial file: the data goes
// to a uniquely named temporary file beside the target, is flushed to disk,
// and is renamed over the target (rename is atomic within a folder on
// POSIX file systems). A failed or interrupted write removes the temporary
// file and leaves the previous file untouched.
package atomicfile

import (
	"context"
	"fmt"
	"io"
	"os"
	"path/filepath"
)

// WriteFile writes data to path atomically with the given permissions.
func WriteFile(ctx context.Context, path string, data []byte, perm os.FileMode) error {
	return Write(ctx, path, perm, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	})
}

// Write calls fill with a writer onto a temporary file beside path and, if
// fill succeeds and ctx is not cancelled, renames it over path.
func Write(ctx context.Context, path string, perm os.FileMode, fill func(io.Writer) error) (err error) {
	dir, base := filepath.Split(path)
	if dir == "" {
		dir = "."
	}
	tmp, err := os.CreateTemp(dir, "."+base+".tmp-*")
	if err != nil {
		return fmt.Errorf("cannot write %s: %w (is the folder there and writable?)", path, unwrapPath(err))
	}
	name := tmp.Name()
	defer func() {
		if err != nil {
			tmp.Close()
			os.Remove(name)
		}
	}()
	if err = fill(tmp); err != nil {
		return fmt.Errorf("writing %s failed: %w; the previous file, if any, is untouched", path, unwrapPath(err))
	}
	if err = tmp.Sync(); err != nil {
		return fmt.Errorf("writing %s failed: %w; the previous file, if any, is untouched", path, unwrapPath(err))
	}
	if err = tmp.Close(); err != nil {
		return fmt.Errorf("writing %s failed: %w; the previous file, if any, is untouched", path, unwrapPath(err))
	}
	if err = ctx.Err(); err != nil {
		return fmt.Errorf("interrupted before %s was replaced; the previous file, if any, is untouched", path)
	}
	if err = os.Chmod(name, perm); err != nil {
		return fmt.Errorf("cannot set permissions on %s: %w", path, unwrapPath(err))
	}
	if err = os.Rename(name, path); err != nil {
		return fmt.Errorf("cannot replace %s: %w", path, unwrapPath(err))
	}
	return nil
}

func unwrapPath(err error) error {
	if pe, ok := err.(*os.PathError); ok {
		return pe.Err
	}
	return err
}
