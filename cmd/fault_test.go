package cmd_test

import (
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"wattstage/cmd"
)

// Faults of issue 7 that need no second process: the output cannot be
// created, the output exists, the output is an input, and the inputs are
// never modified. fault_linux_test.go has the disk-full, unwritable-folder
// and killed-while-writing cases, which run the command in a child process.

// TestOutputUnderAFile: the workbook's folder is a regular file, so no file
// can be made there. The run exits 2 before any work (issue 15: the check
// comes before the work), says so, and creates nothing.
func TestOutputUnderAFile(t *testing.T) {
	dir := t.TempDir()
	copyExamples(t, dir)
	plain := filepath.Join(dir, "notes.txt")
	if err := os.WriteFile(plain, []byte("a file, not a folder\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	before := listDir(t, dir)
	out := filepath.Join(plain, "plan.xlsx")
	args := []string{"plan", filepath.Join(dir, "chilled-water.yaml"), "-o", out}
	r := run(t, args...)
	if r.code != cmd.ExitBadInput || r.out != "" {
		t.Fatalf("%s", r.describe(args))
	}
	if !strings.Contains(r.err, out) || !strings.Contains(r.err, "is a file, not a folder") {
		t.Errorf("stderr does not say the folder of %s is not a folder:\n%s", out, r.err)
	}
	if got, err := os.ReadFile(plain); err != nil || string(got) != "a file, not a folder\n" {
		t.Errorf("the file standing in the way changed: %q, %v", got, err)
	}
	if after := listDir(t, dir); !slices.Equal(before, after) {
		t.Errorf("folder changed from %v to %v", before, after)
	}
}

// TestOutputFolderMissing: the workbook's folder does not exist. The run
// exits 2 before any work, names the folder, and does not create it.
func TestOutputFolderMissing(t *testing.T) {
	dir := t.TempDir()
	copyExamples(t, dir)
	missing := filepath.Join(dir, "reports")
	args := []string{"plan", filepath.Join(dir, "condenser-water.yaml"), "-o", filepath.Join(missing, "plan.xlsx")}
	r := run(t, args...)
	if r.code != cmd.ExitBadInput || r.out != "" {
		t.Fatalf("%s", r.describe(args))
	}
	if !strings.Contains(r.err, missing) || !strings.Contains(r.err, "does not exist") {
		t.Errorf("stderr does not name the missing folder:\n%s", r.err)
	}
	if _, err := os.Stat(missing); !os.IsNotExist(err) {
		t.Errorf("the folder %s was created (%v)", missing, err)
	}
}

// TestExistingWorkbookNeedsForce: a workbook already at the output path is
// refused without --force (exit 2, a hint naming --force, the file
// unchanged) and replaced with it. The second run is of another plant, so
// a replaced file would differ.
func TestExistingWorkbookNeedsForce(t *testing.T) {
	dir := t.TempDir()
	copyExamples(t, dir)
	wb := filepath.Join(dir, "plan.xlsx")
	first := []string{"plan", filepath.Join(dir, "condenser-water.yaml"), "-o", wb}
	if r := run(t, first...); r.code != 0 || r.err != "wrote "+wb+"\n" {
		t.Fatalf("%s", r.describe(first))
	}
	old := fileHash(t, wb)

	second := []string{"plan", filepath.Join(dir, "chilled-water.yaml"), "-o", wb}
	r := run(t, second...)
	if r.code != cmd.ExitBadInput {
		t.Fatalf("%s", r.describe(second))
	}
	if !strings.Contains(r.err, "--force") || !strings.Contains(r.err, wb) {
		t.Errorf("stderr gives no --force hint naming the file:\n%s", r.err)
	}
	if r.out != "" {
		t.Errorf("the refused run printed a plan: the check must come before the work")
	}
	if fileHash(t, wb) != old {
		t.Fatal("the existing workbook changed without --force")
	}

	forced := append(second, "--force")
	if r := run(t, forced...); r.code != 0 {
		t.Fatalf("%s", r.describe(forced))
	}
	if fileHash(t, wb) == old || !isWorkbook(t, wb) {
		t.Error("with --force the workbook was not replaced by the new plant's")
	}
	if left := listDir(t, dir); slices.ContainsFunc(left, func(n string) bool { return strings.HasSuffix(n, ".tmp") }) {
		t.Errorf("temporary files left behind: %v", left)
	}
}

// TestOutputIsAnInput: -o naming the plant file or the trend log is
// refused with exit 2 whatever the spelling and with --force, and the input
// is unchanged. The inputs are given .xlsx names so that the refusal is the
// same-file check, not the extension check.
func TestOutputIsAnInput(t *testing.T) {
	if testing.Short() {
		t.Skip("slow (runs plan on every example): run without -short")
	}
	dir := t.TempDir()
	copyExamples(t, dir)
	plantX := filepath.Join(dir, "plant.xlsx")
	copyFile(t, filepath.Join(dir, "condenser-water.yaml"), plantX)
	if err := os.Mkdir(filepath.Join(dir, "sub"), 0o755); err != nil {
		t.Fatal(err)
	}
	link := filepath.Join(dir, "link.xlsx")
	if err := os.Link(plantX, link); err != nil {
		t.Fatal(err)
	}
	sym := filepath.Join(dir, "sym.xlsx")
	if err := os.Symlink(plantX, sym); err != nil {
		t.Fatal(err)
	}
	// The trend plant reading its log from a file named like a workbook.
	trendX := filepath.Join(dir, "log.xlsx")
	copyFile(t, filepath.Join(dir, "chilled-water-trend.csv"), trendX)
	src, err := os.ReadFile(filepath.Join(dir, "chilled-water-trend.yaml"))
	if err != nil {
		t.Fatal(err)
	}
	trendPlantPath := filepath.Join(dir, "trend-plant.yaml")
	if err := os.WriteFile(trendPlantPath, []byte(strings.Replace(string(src), "file: chilled-water-trend.csv", "file: log.xlsx", 1)), 0o644); err != nil {
		t.Fatal(err)
	}

	cases := []struct {
		name  string
		args  []string
		input string
		why   string // in stderr
	}{
		{"same path", []string{"plan", plantX, "-o", plantX}, plantX, "overwrite"},
		{"same path, --force", []string{"plan", plantX, "-o", plantX, "--force"}, plantX, "overwrite"},
		{"other spelling", []string{"plan", plantX, "-o", filepath.Join(dir, "sub", "..", "plant.xlsx"), "--force"}, plantX, "overwrite"},
		{"hard link", []string{"plan", plantX, "-o", link, "--force"}, plantX, "overwrite"},
		{"symbolic link", []string{"plan", plantX, "-o", sym, "--force"}, plantX, "overwrite"},
		{"plant file by its own name", []string{"plan", filepath.Join(dir, "condenser-water.yaml"), "-o", filepath.Join(dir, "condenser-water.yaml"), "--force"},
			filepath.Join(dir, "condenser-water.yaml"), "must end in .xlsx"},
		{"trend log", []string{"plan", trendPlantPath, "-o", trendX, "--force"}, trendX, "overwrite"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			before := fileHash(t, c.input)
			r := run(t, c.args...)
			if r.code != cmd.ExitBadInput {
				t.Fatalf("%s", r.describe(c.args))
			}
			if !strings.Contains(r.err, c.why) {
				t.Errorf("stderr does not say %q:\n%s", c.why, r.err)
			}
			if fileHash(t, c.input) != before {
				t.Fatalf("the input %s changed", c.input)
			}
		})
	}
}

// TestInputsNeverModified runs every command, with every output form, on
// copies of the examples and checks that the plant files and the trend log
// are byte-for-byte what they were, with the same mode and time stamp.
func TestInputsNeverModified(t *testing.T) {
	if testing.Short() {
		t.Skip("slow (runs every command on every example): run without -short")
	}
	dir := t.TempDir()
	copyExamples(t, dir)
	inputs := listDir(t, dir)
	type snap struct {
		hash [32]byte
		info os.FileInfo
	}
	take := func() map[string]snap {
		m := map[string]snap{}
		for _, n := range inputs {
			p := filepath.Join(dir, n)
			fi, err := os.Stat(p)
			if err != nil {
				t.Fatal(err)
			}
			m[n] = snap{fileHash(t, p), fi}
		}
		return m
	}
	before := take()
	at := func(n string) string { return filepath.Join(dir, n) }
	var runs [][]string
	for _, c := range goldenCases {
		if !strings.HasPrefix(c.args[1], "examples/") {
			continue // only the examples are copied
		}
		args := append([]string(nil), c.args...)
		args[1] = at(filepath.Base(args[1]))
		runs = append(runs, args)
	}
	runs = append(runs,
		[]string{"plan", at("chilled-water.yaml"), "-o", at("cw.xlsx")},
		[]string{"plan", at("chilled-water.yaml"), "-o", at("cw.xlsx"), "--force", "--json"},
		[]string{"plan", at("chilled-water-trend.yaml"), "-o", at("trend.xlsx"), "--bin-width", "150", "--baseline", "current"},
		[]string{"setpoints", at("condenser-water.yaml"), "--json"},
		[]string{"point", at("chilled-water.yaml"), "--flow", "2400", "--json"},
		[]string{"bins", at("chilled-water-trend.csv"), "--plant", at("chilled-water-trend.yaml"), "--json"},
	)
	for _, args := range runs {
		if r := run(t, args...); r.code != 0 {
			t.Fatalf("%s", r.describe(args))
		}
	}
	after := take()
	for _, n := range inputs {
		b, a := before[n], after[n]
		if b.hash != a.hash {
			t.Errorf("%s: contents changed", n)
		}
		if b.info.Mode() != a.info.Mode() || !b.info.ModTime().Equal(a.info.ModTime()) {
			t.Errorf("%s: mode or modification time changed (%v %v → %v %v)", n, b.info.Mode(), b.info.ModTime(), a.info.Mode(), a.info.ModTime())
		}
	}
	want := append(append([]string(nil), inputs...), "cw.xlsx", "trend.xlsx")
	slices.Sort(want)
	if got := listDir(t, dir); !slices.Equal(got, want) {
		t.Errorf("folder holds %v, want the inputs and the two workbooks %v", got, want)
	}
}
