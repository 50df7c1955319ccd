package kernel

import (
	"bytes"
	"encoding/json"
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"regexp"
	"sort"
	"strings"
)

// KernelSpec is the content of kernel.json.
type KernelSpec struct {
	Argv          []string       `json:"argv"`
	DisplayName   string         `json:"display_name"`
	Language      string         `json:"language"`
	InterruptMode string         `json:"interrupt_mode"`
	Metadata      map[string]any `json:"metadata"`
}

var validName = regexp.MustCompile(`^[A-Za-z0-9._-]+$`)

// InstallCommand implements
//
//	loligo install [--user | --prefix DIR] [--name NAME] [--display-name TEXT]
//	               [--interrupt-mode message|signal] [--print]
//
// writing kernel.json and the logos where `jupyter kernelspec list` finds
// them: $JUPYTER_DATA_DIR/kernels/NAME or ~/.local/share/jupyter/kernels/NAME
// with --user, DIR/share/jupyter/kernels/NAME with --prefix, and
// /usr/local/share/jupyter/kernels/NAME otherwise. NAME defaults to
// "loligo". Each file is written atomically. --print lists what would be
// written and writes nothing. It returns the exit status.
func InstallCommand(args []string, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("install", flag.ContinueOnError)
	fs.SetOutput(stderr)
	user := fs.Bool("user", false, "install for the current user")
	prefix := fs.String("prefix", "", "install under DIR/share/jupyter/kernels")
	name := fs.String("name", "loligo", "kernelspec name (letters, digits, . _ -)")
	display := fs.String("display-name", "Loligo", "name shown by front ends")
	mode := fs.String("interrupt-mode", "message", "how front ends interrupt: message or signal")
	dry := fs.Bool("print", false, "show what would be written; write nothing")
	if err := fs.Parse(args); err != nil {
		return 2
	}
	if err := checkInstallFlags(*user, *prefix, *name, *mode, fs.NArg()); err != nil {
		fmt.Fprintln(stderr, err)
		return 2
	}
	dir, err := specDir(*user, *prefix, *name)
	if err == nil {
		err = install(dir, *display, *mode, *dry, stdout)
	}
	if err != nil {
		fmt.Fprintln(stderr, err)
		return 1
	}
	return 0
}

func checkInstallFlags(user bool, prefix, name, mode string, extra int) error {
	switch {
	case user && prefix != "":
		return fmt.Errorf("kernel: --user and --prefix exclude each other; give one of them")
	case !validName.MatchString(name):
		return fmt.Errorf("kernel: --name %q may hold only letters, digits, '.', '_' and '-'", name)
	case mode != "message" && mode != "signal":
		return fmt.Errorf("kernel: unknown --interrupt-mode %q; use message or signal", mode)
	case extra > 0:
		return fmt.Errorf("kernel: install takes no arguments, only flags; see --help")
	}
	return nil
}

// specDir is the kernelspec directory for the chosen scope.
func specDir(user bool, prefix, name string) (string, error) {
	switch {
	case prefix != "":
		abs, err := filepath.Abs(prefix)
		if err != nil {
			return "", fmt.Errorf("kernel: bad --prefix %q: %v", prefix, err)
		}
		return filepath.Join(abs, "share", "jupyter", "kernels", name), nil
	case user:
		if d := os.Getenv("JUPYTER_DATA_DIR"); d != "" {
			return filepath.Join(d, "kernels", name), nil
		}
		home, err := os.UserHomeDir()
		if err != nil {
			return "", fmt.Errorf("kernel: no home directory for --user (%v); use --prefix DIR", err)
		}
		return filepath.Join(home, ".local", "share", "jupyter", "kernels", name), nil
	}
	return filepath.Join("/usr/local/share/jupyter/kernels", name), nil
}

// specFiles builds the files of a kernelspec, by name.
func specFiles(display, mode string) (map[string][]byte, error) {
	exe, err := os.Executable()
	if err == nil {
		exe, err = filepath.EvalSymlinks(exe)
	}
	if err != nil {
		return nil, fmt.Errorf("kernel: cannot find the running binary (%v); run loligo by its path", err)
	}
	if inBuildCache(exe) {
		return nil, fmt.Errorf("kernel: this binary (%s) is a temporary one from `go run` and will be deleted; build it first (go build -o loligo .) and run ./loligo install", exe)
	}
	argv := []string{exe, "kernel", "--connection-file", "{connection_file}"}
	if mode == "signal" {
		argv = append(argv, "--interrupt-mode", "signal")
	}
	spec := KernelSpec{Argv: argv, DisplayName: display, Language: "loligo", InterruptMode: mode,
		Metadata: map[string]any{"loligo": map[string]any{"research_use_only": true}}}
	js, err := json.MarshalIndent(spec, "", "  ")
	if err != nil {
		return nil, err
	}
	files := map[string][]byte{"kernel.json": append(js, '\n'), "logo-svg.svg": logoSVG()}
	for _, n := range []int{32, 64} {
		var b bytes.Buffer
		if err := logoPNG(&b, n); err != nil {
			return nil, fmt.Errorf("kernel: cannot draw the %dx%d logo: %v", n, n, err)
		}
		files[fmt.Sprintf("logo-%dx%d.png", n, n)] = b.Bytes()
	}
	return files, nil
}

func install(dir, display, mode string, dry bool, stdout io.Writer) error {
	files, err := specFiles(display, mode)
	if err != nil {
		return err
	}
	names := make([]string, 0, len(files))
	for n := range files {
		names = append(names, n)
	}
	sort.Strings(names)
	if dry {
		fmt.Fprintf(stdout, "would write kernelspec in %s:\n", dir)
		for _, n := range names {
			fmt.Fprintf(stdout, "  %s (%d bytes)\n", n, len(files[n]))
		}
		fmt.Fprintf(stdout, "kernel.json:\n%s", files["kernel.json"])
		return nil
	}
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return fmt.Errorf("kernel: cannot create %s: %v; try --user or --prefix DIR", dir, err)
	}
	for _, n := range names {
		if err := writeAtomic(filepath.Join(dir, n), files[n]); err != nil {
			return err
		}
	}
	fmt.Fprintf(stdout, "installed kernelspec %s in %s\n", filepath.Base(dir), dir)
	return nil
}

// writeAtomic writes data to a temporary file beside path and renames it
// into place, so a reader never sees a half-written file.
func writeAtomic(path string, data []byte) error {
	f, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return fmt.Errorf("kernel: cannot write %s: %v; check the directory is writable", path, err)
	}
	tmp := f.Name()
	_, err = f.Write(data)
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	if err == nil {
		err = os.Chmod(tmp, 0o644)
	}
	if err == nil {
		err = os.Rename(tmp, path)
	}
	if err != nil {
		os.Remove(tmp)
		return fmt.Errorf("kernel: cannot write %s: %v", path, err)
	}
	return nil
}

// inBuildCache reports whether exe is a binary that `go run` built in a
// temporary folder, which a kernelspec must not point at.
func inBuildCache(exe string) bool {
	dir := filepath.ToSlash(filepath.Dir(exe))
	return strings.Contains(dir, "/go-build") && strings.HasSuffix(dir, "/exe")
}
