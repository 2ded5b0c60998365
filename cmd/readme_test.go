package cmd_test

import (
	"bufio"
	"os"
	"os/exec"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"wattstage/cmd"
)

// readmeCommand is one command shown in the README.
type readmeCommand struct {
	line int
	text string   // the line as written, without a trailing # comment
	args []string // the arguments after "wattstage"; nil for a go command
}

// readmeCommands returns every line of an indented code block in the
// README that runs wattstage (`wattstage ...`, or `go run ./cmd/wattstage
// ...`) or builds it (`go install`, `go build`), without a trailing #
// comment, in the order written.
func readmeCommands(t *testing.T, path string) []readmeCommand {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	var cmds []readmeCommand
	sc := bufio.NewScanner(f)
	for n := 1; sc.Scan(); n++ {
		line := sc.Text()
		if !strings.HasPrefix(line, "    ") && !strings.HasPrefix(line, "\t") {
			continue // not in an indented code block
		}
		code := strings.TrimSpace(line)
		if i := strings.Index(code, " #"); i >= 0 {
			code = strings.TrimSpace(code[:i])
		}
		c := readmeCommand{line: n, text: code}
		switch {
		case strings.HasPrefix(code, "wattstage "):
			c.args = strings.Fields(strings.TrimPrefix(code, "wattstage "))
		case strings.HasPrefix(code, "go run ./cmd/wattstage "):
			c.args = strings.Fields(strings.TrimPrefix(code, "go run ./cmd/wattstage "))
		case strings.HasPrefix(code, "go install ./cmd/wattstage"), strings.HasPrefix(code, "go build -o "):
		default:
			continue
		}
		cmds = append(cmds, c)
	}
	if err := sc.Err(); err != nil {
		t.Fatal(err)
	}
	return cmds
}

// readmeFolder makes a temporary folder holding the shipped examples under
// examples/, where the README's commands are run as a reader would run
// them in a clone, without writing into the clone.
func readmeFolder(t *testing.T) string {
	t.Helper()
	dir := t.TempDir()
	if err := os.Mkdir(filepath.Join(dir, "examples"), 0o755); err != nil {
		t.Fatal(err)
	}
	copyExamples(t, filepath.Join(dir, "examples"))
	return dir
}

// TestREADMECommands runs the README's wattstage commands in order through
// cmd.Main, in a folder holding the examples, as a reader would type them.
// Each must exit 0 and print something, write the file it asks for with
// -o, and a command with -o must exit 0 when run a second time (the README
// says its main command can be rerun).
func TestREADMECommands(t *testing.T) {
	readme, err := filepath.Abs(filepath.Join(moduleRoot, "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	cmds := readmeCommands(t, readme)
	// The README shows the install, the starting files, the main job and
	// a tour of every command; fewer lines means the parsing here broke.
	if len(cmds) < 20 {
		t.Fatalf("found %d wattstage commands in README.md; the parser no longer sees the code blocks", len(cmds))
	}
	seen := map[string]bool{}
	t.Chdir(readmeFolder(t))
	for _, c := range cmds {
		if c.args == nil {
			continue // go install and go build: TestREADMEInstall
		}
		seen[c.args[0]] = true
		t.Run(c.text, func(t *testing.T) {
			r := run(t, c.args...)
			if r.code != 0 {
				t.Fatalf("README.md:%d: %s", c.line, r.describe(c.args))
			}
			if strings.TrimSpace(r.out) == "" && outputOf(c.args) == "" {
				t.Errorf("README.md:%d: no output on stdout", c.line)
			}
			if o := outputOf(c.args); o != "" {
				if _, err := os.Stat(o); err != nil {
					t.Errorf("README.md:%d: no file at %s (stderr %q)", c.line, o, r.err)
				}
				if strings.HasSuffix(o, ".xlsx") && !isWorkbook(t, o) {
					t.Errorf("README.md:%d: %s is not a workbook", c.line, o)
				}
				if r := run(t, c.args...); r.code != 0 && slices.Contains(c.args, "--force") {
					t.Errorf("README.md:%d: run a second time: %s", c.line, r.describe(c.args))
				}
			}
		})
	}
	for _, want := range []string{"--version", "init", "check", "point", "plan", "setpoints", "bins"} {
		if !seen[want] {
			t.Errorf("README.md shows no %q command", want)
		}
	}
}

// outputOf returns the file a command writes with -o or --output, or "".
func outputOf(args []string) string {
	for i := 0; i+1 < len(args); i++ {
		if args[i] == "-o" || args[i] == "--output" {
			return args[i+1]
		}
	}
	return ""
}

// TestREADMEInstall runs the README's lines with the real toolchain and
// binary, as a new user would after cloning: `go install ./cmd/wattstage`
// (into a temporary GOBIN) and `go build -o`, then every wattstage line
// with the installed binary, in a folder holding the examples. Each must
// exit 0; --version must name the program, and the commit when the build
// recorded one.
func TestREADMEInstall(t *testing.T) {
	if testing.Short() {
		t.Skip("builds and installs the binary; run without -short")
	}
	goTool, err := exec.LookPath("go")
	if err != nil {
		t.Skip("no go command on PATH")
	}
	root, err := filepath.Abs(moduleRoot)
	if err != nil {
		t.Fatal(err)
	}
	cmds := readmeCommands(t, filepath.Join(root, "README.md"))
	bin := t.TempDir()
	work := readmeFolder(t)
	env := append(os.Environ(), "GOBIN="+bin, "PATH="+bin+string(os.PathListSeparator)+os.Getenv("PATH"))
	installed := false
	for _, c := range cmds {
		var cmd *exec.Cmd
		switch {
		case strings.HasPrefix(c.text, "go install"):
			cmd = exec.Command(goTool, strings.Fields(c.text)[1:]...)
			cmd.Dir = root
			installed = true
		case strings.HasPrefix(c.text, "go build -o "):
			f := strings.Fields(c.text)
			f[3] = filepath.Join(t.TempDir(), f[3]) // not into the clone
			cmd = exec.Command(goTool, f[1:]...)
			cmd.Dir = root
		default:
			if !installed {
				t.Fatalf("README.md:%d: %q comes before the go install line", c.line, c.text)
			}
			cmd = exec.Command(filepath.Join(bin, "wattstage"), c.args...)
			cmd.Dir = work
		}
		cmd.Env = env
		out, err := cmd.CombinedOutput()
		if err != nil {
			t.Errorf("README.md:%d: %s: %v\n%s", c.line, c.text, err, out)
			continue
		}
		if len(c.args) > 0 && c.args[0] == "--version" {
			checkVersionLine(t, root, string(out))
		}
	}
	if !installed {
		t.Error("README.md shows no go install line")
	}
}

// checkVersionLine checks what --version printed: the program's name, and
// the clone's HEAD commit when the build recorded a commit.
func checkVersionLine(t *testing.T, root, line string) {
	t.Helper()
	if !strings.HasPrefix(line, "wattstage ") {
		t.Errorf("--version printed %q", line)
	}
	if strings.Contains(line, "commit unknown") {
		t.Logf("--version: %s(the build recorded no commit: GOFLAGS=%q)", line, os.Getenv("GOFLAGS"))
		return
	}
	head, err := exec.Command("git", "-C", root, "rev-parse", "HEAD").Output()
	if err != nil {
		t.Logf("no git to compare the commit with: %v", err)
		return
	}
	if h := strings.TrimSpace(string(head)); len(h) >= 12 && !strings.Contains(line, h[:12]) {
		t.Errorf("--version %q does not name the clone's commit %s", line, h[:12])
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
