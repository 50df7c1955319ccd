// Package stdlib binds Loligo's numerical packages (stdlib/<domain>) to the
// modelling language: each file declares one domain's builtins (names,
// parameters, units, defaults, documentation and sources) and its value
// kinds, and how each is shown.
package stdlib

import "github.com/loligo-lab/loligo/runtime"

// Register adds every domain's builtins to reg.
func Register(reg *runtime.Registry) {
	for _, register := range domains {
		register(reg)
	}
}

// domains lists each domain's registration function; each binding file
// adds its own in an init function, so files can be added independently.
var domains []func(*runtime.Registry)
