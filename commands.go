package main

import (
	"io"

	"github.com/loligo-lab/loligo/kernel"
)

// extraCommand runs the subcommands that come with the kernel.
func extraCommand(args []string, stdout, stderr io.Writer) (int, bool) {
	switch args[0] {
	case "kernel":
		return kernel.ServeCommand(args[1:], newKernelSession, version, stderr), true
	case "install":
		return kernel.InstallCommand(args[1:], stdout, stderr), true
	}
	return 0, false
}
