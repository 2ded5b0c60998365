package cmd_test

import (
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"syscall"
	"testing"

	"wattstage/cmd"
)

// Issue 15, class 3: every output path and layout limit is checked before
// the work, exit 2; class 5: writes that fail are not quiet and leave no
// debris; class 6: control characters in names never reach the terminal.

// TestOutputPathCheckedBeforeWork: each unusable -o is refused with exit 2
// before anything is computed (stdout stays empty), names the problem, and
// leaves the folder as it was.
func TestOutputPathCheckedBeforeWork(t *testing.T) {
	dir := t.TempDir()
	copyExamples(t, dir)
	if err := os.Mkdir(filepath.Join(dir, "folder.xlsx"), 0o755); err != nil {
		t.Fatal(err)
	}
	if err := os.Symlink(filepath.Join(dir, "gone.xlsx"), filepath.Join(dir, "dangling.xlsx")); err != nil {
		t.Fatal(err)
	}
	if err := os.Symlink(os.DevNull, filepath.Join(dir, "device.xlsx")); err != nil {
		t.Fatal(err)
	}
	if err := syscall.Mkfifo(filepath.Join(dir, "pipe.xlsx"), 0o644); err != nil {
		t.Fatal(err)
	}
	plantPath := filepath.Join(dir, "condenser-water.yaml")
	before := listDir(t, dir)
	cases := []struct {
		name string
		args []string
		says string
	}{
		{"empty -o", []string{"-o", ""}, "the workbook name is empty"},
		{"empty --output=", []string{"--output="}, "the workbook name is empty"},
		{"a folder", []string{"-o", filepath.Join(dir, "folder.xlsx"), "--force"}, "is a folder"},
		{"a dangling link", []string{"-o", filepath.Join(dir, "dangling.xlsx"), "--force"}, "which does not exist"},
		{"a link to a device", []string{"-o", filepath.Join(dir, "device.xlsx"), "--force"}, "character device, not a regular file"},
		{"a named pipe", []string{"-o", filepath.Join(dir, "pipe.xlsx"), "--force"}, "named pipe"},
		{"a missing folder", []string{"-o", filepath.Join(dir, "reports", "plan.xlsx")}, "does not exist"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			args := append([]string{"plan", plantPath}, c.args...)
			r := run(t, args...)
			if r.code != cmd.ExitBadInput {
				t.Fatalf("%s", r.describe(args))
			}
			if r.out != "" {
				t.Errorf("the plan was computed and printed before the output path was refused")
			}
			if !strings.Contains(r.err, c.says) {
				t.Errorf("stderr does not say %q:\n%s", c.says, r.err)
			}
		})
	}
	if after := listDir(t, dir); strings.Join(after, ",") != strings.Join(before, ",") {
		t.Errorf("folder changed from %v to %v", before, after)
	}
	if to, err := os.Readlink(filepath.Join(dir, "device.xlsx")); err != nil || to != os.DevNull {
		t.Errorf("the link to the device changed: %q %v", to, err)
	}
}

// TestLockFileWarned: a spreadsheet's lock file beside the output is
// warned about before the work; the workbook is still written.
func TestLockFileWarned(t *testing.T) {
	dir := t.TempDir()
	copyExamples(t, dir)
	wb := filepath.Join(dir, "plan.xlsx")
	lock := filepath.Join(dir, ".~lock.plan.xlsx#")
	if err := os.WriteFile(lock, []byte("someone,host,2025\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	args := []string{"plan", filepath.Join(dir, "condenser-water.yaml"), "-o", wb}
	r := run(t, args...)
	if r.code != 0 {
		t.Fatalf("%s", r.describe(args))
	}
	if !strings.Contains(r.err, lock) || !strings.Contains(r.err, "probably open") {
		t.Errorf("stderr does not warn of the lock file:\n%s", r.err)
	}
	if !isWorkbook(t, wb) {
		t.Error("no workbook written")
	}
}

// fullWriter fails every write as a full device does.
type fullWriter struct{ writes int }

func (f *fullWriter) Write(p []byte) (int, error) { f.writes++; return 0, syscall.ENOSPC }

// TestStdoutWriteFailureIsAnError: the fault of issue 15 — output to a
// full device exited 0. Every command, text and JSON, now exits 1 and
// says why on stderr.
func TestStdoutWriteFailureIsAnError(t *testing.T) {
	for _, args := range [][]string{
		{"check", moduleRoot + "/examples/condenser-water.yaml"},
		{"plan", moduleRoot + "/examples/condenser-water.yaml"},
		{"plan", moduleRoot + "/examples/condenser-water.yaml", "--json"},
		{"point", moduleRoot + "/examples/condenser-water.yaml", "--flow", "2000"},
		{"setpoints", moduleRoot + "/examples/condenser-water.yaml"},
		{"bins", moduleRoot + "/examples/chilled-water-trend.csv"},
	} {
		t.Run(strings.Join(args, " "), func(t *testing.T) {
			var errw strings.Builder
			out := &fullWriter{}
			code := cmd.Main(args, strings.NewReader(""), out, &errw)
			if code != cmd.ExitFailure {
				t.Fatalf("exit %d, want %d\n%s", code, cmd.ExitFailure, errw.String())
			}
			if !strings.Contains(errw.String(), "writing standard output") || !strings.Contains(errw.String(), "no space left on device") {
				t.Errorf("stderr does not say the output failed:\n%s", errw.String())
			}
			if out.writes != 1 {
				t.Errorf("%d writes after the first failure, want none", out.writes-1)
			}
		})
	}
}

// TestStdoutFailureKeepsInputError: a bad plant file with a failing stdout
// still exits 2 with the loader's message.
func TestStdoutFailureKeepsInputError(t *testing.T) {
	var errw strings.Builder
	code := cmd.Main([]string{"check", filepath.Join(badPlantsDir, "three-mistakes.yaml")}, strings.NewReader(""), &fullWriter{}, &errw)
	if code != cmd.ExitBadInput || !strings.Contains(errw.String(), "servise_factor") {
		t.Fatalf("exit %d\n%s", code, errw.String())
	}
}

// controlName is a plant name carrying what a terminal acts on: an OSC
// title sequence ended by BEL, a colour escape, a NUL, DEL and a C1 CSI.
const controlName = "Pump\x1b]0;owned\x07 \x1b[31mred\x00 del\x7f csi\u009b2J"

// TestControlCharactersEscaped: the fault of issue 15 — control characters
// in names reached the terminal raw. No text output of any command carries
// a control character other than newline and tab, and JSON stays valid and
// keeps the name as it was written.
func TestControlCharactersEscaped(t *testing.T) {
	dir := t.TempDir()
	copyExamples(t, dir)
	src, err := os.ReadFile(filepath.Join(dir, "condenser-water.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	yamlName := yamlQuote(controlName)
	text := string(src)
	for _, key := range []string{"\nname: ", "  - name: "} {
		i := strings.Index(text, key)
		if i < 0 {
			t.Fatalf("condenser-water.yaml has no %q", key)
		}
		end := i + strings.Index(text[i+1:], "\n") + 1
		text = text[:i] + key + yamlName + text[end:]
	}
	if strings.Count(text, yamlName) != 2 {
		t.Fatalf("names not replaced")
	}
	plantPath := filepath.Join(dir, "control.yaml")
	if err := os.WriteFile(plantPath, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	for _, args := range [][]string{
		{"check", plantPath},
		{"plan", plantPath},
		{"point", plantPath, "--flow", "2000"},
		{"setpoints", plantPath},
	} {
		t.Run(args[0], func(t *testing.T) {
			r := run(t, args...)
			if r.code != 0 {
				t.Fatalf("%s", r.describe(args))
			}
			for _, s := range []string{r.out, r.err} {
				if i := strings.IndexFunc(s, isControl); i >= 0 {
					t.Fatalf("raw control character %q at byte %d: %q", s[i], i, s[max(0, i-30):min(len(s), i+30)])
				}
			}
			if !strings.Contains(r.out, `Pump\u001b]0;owned\u0007`) {
				t.Errorf("the name is not shown escaped:\n%s", r.out[:min(len(r.out), 400)])
			}
		})
	}
	r := run(t, "plan", plantPath, "--json")
	if r.code != 0 {
		t.Fatalf("%s", r.err)
	}
	var doc struct {
		Plant string `json:"plant"`
	}
	if err := json.Unmarshal([]byte(r.out), &doc); err != nil {
		t.Fatalf("JSON output invalid: %v", err)
	}
	if doc.Plant != controlName {
		t.Errorf("JSON name %q, want %q", doc.Plant, controlName)
	}
	if i := strings.IndexFunc(r.out, isControl); i >= 0 {
		t.Errorf("raw control character in JSON at byte %d", i)
	}
}

// isControl is a control character a terminal acts on: C0 but newline and
// tab, DEL, C1.
func isControl(r rune) bool {
	return r < 0x20 && r != '\n' && r != '\t' || r == 0x7f || r >= 0x80 && r <= 0x9f
}

// yamlQuote writes s as a YAML double-quoted scalar with every control
// character as a \xXX or \uXXXX escape (YAML 1.2 §5.7): a YAML stream
// may not hold them raw.
func yamlQuote(s string) string {
	var b strings.Builder
	b.WriteByte('"')
	for _, r := range s {
		switch {
		case isControl(r) && r < 0x80:
			fmt.Fprintf(&b, `\x%02x`, r)
		case isControl(r):
			fmt.Fprintf(&b, `\u%04x`, r)
		case r == '"' || r == '\\':
			b.WriteByte('\\')
			b.WriteRune(r)
		default:
			b.WriteRune(r)
		}
	}
	b.WriteByte('"')
	return b.String()
}

// nonFinite matches a NaN or an infinity as Go's fmt and strconv print them.
var nonFinite = regexp.MustCompile(`\bNaN\b|[+-]Inf\b|\bInf\b`)

// TestNoNonFiniteResults: issue 15, class 2 — nothing prints NaN or an
// infinity as a result, in text or JSON, for every shipped and test plant
// through every command.
func TestNoNonFiniteResults(t *testing.T) {
	var plants []string
	for _, g := range []string{"examples/*.yaml", "testdata/plants/*.yaml"} {
		m, err := filepath.Glob(filepath.Join(moduleRoot, g))
		if err != nil {
			t.Fatal(err)
		}
		plants = append(plants, m...)
	}
	if len(plants) < 5 {
		t.Fatalf("only %d plants found", len(plants))
	}
	for _, p := range plants {
		for _, args := range [][]string{
			{"check", p}, {"plan", p}, {"plan", p, "--json"}, {"setpoints", p}, {"setpoints", p, "--json"},
		} {
			r := run(t, args...)
			if r.code != 0 {
				t.Errorf("%s", r.describe(args))
				continue
			}
			if loc := nonFinite.FindStringIndex(r.out); loc != nil {
				t.Errorf("%v prints %q: …%s…", args, r.out[loc[0]:loc[1]], r.out[max(0, loc[0]-60):min(len(r.out), loc[1]+20)])
			}
		}
	}
}
