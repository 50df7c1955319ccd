// Command testkernel serves the fakesession language over the Jupyter
// protocol, for the kernel's end-to-end tests:
//
//	testkernel kernel --connection-file F [flags]
//	testkernel install [flags]
package main

import (
	"fmt"
	"os"

	"github.com/loligo-lab/loligo/kernel"
	"github.com/loligo-lab/loligo/kernel/internal/fakesession"
)

func main() {
	if len(os.Args) < 2 {
		fmt.Fprintln(os.Stderr, "testkernel: want a subcommand, kernel or install")
		os.Exit(2)
	}
	switch os.Args[1] {
	case "kernel":
		os.Exit(kernel.ServeCommand(os.Args[2:], fakesession.New, "0.0.0-test", os.Stderr))
	case "install":
		os.Exit(kernel.InstallCommand(os.Args[2:], os.Stdout, os.Stderr))
	default:
		fmt.Fprintf(os.Stderr, "testkernel: unknown subcommand %q; use kernel or install\n", os.Args[1])
		os.Exit(2)
	}
}
