package main

import "io"

// extraCommand runs the subcommands that come with the kernel.
func extraCommand(args []string, stdout, stderr io.Writer) (int, bool) {
	return 0, false
}
