package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"os/signal"

	"github.com/loligo-lab/loligo/display"
	"github.com/loligo-lab/loligo/runtime"
	"github.com/loligo-lab/loligo/stdlib"
)

// runCommand is `loligo run FILE.loligo`: it evaluates the script in a
// fresh session, printing each shown value as text, and stops with exit
// status 1 at the first error.
func runCommand(args []string, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("run", flag.ContinueOnError)
	fs.SetOutput(stderr)
	if err := fs.Parse(args); err != nil {
		return 2
	}
	if fs.NArg() != 1 {
		fmt.Fprintln(stderr, "usage: loligo run FILE.loligo")
		return 2
	}
	path := fs.Arg(0)
	src, err := os.ReadFile(path)
	if err != nil {
		fmt.Fprintf(stderr, "loligo: %v\n", err)
		return 1
	}
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt)
	defer stop()
	s := newSession()
	out := &textOutput{stdout: stdout, stderr: stderr}
	if err := s.Run(ctx, path, string(src), out); err != nil {
		printError(stderr, err)
		return 1
	}
	return 0
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

// ProgressLine redraws one status line on stderr, where it does not mix
// with the results on stdout.
func (o *textOutput) ProgressLine(text string, final bool) {
	end := ""
	if final {
		end = "\n"
	}
	fmt.Fprintf(o.stderr, "\r\033[K%s%s", text, end)
}

func (o *textOutput) Stream(name, text string) {
	if name == "stderr" {
		fmt.Fprint(o.stderr, text)
		return
	}
	fmt.Fprint(o.stdout, text)
}
