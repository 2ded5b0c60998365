package cmd

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"wattstage/starter"
)

// InitOptions are the inputs of `wattstage init`.
type InitOptions struct {
	IO     *IO
	Units  string // US or SI
	System string // dp or fixed
	Output string // file to write; empty = standard output
	Force  bool   // replace an existing file
}

// NewCmdInit builds `wattstage init`.
func NewCmdInit(streams *IO, runF func(*InitOptions) error) *cobra.Command {
	opts := &InitOptions{IO: streams}
	c := &cobra.Command{
		Use:   "init [--units US|SI] [--system dp|fixed] [-o PLANT.yaml]",
		Short: "Write a commented starting plant file",
		Long: `Write a starting plant file: an invented plant of two equal pumps on
variable-speed drives, with a comment on every field saying what it means, its
unit and its default. It passes check and plan as written; replace each value
with your plant's and run check after each change. The full reference of the
format is docs/plant-file.md.

--units picks US (gpm, ft, hp, °F) or SI (m³/h, m, kW, °C); --system picks a
closed loop held at a remote differential-pressure sensor (dp) or a fixed
system curve of static head plus friction (fixed). Without -o the file goes to
standard output; -o refuses to replace an existing file unless --force is given.`,
		Example: `  wattstage init --units US --system dp
  wattstage init --units SI --system fixed -o towers.yaml`,
		Args: cobra.NoArgs,
		RunE: func(c *cobra.Command, args []string) error {
			if _, err := starter.ParseUnits(opts.Units); err != nil {
				return usageError{fmt.Errorf("--units %q: give US or SI", opts.Units)}
			}
			if _, err := starter.ParseSystem(opts.System); err != nil {
				return usageError{fmt.Errorf("--system %q: give dp (differential-pressure control) or fixed (static head plus friction)", opts.System)}
			}
			if runF != nil {
				return runF(opts)
			}
			return initRun(opts)
		},
	}
	f := c.Flags()
	f.StringVar(&opts.Units, "units", "US", "unit system of the file: US (gpm, ft, hp, °F) or SI (m³/h, m, kW, °C)")
	f.StringVar(&opts.System, "system", "dp", "system the pumps serve: dp (remote differential-pressure control) or fixed (static head plus friction)")
	f.StringVarP(&opts.Output, "output", "o", "", "write the plant file here instead of standard output")
	f.BoolVar(&opts.Force, "force", false, "replace the -o file if it exists")
	return c
}

func initRun(opts *InitOptions) error {
	u, _ := starter.ParseUnits(opts.Units)
	s, _ := starter.ParseSystem(opts.System)
	b, err := starter.Write(u, s)
	if err != nil {
		return err
	}
	if opts.Output == "" {
		_, err := opts.IO.Out.Write(b)
		return err
	}
	if err := writeNewFile(opts.Output, b, opts.Force); err != nil {
		return err
	}
	fmt.Fprintf(opts.IO.Err, "wrote %s (%s units, %s system); next: wattstage check %s\n", opts.Output, u, s, opts.Output)
	return nil
}

// writeNewFile writes b to path: refused when path exists (unless force),
// is a folder, or does not end in .yaml or .yml.
func writeNewFile(path string, b []byte, force bool) error {
	if ext := strings.ToLower(filepath.Ext(path)); ext != ".yaml" && ext != ".yml" {
		return badInputf("-o %q: a plant file name ends in .yaml or .yml", path)
	}
	flag := os.O_WRONLY | os.O_CREATE | os.O_EXCL
	if force {
		if st, err := os.Stat(path); err == nil && !st.Mode().IsRegular() {
			return badInputf("-o %s: not a regular file; not replaced", path)
		}
		flag = os.O_WRONLY | os.O_CREATE | os.O_TRUNC
	}
	f, err := os.OpenFile(path, flag, 0o666)
	switch {
	case errors.Is(err, os.ErrExist):
		return badInputf("-o %s: the file exists; use --force to replace it", path)
	case err != nil:
		return badInputf("-o %s: %v", path, describeErr(err))
	}
	if _, err := f.Write(b); err != nil {
		f.Close()
		return fmt.Errorf("-o %s: %w", path, err)
	}
	return f.Close()
}

// describeErr words an fs error without repeating the path.
func describeErr(err error) error {
	var pe *os.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	return err
}
