package officecheck

import (
	"context"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// convertTimeout bounds one soffice run; a first start on a cold machine
// takes a few seconds, a hung one is stopped.
const convertTimeout = 3 * time.Minute

// Soffice finds LibreOffice's soffice, version 7.4 or later, or skips the
// test; under CI (CI=true) a missing soffice fails it instead.
func Soffice(tb testing.TB) string {
	tb.Helper()
	if testing.Short() {
		tb.Skip("opens LibreOffice (seconds per file): run without -short")
	}
	path := Tool(tb, "soffice", "LibreOffice 7.4 or later (Debian: libreoffice-calc-nogui)")
	out, err := exec.Command(path, "--version").CombinedOutput()
	if err != nil {
		tb.Fatalf("soffice --version: %v\n%s", err, out)
	}
	// The CSV filter's sheet-number option needs LibreOffice 7.4.
	version := strings.TrimSpace(string(out))
	var major, minor int
	if _, err := fmt.Sscanf(strings.TrimPrefix(version, "LibreOffice "), "%d.%d", &major, &minor); err != nil || major < 7 || major == 7 && minor < 4 {
		tb.Fatalf("soffice --version says %q; the per-sheet CSV export needs LibreOffice 7.4 or later", version)
	}
	return path
}

// Tool finds the program name on the PATH, or skips the test saying to
// install pkg; under CI (CI=true) a missing program fails the test.
func Tool(tb testing.TB, name, pkg string) string {
	tb.Helper()
	path, err := exec.LookPath(name)
	if err == nil {
		return path
	}
	if os.Getenv("CI") == "true" {
		tb.Fatalf("%s not found and CI=true: install %s to run this check", name, pkg)
	}
	tb.Skipf("%s not found: install %s to run this check (under CI=true this fails)", name, pkg)
	return ""
}

// Recalc is LibreOffice's recalculation mode on load, as its registry
// stores it.
type Recalc int

const (
	RecalcAlways Recalc = 0 // recalculate every formula when a file is loaded
	RecalcNever  Recalc = 1 // show the values cached in the file
)

// profileXCU is the registry of a fresh LibreOffice user profile with the
// recalculation mode on load set for files saved by Excel and others
// (OOXML) and for ODF files.
const profileXCU = `<?xml version="1.0" encoding="UTF-8"?>
<oor:items xmlns:oor="http://openoffice.org/2001/registry" xmlns:xs="http://www.w3.org/2001/XMLSchema" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance">
<item oor:path="/org.openoffice.Office.Calc/Formula/Load"><prop oor:name="OOXMLRecalcMode" oor:op="fuse"><value>%[1]d</value></prop></item>
<item oor:path="/org.openoffice.Office.Calc/Formula/Load"><prop oor:name="ODFRecalcMode" oor:op="fuse"><value>%[1]d</value></prop></item>
</oor:items>
`

// Profile makes a LibreOffice user profile for this test, removed when it
// ends, and returns it as the file URL soffice's -env:UserInstallation
// takes. A profile of its own also keeps parallel tests' soffice runs
// apart.
func Profile(tb testing.TB, mode Recalc) string {
	tb.Helper()
	dir := tb.TempDir()
	if err := os.MkdirAll(filepath.Join(dir, "user"), 0o755); err != nil {
		tb.Fatal(err)
	}
	xcu := fmt.Sprintf(profileXCU, int(mode))
	if err := os.WriteFile(filepath.Join(dir, "user", "registrymodifications.xcu"), []byte(xcu), 0o644); err != nil {
		tb.Fatal(err)
	}
	return "file://" + dir
}

// run converts file to format with soffice headless into a fresh folder,
// returning the folder and soffice's output.
func run(tb testing.TB, soffice, profile, file, format string) (string, []byte) {
	tb.Helper()
	outDir := tb.TempDir()
	ctx, cancel := context.WithTimeout(context.Background(), convertTimeout)
	defer cancel()
	cmd := exec.CommandContext(ctx, soffice, "-env:UserInstallation="+profile, "--headless", "--norestore",
		"--convert-to", format, "--outdir", outDir, file)
	out, err := cmd.CombinedOutput()
	if err != nil {
		tb.Fatalf("soffice --convert-to %s %s: %v\n%s", format, file, err, out)
	}
	return outDir, out
}

// Convert converts file to format (e.g. "pdf") and returns the one file
// soffice produced, which must not be empty. soffice exits 0 even when it
// cannot read its input, so the output file is what proves success.
func Convert(tb testing.TB, soffice, profile, file, format string) string {
	tb.Helper()
	outDir, out := run(tb, soffice, profile, file, format)
	entries, _ := os.ReadDir(outDir)
	if len(entries) != 1 {
		tb.Fatalf("soffice --convert-to %s %s produced %d files, want 1; its output:\n%s", format, file, len(entries), out)
	}
	p := filepath.Join(outDir, entries[0].Name())
	if fi, err := os.Stat(p); err != nil || fi.Size() == 0 {
		tb.Fatalf("soffice --convert-to %s %s produced an empty file; its output:\n%s", format, file, out)
	}
	return p
}
