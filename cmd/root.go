package cmd

import (
	"errors"
	"fmt"
	"io"
	"strings"

	"github.com/spf13/cobra"

	"wattstage/internal/version"
	"wattstage/plant"
	"wattstage/profile"
)

// Exit codes.
const (
	ExitOK       = 0
	ExitFailure  = 1
	ExitBadInput = 2
)

// IO carries the streams every command writes to.
type IO struct {
	In       io.Reader
	Out      io.Writer
	Err      io.Writer
	Terminal bool // stderr is a terminal: progress may be shown
}

// inputError marks an error caused by the user's input (exit code 2).
type inputError struct{ err error }

func (e inputError) Error() string { return e.err.Error() }
func (e inputError) Unwrap() error { return e.err }

// badInput wraps an error as an input error.
func badInput(err error) error { return inputError{err} }

// badInputf formats an input error.
func badInputf(format string, a ...any) error { return inputError{fmt.Errorf(format, a...)} }

// Main runs the command line and returns the exit code.
//
// Everything written to out and errw goes through a writer that escapes
// terminal control characters, and a failed write to out (a full device, a
// closed pipe) makes the exit code 1. SIGINT and SIGTERM remove the
// temporary file of a workbook being written before the process exits.
func Main(args []string, in io.Reader, out, errw io.Writer) int {
	terminal := isTerminal(errw)
	sout, serr := newSafeWriter(out, false), newSafeWriter(errw, true)
	defer serr.flush()
	stop := onSignal(serr)
	defer stop()
	streams := &IO{In: in, Out: sout, Err: serr, Terminal: terminal}
	root := NewRootCmd(streams)
	root.SetArgs(args)
	root.SetIn(in)
	root.SetOut(sout)
	root.SetErr(serr)
	code := exitCode(serr, root.Execute())
	if ferr := sout.flush(); ferr != nil {
		fmt.Fprintln(serr, "wattstage: writing standard output:", ferr)
		if code == ExitOK {
			code = ExitFailure
		}
	}
	return code
}

// exitCode reports err on errw and returns the exit code it means.
func exitCode(errw io.Writer, err error) int {
	if err == nil {
		return ExitOK
	}
	fmt.Fprintln(errw, "wattstage:", err)
	var ie inputError
	var pe *profile.ParseError
	switch {
	case errors.As(err, &ie), errors.Is(err, plant.ErrInvalid), errors.As(err, &pe):
		return ExitBadInput
	case isUsageError(err):
		return ExitBadInput
	}
	return ExitFailure
}

// NewRootCmd builds the command tree.
func NewRootCmd(streams *IO) *cobra.Command {
	var wide bool
	root := &cobra.Command{
		Use:   "wattstage",
		Short: "Lowest-power staging, setpoints and retrofit savings for parallel pump groups",
		Long: `wattstage reads a plant file describing a group of parallel centrifugal pumps
(curves, motors, drives), the system they serve, a load profile and a tariff. It
finds the lowest-power number of running units and their speeds at each load,
derives staging setpoints, compares annual energy and cost with other ways of
running the plant, prices a drive retrofit and writes a workbook to hand over.

Results are planning estimates: confirm minimum flows, minimum speeds, NPSH,
motor cooling at low speed and resonance with the manufacturers, and have a
licensed engineer approve any change to a sequence or a retrofit.`,
		SilenceUsage:  true,
		SilenceErrors: true,
		// --version: module version, commit and date from the build information.
		Version: version.String(),
	}
	root.SetVersionTemplate("{{.Version}}\n")
	root.PersistentFlags().BoolVar(&wide, "wide", false, "tables with one-line headers, as wide as they need (default: headers wrapped to fit 120 columns)")
	root.PersistentPreRun = func(*cobra.Command, []string) {
		if wide {
			streams.Out = wideWriter{Writer: streams.Out, wide: true}
		}
	}
	root.SetFlagErrorFunc(func(c *cobra.Command, err error) error { return usageError{err} })
	root.AddCommand(
		NewCmdInit(streams, nil),
		NewCmdCheck(streams, nil),
		NewCmdPoint(streams, nil),
		NewCmdPlan(streams, nil),
		NewCmdSetpoints(streams, nil),
		NewCmdBins(streams, nil),
	)
	return root
}

type usageError struct{ err error }

func (e usageError) Error() string { return e.err.Error() }

func isUsageError(err error) bool {
	var u usageError
	if errors.As(err, &u) {
		return true
	}
	// cobra's own argument errors
	msg := err.Error()
	for _, p := range []string{"unknown command", "accepts ", "requires at least", "unknown flag", "unknown shorthand"} {
		if strings.Contains(msg, p) {
			return true
		}
	}
	return false
}

// loadPlant loads a plant file, marking its errors as input errors.
func loadPlant(path string) (*plant.Plant, error) {
	p, err := plant.Load(path)
	if err != nil {
		if errors.Is(err, plant.ErrInvalid) {
			return nil, err
		}
		return nil, badInput(err)
	}
	return p, nil
}
