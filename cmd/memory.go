package cmd

import (
	"os"
	"runtime/debug"
)

// SoftMemoryLimit is the heap size the program asks the Go runtime to stay
// near, by collecting garbage sooner as the heap approaches it. It is a
// soft limit (runtime/debug.SetMemoryLimit): a plant or a trend whose
// solving needs more still gets it. Measured (DEVELOPERS.md, issue 13): a
// 1,000,000-row trend peaked at 424 MB without it and 318 MB with it, a
// 24-unit 6-model plant at 388 and 314 MB, at the same CPU time.
const SoftMemoryLimit = 300 << 20

// LimitMemory sets SoftMemoryLimit unless the environment sets GOMEMLIMIT,
// which the runtime has then read and which is left to rule.
func LimitMemory() {
	if _, set := os.LookupEnv("GOMEMLIMIT"); !set {
		debug.SetMemoryLimit(SoftMemoryLimit)
	}
}
