package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"os/signal"
	"path/filepath"
	"strings"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/kernel/notebook"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/stdlib"
)

const runUsage = `usage: loligo run [-o OUT.ipynb] [--html REPORT.html] [--keep-going] FILE.loligo|FILE.ipynb

Runs a script or a notebook with no front end. What it shows is printed as
text; -o writes the executed notebook (never over its input), --html a
self-contained report. Exit status 1 at the first failing cell.
`

// runCommand is `loligo run`.
func runCommand(args []string, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("run", flag.ContinueOnError)
	fs.SetOutput(stderr)
	fs.Usage = func() { fmt.Fprint(stderr, runUsage) }
	out := fs.String("o", "", "write the executed notebook to this file")
	report := fs.String("html", "", "write a self-contained HTML report to this file")
	keepGoing := fs.Bool("keep-going", false, "run the remaining cells after a failing one")
	// Flags may come before or after the file name.
	var files []string
	for {
		if err := fs.Parse(args); err != nil {
			return 2
		}
		if fs.NArg() == 0 {
			break
		}
		files, args = append(files, fs.Arg(0)), fs.Args()[1:]
	}
	if len(files) != 1 {
		fs.Usage()
		return 2
	}
	path, err := inItsFolder(files[0], out, report)
	if err != nil {
		fmt.Fprintf(stderr, "loligo: %v\n", err)
		return 1
	}
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt)
	defer stop()
	if strings.HasSuffix(path, ".ipynb") || *out != "" || *report != "" {
		return runNotebook(ctx, path, *out, *report, *keepGoing, stdout, stderr)
	}
	return runScript(ctx, path, files[0], stdout, stderr)
}

// inItsFolder makes the run's working folder the folder of the script or
// notebook, so that the paths it reads and writes mean what they mean when a
// front end runs it (a kernel starts in its notebook's folder). The output
// paths given on the command line are made absolute first, so they keep
// meaning what the user typed. It returns the file's path from there.
func inItsFolder(file string, outputs ...*string) (string, error) {
	abs, err := filepath.Abs(file)
	if err != nil {
		return "", err
	}
	for _, o := range outputs {
		if *o != "" {
			if *o, err = filepath.Abs(*o); err != nil {
				return "", err
			}
		}
	}
	if err := os.Chdir(filepath.Dir(abs)); err != nil {
		return "", fmt.Errorf("cannot enter the folder of %s: %v", file, err)
	}
	return abs, nil
}

// runScript evaluates a script in a fresh session, printing each shown
// value as text.
// name is the file as the user wrote it, for error positions.
func runScript(ctx context.Context, path, name string, stdout, stderr io.Writer) int {
	src, err := os.ReadFile(path)
	if err != nil {
		fmt.Fprintf(stderr, "loligo: %v\n", err)
		return 1
	}
	out := &textOutput{stdout: stdout, stderr: stderr}
	if err := newSession().Run(ctx, name, string(src), out); err != nil {
		printError(stderr, err)
		return 1
	}
	return 0
}

// runNotebook executes a notebook (or a script made into one: cells split
// at "#--" lines) as a front end would, prints its outputs as text, and
// writes the executed notebook and the report when asked.
func runNotebook(ctx context.Context, path, out, report string, keepGoing bool, stdout, stderr io.Writer) int {
	nb, err := loadNotebook(path)
	if err != nil {
		fmt.Fprintf(stderr, "loligo: %v\n", err)
		return 1
	}
	if out != "" && sameFile(out, path) {
		fmt.Fprintf(stderr, "loligo: -o %s would overwrite the input; choose another name\n", out)
		return 2
	}
	ks := &kernelSession{s: newSession(), progress: stderr, showEach: strings.HasSuffix(path, ".loligo")}
	res := notebook.Execute(ctx, nb, ks, &notebook.Settings{KeepGoing: keepGoing})
	printNotebook(stdout, nb)
	code := 0
	if res.Err != nil {
		fmt.Fprintf(stderr, "loligo: cell %d of %s failed (its error names it by execution order):\n", res.Failed+1, filepath.Base(path))
		printError(stderr, res.Err)
		code = 1
	}
	if out != "" {
		if err := nb.WriteFile(out); err != nil {
			fmt.Fprintf(stderr, "loligo: %v\n", err)
			return 1
		}
	}
	if report != "" {
		note := fmt.Sprintf("Run with loligo %s from %s. Research use only; not for clinical or diagnostic use.", version, filepath.Base(path))
		title := strings.TrimSuffix(filepath.Base(path), filepath.Ext(path))
		err := notebook.WriteAtomic(report, func(w io.Writer) error { return notebook.Report(w, nb, title, note) })
		if err != nil {
			fmt.Fprintf(stderr, "loligo: %v\n", err)
			return 1
		}
	}
	return code
}

func loadNotebook(path string) (*notebook.Notebook, error) {
	if strings.HasSuffix(path, ".ipynb") {
		return notebook.ReadFile(path)
	}
	src, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	nb := notebook.New("loligo", "Loligo", "loligo", ".loligo")
	notebook.FromScript(string(src), nb)
	return nb, nil
}

func sameFile(a, b string) bool {
	sa, errA := os.Stat(a)
	sb, errB := os.Stat(b)
	if errA == nil && errB == nil {
		return os.SameFile(sa, sb)
	}
	return filepath.Clean(a) == filepath.Clean(b)
}

// printNotebook writes the text form of every output of every code cell.
func printNotebook(w io.Writer, nb *notebook.Notebook) {
	for _, c := range nb.Cells {
		for _, o := range c.Outputs {
			switch o.Type {
			case "stream":
				fmt.Fprint(w, string(o.Text))
			case "display_data", "execute_result":
				if t, ok := o.Data[display.MIMEText].(string); ok {
					fmt.Fprintln(w, t)
				}
			}
		}
	}
}

// newSession is a session with every builtin of the standard library.
func newSession() *runtime.Session {
	reg := runtime.NewRegistry()
	stdlib.Register(reg)
	return runtime.NewSession(reg)
}

func printError(w io.Writer, err error) {
	var re *runtime.Error
	if errors.As(err, &re) {
		fmt.Fprintln(w, re.Format())
		return
	}
	fmt.Fprintln(w, err)
}

// textOutput writes what a script shows to a terminal: the plain-text form
// of each output.
type textOutput struct {
	stdout, stderr io.Writer
}

func (o *textOutput) Display(b display.Bundle, id string, update bool) {
	if update {
		return // in-place updates (progress) make no sense in a log
	}
	fmt.Fprintln(o.stdout, b.PlainText())
}

// ProgressLine shows progress on stderr, where it does not mix with the
// results on stdout.
func (o *textOutput) ProgressLine(text string, final bool) { progressLine(o.stderr, text, final) }

// progressLine redraws one status line on a terminal; to a file or a pipe
// (a CI log) it writes only the final line, without control codes.
func progressLine(w io.Writer, text string, final bool) {
	switch {
	case isTerminal(w):
		end := ""
		if final {
			end = "\n"
		}
		fmt.Fprintf(w, "\r\033[K%s%s", text, end)
	case final:
		fmt.Fprintln(w, text)
	}
}

func isTerminal(w io.Writer) bool {
	f, ok := w.(*os.File)
	if !ok {
		return false
	}
	st, err := f.Stat()
	return err == nil && st.Mode()&os.ModeCharDevice != 0
}

func (o *textOutput) Stream(name, text string) {
	if name == "stderr" {
		fmt.Fprint(o.stderr, text)
		return
	}
	fmt.Fprint(o.stdout, text)
}
