package display

import (
	"bytes"
	"fmt"
	"io"
	"os"
	"path/filepath"
)

// writeFileAtomic writes what render produces to path through a temporary
// file in the same folder and a rename, so that a reader never sees a
// half-written file and a failed render leaves no file behind. The folder
// must exist; the error names the path and says how to fix it.
func writeFileAtomic(path string, render func(io.Writer) error) error {
	if path == "" {
		return fmt.Errorf("display: empty file name; give a path such as \"out/figure.svg\"")
	}
	dir := filepath.Dir(path)
	info, err := os.Stat(dir)
	switch {
	case err != nil:
		return fmt.Errorf("display: cannot save %q: folder %q does not exist; create it first or choose another folder", path, dir)
	case !info.IsDir():
		return fmt.Errorf("display: cannot save %q: %q is not a folder", path, dir)
	}
	var buf bytes.Buffer
	if err := render(&buf); err != nil {
		return err // nothing was written to disk yet
	}
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp-*")
	if err != nil {
		return fmt.Errorf("display: cannot save %q: folder %q is not writable (%v); choose a folder you may write to", path, dir, err)
	}
	name := tmp.Name()
	_, werr := tmp.Write(buf.Bytes())
	if werr == nil {
		werr = tmp.Sync()
	}
	if cerr := tmp.Close(); werr == nil {
		werr = cerr
	}
	if werr == nil {
		werr = os.Chmod(name, 0o644)
	}
	if werr == nil {
		werr = os.Rename(name, path)
	}
	if werr != nil {
		os.Remove(name)
		return fmt.Errorf("display: cannot save %q: %v; check the disk has space and the path is writable", path, werr)
	}
	return nil
}
