package main

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
)

// writeFileAtomic writes data to name through a temporary file in the same
// directory renamed into place, so a failure leaves no partial file. It
// refuses to replace an existing file unless force is set.
func writeFileAtomic(name string, data []byte, force bool) error {
	if _, err := os.Lstat(name); err == nil && !force {
		return &inputError{err: fmt.Errorf("%s already exists; not overwriting it", name), hint: "use --force to replace it, or name another file"}
	} else if err != nil && !errors.Is(err, os.ErrNotExist) {
		return &inputError{err: fmt.Errorf("cannot write %s: %v", name, err)}
	}
	dir := filepath.Dir(name)
	f, err := os.CreateTemp(dir, "."+filepath.Base(name)+".tmp-*")
	if err != nil {
		return &inputError{err: fmt.Errorf("cannot write %s: %v", name, unwrapPath(err))}
	}
	tmp := f.Name()
	_, werr := f.Write(data)
	if werr == nil {
		werr = f.Chmod(0o644)
	}
	cerr := f.Close()
	if werr == nil {
		werr = cerr
	}
	if werr == nil {
		if !force {
			// link fails if the name appeared meanwhile; rename would replace it
			werr = os.Link(tmp, name)
			if werr == nil {
				os.Remove(tmp)
			}
		} else {
			werr = os.Rename(tmp, name)
		}
	}
	if werr != nil {
		os.Remove(tmp)
		if errors.Is(werr, os.ErrExist) {
			return &inputError{err: fmt.Errorf("%s already exists; not overwriting it", name), hint: "use --force to replace it"}
		}
		return &inputError{err: fmt.Errorf("cannot write %s: %v", name, unwrapPath(werr))}
	}
	return nil
}

func unwrapPath(err error) error {
	var pe *os.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	var le *os.LinkError
	if errors.As(err, &le) {
		return le.Err
	}
	return err
}
