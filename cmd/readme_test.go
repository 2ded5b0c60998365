package cmd_test

import (
	"bufio"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"wattstage/cmd"
)

// readmeCommand is one command shown in the README.
type readmeCommand struct {
	line int
	args []string
}

// readmeCommands returns every line of an indented code block in the
// README that runs the CLI with `go run ./cmd/wattstage`, with its
// arguments and without a trailing # comment.
func readmeCommands(t *testing.T, path string) []readmeCommand {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	const prefix = "go run ./cmd/wattstage "
	var cmds []readmeCommand
	sc := bufio.NewScanner(f)
	for n := 1; sc.Scan(); n++ {
		line := sc.Text()
		if !strings.HasPrefix(line, "    ") && !strings.HasPrefix(line, "\t") {
			continue // not in an indented code block
		}
		code := strings.TrimSpace(line)
		if !strings.HasPrefix(code, prefix) {
			continue
		}
		if i := strings.Index(code, " #"); i >= 0 {
			code = code[:i]
		}
		cmds = append(cmds, readmeCommand{line: n, args: strings.Fields(strings.TrimPrefix(code, prefix))})
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	return cmds
}

// TestREADMECommands runs the README's commands through cmd.Main from the
// module root, as a reader would type them, with any workbook redirected
// into a temporary folder. Each must exit 0, print something, and write
// the workbook it asks for.
func TestREADMECommands(t *testing.T) {
	readme, err := filepath.Abs(filepath.Join(moduleRoot, "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	cmds := readmeCommands(t, readme)
	// The README shows the main job with a workbook and a tour of every
	// command; fewer lines means the parsing here broke, not the README.
	if len(cmds) < 5 {
		t.Fatalf("found %d wattstage commands in README.md; the parser no longer sees the code blocks", len(cmds))
	}
	seen := map[string]bool{}
	out := t.TempDir()
	t.Chdir(moduleRoot)
	for _, c := range cmds {
		args := append([]string(nil), c.args...)
		workbook := ""
		for i := 0; i+1 < len(args); i++ {
			if args[i] == "-o" || args[i] == "--output" {
				workbook = filepath.Join(out, filepath.Base(args[i+1]))
				args[i+1] = workbook
			}
		}
		seen[args[0]] = true
		t.Run(strings.Join(c.args, " "), func(t *testing.T) {
			r := run(t, args...)
			if r.code != 0 {
				t.Fatalf("README.md:%d: %s", c.line, r.describe(args))
			}
			if strings.TrimSpace(r.out) == "" {
				t.Errorf("README.md:%d: no output on stdout", c.line)
			}
			if workbook != "" && !isWorkbook(t, workbook) {
				t.Errorf("README.md:%d: no workbook at %s (stderr %q)", c.line, workbook, r.err)
			}
		})
	}
	for _, want := range []string{"check", "point", "plan", "setpoints", "bins"} {
		if !seen[want] {
			t.Errorf("README.md shows no %q command", want)
		}
	}
}

// TestHelpExamplesRun runs every example line of every command's help
// (the `Example:` text cobra prints under "Examples:") whose input file is
// shipped, from the module root, with any workbook redirected into a
// temporary folder. Each must exit 0.
func TestHelpExamplesRun(t *testing.T) {
	root := cmd.NewRootCmd(&cmd.IO{})
	out := t.TempDir()
	t.Chdir(moduleRoot)
	ran := 0
	for _, c := range root.Commands() {
		for _, line := range strings.Split(c.Example, "\n") {
			fields := strings.Fields(line)
			if len(fields) < 3 || fields[0] != "wattstage" {
				continue
			}
			args := append([]string(nil), fields[1:]...)
			if _, err := os.Stat(args[1]); err != nil {
				t.Logf("%s: %s is not shipped; not run", strings.TrimSpace(line), args[1])
				continue
			}
			workbook := ""
			for i := 0; i+1 < len(args); i++ {
				if args[i] == "-o" || args[i] == "--output" {
					workbook = filepath.Join(out, c.Name()+"-"+filepath.Base(args[i+1]))
					args[i+1] = workbook
				}
			}
			ran++
			t.Run(strings.Join(fields[1:], " "), func(t *testing.T) {
				r := run(t, args...)
				if r.code != 0 || strings.TrimSpace(r.out) == "" {
					t.Fatalf("%s", r.describe(args))
				}
				if workbook != "" && !isWorkbook(t, workbook) {
					t.Errorf("no workbook at %s", workbook)
				}
			})
		}
	}
	if ran < 5 {
		t.Errorf("ran %d help examples; every command should show at least one on a shipped file", ran)
	}
}
