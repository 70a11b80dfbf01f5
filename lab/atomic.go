package lab

import (
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
)

// WriteFileAtomic writes data to path through a temporary file in the same folder, so that a
// reader never sees a half-written file. The file gets mode 0644. An existing
// file is kept unless force is set: the error then wraps fs.ErrExist. Without force the
// temporary file is hard-linked to its name, which fails if the name exists, so a file
// created meanwhile by someone else is not overwritten either (where the file system has no
// hard links, an existence check and a rename are used instead).
func WriteFileAtomic(path string, data []byte, force bool) error {
	exists := func() error { return fmt.Errorf("lab: %s exists; use --force to overwrite: %w", path, fs.ErrExist) }
	if !force {
		if _, err := os.Lstat(path); err == nil {
			return exists()
		} else if !errors.Is(err, fs.ErrNotExist) {
			return fmt.Errorf("lab: %w", err)
		}
	}
	dir := filepath.Dir(path)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp-*")
	if err != nil {
		return fmt.Errorf("lab: %w", err)
	}
	name := tmp.Name()
	defer os.Remove(name) // after a link or a rename this finds nothing, or only the extra name
	_, werr := tmp.Write(data)
	serr := tmp.Sync()
	cerr := tmp.Close()
	if err := errors.Join(werr, serr, cerr, os.Chmod(name, 0o644)); err != nil {
		return fmt.Errorf("lab: writing %s: %w", path, err)
	}
	if force {
		if err := os.Rename(name, path); err != nil {
			return fmt.Errorf("lab: %w", err)
		}
		return nil
	}
	switch err := os.Link(name, path); {
	case err == nil:
		return nil
	case errors.Is(err, fs.ErrExist):
		return exists()
	}
	if err := os.Rename(name, path); err != nil { // no hard links here
		return fmt.Errorf("lab: %w", err)
	}
	return nil
}
