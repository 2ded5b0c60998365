// Command wattstage finds the lowest-power staging of a parallel pump
// group and compares it with other ways of running the plant.
package main

import (
	"os"

	"wattstage/cmd"
)

func main() {
	cmd.LimitMemory()
	os.Exit(cmd.Main(os.Args[1:], os.Stdin, os.Stdout, os.Stderr))
}
