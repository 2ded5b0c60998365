package cmd

import (
	"math"
	"os"
	"runtime/debug"
	"testing"
)

// LimitMemory sets the soft limit, and leaves a GOMEMLIMIT the user gave.
func TestLimitMemoryLeavesGOMEMLIMIT(t *testing.T) {
	before := debug.SetMemoryLimit(-1)
	defer debug.SetMemoryLimit(before)

	debug.SetMemoryLimit(math.MaxInt64)
	t.Setenv("GOMEMLIMIT", "1GiB")
	LimitMemory()
	if got := debug.SetMemoryLimit(-1); got != math.MaxInt64 {
		t.Errorf("with GOMEMLIMIT set the limit became %d", got)
	}
}

func TestLimitMemorySetsTheSoftLimit(t *testing.T) {
	before := debug.SetMemoryLimit(-1)
	defer debug.SetMemoryLimit(before)
	t.Setenv("GOMEMLIMIT", "") // registers the restore of the variable
	if err := os.Unsetenv("GOMEMLIMIT"); err != nil {
		t.Fatal(err)
	}
	debug.SetMemoryLimit(math.MaxInt64)
	LimitMemory()
	if got := debug.SetMemoryLimit(-1); got != SoftMemoryLimit {
		t.Errorf("limit %d, want %d", got, SoftMemoryLimit)
	}
}
