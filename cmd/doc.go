// Package cmd is the wattstage command line: it parses flags, loads the
// plant file, calls the plant, optimize and workbook packages, and writes
// what they return. It holds no physics.
//
// # Exit codes
//
//	0  success
//	1  internal failure (including a file that could not be written)
//	2  bad input: the list of problems is printed on stderr
package cmd
