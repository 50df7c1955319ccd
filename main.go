// Command loligo is a notebook backend for neural modelling: a kernel for
// Jupyter front ends, and a runner for scripts and notebooks with no front
// end. See README.md.
package main

import (
	"fmt"
	"io"
	"os"
)

// version is the release of this build.
const version = "0.1.0"

func main() {
	os.Exit(dispatch(os.Args[1:], os.Stdout, os.Stderr))
}

const usage = `loligo — a notebook backend for neural modelling (research use only)

usage:
  loligo run FILE.loligo       run a script and print what it shows
  loligo kernel --connection-file FILE
                               serve a Jupyter front end (started by the front end)
  loligo install [--user | --prefix DIR] [--name NAME] [--display-name TEXT] [--print]
                               register the kernel with Jupyter
  loligo version               print the version
`

func dispatch(args []string, stdout, stderr io.Writer) int {
	if len(args) == 0 {
		fmt.Fprint(stderr, usage)
		return 2
	}
	switch args[0] {
	case "run":
		return runCommand(args[1:], stdout, stderr)
	case "version", "--version":
		fmt.Fprintf(stdout, "loligo %s\n", version)
		return 0
	case "help", "-h", "--help":
		fmt.Fprint(stdout, usage)
		return 0
	}
	if code, ok := extraCommand(args, stdout, stderr); ok {
		return code
	}
	fmt.Fprintf(stderr, "loligo: unknown command %q\n\n%s", args[0], usage)
	return 2
}
