package workbook

import (
	"archive/zip"
	"bufio"
	"bytes"
	"errors"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"

	"github.com/xuri/excelize/v2"
)

// earlier is the content of a workbook that existed before a test's write.
var earlier = []byte("an earlier workbook the user wants to keep")

func writeEarlier(t *testing.T, path string) {
	t.Helper()
	if err := os.WriteFile(path, earlier, 0o640); err != nil {
		t.Fatal(err)
	}
}

func assertEarlierIntact(t *testing.T, path string) {
	t.Helper()
	got, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("earlier workbook gone: %v", err)
	}
	if !bytes.Equal(got, earlier) {
		t.Fatalf("earlier workbook changed: %d bytes, starts %q", len(got), got[:min(len(got), 20)])
	}
}

// assertOnly checks that dir holds exactly the named files (no temporary
// file left behind).
func assertOnly(t *testing.T, dir string, names ...string) {
	t.Helper()
	entries, err := os.ReadDir(dir)
	if err != nil {
		t.Fatal(err)
	}
	var got []string
	for _, e := range entries {
		got = append(got, e.Name())
	}
	if strings.Join(got, ",") != strings.Join(names, ",") {
		t.Errorf("folder holds %q, want %q", got, names)
	}
}

func TestDeterministic(t *testing.T) {
	dir := t.TempDir()
	var first []byte
	// Map order in Go changes from one iteration to the next, so several
	// writes in one process expose any order taken from a map.
	for i := 0; i < 6; i++ {
		p := filepath.Join(dir, "plan.xlsx")
		if err := Write(p, sampleReport(), Options{Force: true}); err != nil {
			t.Fatal(err)
		}
		got, err := os.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		if i == 0 {
			first = got
			continue
		}
		if !bytes.Equal(got, first) {
			t.Fatalf("write %d differs from the first (%d vs %d bytes)", i, len(got), len(first))
		}
	}
	// And the bytes do not depend on the day: no part carries a time.
	zr, err := zip.NewReader(bytes.NewReader(first), int64(len(first)))
	if err != nil {
		t.Fatal(err)
	}
	today := time.Now().UTC().Format("2006-01-02")
	for _, f := range zr.File {
		if !f.Modified.Equal(zipTime) {
			t.Errorf("%s: modified %v, want the fixed %v", f.Name, f.Modified, zipTime)
		}
		rc, _ := f.Open()
		b, _ := io.ReadAll(rc)
		rc.Close()
		if bytes.Contains(b, []byte(today)) {
			t.Errorf("%s mentions today's date %s", f.Name, today)
		}
		if f.Name == "docProps/core.xml" && bytes.Count(b, []byte("2025-03-14T00:00:00Z")) != 2 {
			t.Errorf("core properties do not carry the report date as created and modified: %s", b)
		}
	}
	if zr.File[0].Name != contentTypesPart {
		t.Errorf("first part is %s, want %s", zr.File[0].Name, contentTypesPart)
	}
}

// TestDeterministicAcrossProcesses compares bytes written by two separate
// runs of the test binary, so per-process state (map seeds) cannot agree by
// luck.
func TestDeterministicAcrossProcesses(t *testing.T) {
	if os.Getenv("WORKBOOK_HELPER_WRITE") != "" {
		return
	}
	dir := t.TempDir()
	var outs [][]byte
	for i := 0; i < 2; i++ {
		p := filepath.Join(dir, "plan"+string(rune('a'+i))+".xlsx")
		cmd := exec.Command(os.Args[0], "-test.run=^TestHelperWrite$")
		cmd.Env = append(os.Environ(), "WORKBOOK_HELPER_WRITE="+p)
		if out, err := cmd.CombinedOutput(); err != nil {
			t.Fatalf("helper: %v\n%s", err, out)
		}
		b, err := os.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		outs = append(outs, b)
	}
	if !bytes.Equal(outs[0], outs[1]) {
		t.Fatalf("two processes wrote different bytes (%d vs %d)", len(outs[0]), len(outs[1]))
	}
}

func TestHelperWrite(t *testing.T) {
	p := os.Getenv("WORKBOOK_HELPER_WRITE")
	if p == "" {
		t.Skip("helper for TestDeterministicAcrossProcesses")
	}
	if err := Write(p, sampleReport(), Options{}); err != nil {
		t.Fatal(err)
	}
}

func TestContentTypesSorted(t *testing.T) {
	data, err := Bytes(sampleReport())
	if err != nil {
		t.Fatal(err)
	}
	zr, _ := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	rc, err := zr.Open(contentTypesPart)
	if err != nil {
		t.Fatal(err)
	}
	b, _ := io.ReadAll(rc)
	s := string(b)
	var last string
	for _, part := range strings.Split(s, "<Override PartName=\"")[1:] {
		name := part[:strings.IndexByte(part, '"')]
		if name < last {
			t.Errorf("override %s after %s", name, last)
		}
		last = name
	}
	for _, want := range []string{"/xl/charts/chart1.xml", "/xl/drawings/drawing1.xml", "/xl/worksheets/sheet7.xml"} {
		if !strings.Contains(s, want) {
			t.Errorf("content types lack %s", want)
		}
	}
}

func TestWriteRefusesExistingWithoutForce(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "plan.xlsx")
	writeEarlier(t, p)
	err := Write(p, sampleReport(), Options{})
	if !errors.Is(err, ErrExists) {
		t.Fatalf("err = %v, want ErrExists", err)
	}
	if !strings.Contains(err.Error(), "use --force") {
		t.Errorf("error %q does not say to use --force", err)
	}
	assertEarlierIntact(t, p)
	assertOnly(t, dir, "plan.xlsx")
}

func TestWriteForceReplacesAndKeepsMode(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "plan.xlsx")
	writeEarlier(t, p)
	if err := Write(p, sampleReport(), Options{Force: true}); err != nil {
		t.Fatal(err)
	}
	fi, err := os.Stat(p)
	if err != nil {
		t.Fatal(err)
	}
	if fi.Mode().Perm() != 0o640 {
		t.Errorf("mode %v, want the earlier file's 0640", fi.Mode().Perm())
	}
	f, err := excelize.OpenFile(p)
	if err != nil {
		t.Fatalf("replaced file does not open: %v", err)
	}
	defer f.Close()
	want := []string{sheetSummary, sheetEconomics, sheetStaging, sheetCurves, sheetLoadPoints, sheetInputs, sheetCurveData}
	if got := f.GetSheetList(); strings.Join(got, "|") != strings.Join(want, "|") {
		t.Errorf("sheets %q, want %q", got, want)
	}
	assertOnly(t, dir, "plan.xlsx")
}

func TestWriteRefusesInputPath(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "plant.yaml")
	writeEarlier(t, in)
	link := filepath.Join(dir, "link.xlsx")
	if err := os.Link(in, link); err != nil {
		t.Fatal(err)
	}
	sym := filepath.Join(dir, "sym.xlsx")
	if err := os.Symlink(in, sym); err != nil {
		t.Fatal(err)
	}
	cwd, _ := os.Getwd()
	t.Cleanup(func() { _ = os.Chdir(cwd) })
	if err := os.Chdir(dir); err != nil {
		t.Fatal(err)
	}
	for _, out := range []string{in, "plant.yaml", "./sub/../plant.yaml", link, sym} {
		t.Run(out, func(t *testing.T) {
			err := Write(out, sampleReport(), Options{Force: true, InputPaths: []string{in}})
			if !errors.Is(err, ErrSameAsInput) {
				t.Fatalf("err = %v, want ErrSameAsInput", err)
			}
			assertEarlierIntact(t, in)
		})
	}
}

func TestWriteRefusesFolder(t *testing.T) {
	dir := t.TempDir()
	err := Write(dir, sampleReport(), Options{Force: true})
	if err == nil || !strings.Contains(err.Error(), "is a folder") {
		t.Fatalf("err = %v, want a folder error", err)
	}
}

func TestWriteUnwritableFolder(t *testing.T) {
	dir := t.TempDir()
	notDir := filepath.Join(dir, "a-file")
	writeEarlier(t, notDir)
	// A missing folder, or a file where the folder should be, is refused
	// by the path check before any work (TestCheckPath); what is left is a
	// folder that exists but cannot be written in.
	cases := []struct {
		name, path, want string
	}{}
	if os.Geteuid() != 0 { // root writes through permission bits
		ro := filepath.Join(dir, "read-only")
		if err := os.Mkdir(ro, 0o555); err != nil {
			t.Fatal(err)
		}
		cases = append(cases, struct{ name, path, want string }{"read-only folder", filepath.Join(ro, "plan.xlsx"), "permission denied"})
	} else {
		t.Log("running as root: the read-only folder case cannot fail to write and is left out")
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			err := Write(c.path, sampleReport(), Options{})
			if err == nil {
				t.Fatal("write succeeded")
			}
			if !strings.Contains(err.Error(), "cannot write in folder") || !strings.Contains(err.Error(), c.want) {
				t.Errorf("err = %q, want it to say it cannot write in the folder and %q", err, c.want)
			}
		})
	}
}

// failingWriter accepts limit bytes, then fails as a full disk does.
type failingWriter struct {
	w     io.Writer
	limit int
	n     int
}

func (f *failingWriter) Write(p []byte) (int, error) {
	room := f.limit - f.n
	if room <= 0 {
		return 0, syscall.ENOSPC
	}
	if len(p) > room {
		n, _ := f.w.Write(p[:room])
		f.n += n
		return n, syscall.ENOSPC
	}
	n, err := f.w.Write(p)
	f.n += n
	return n, err
}

func TestWriteDiskFull(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "plan.xlsx")
	writeEarlier(t, p)
	err := write(p, sampleReport(), Options{Force: true}, hooks{
		wrap: func(w io.Writer) io.Writer { return &failingWriter{w: w, limit: 4096} },
	})
	if !errors.Is(err, syscall.ENOSPC) {
		t.Fatalf("err = %v, want ENOSPC", err)
	}
	if !strings.Contains(err.Error(), "no space left on device") || !strings.Contains(err.Error(), "untouched") {
		t.Errorf("err = %q, want the reason and that the earlier file is untouched", err)
	}
	assertEarlierIntact(t, p)
	assertOnly(t, dir, "plan.xlsx")
}

func TestWriteInterruptedBeforeRename(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "plan.xlsx")
	writeEarlier(t, p)
	err := write(p, sampleReport(), Options{Force: true}, hooks{
		beforeRename: func() error { return errors.New("signal: interrupt") },
	})
	if !errors.Is(err, ErrInterrupted) {
		t.Fatalf("err = %v, want ErrInterrupted", err)
	}
	if !strings.Contains(err.Error(), "signal: interrupt") || !strings.Contains(err.Error(), "untouched") {
		t.Errorf("err = %q, want the cause and that the earlier file is untouched", err)
	}
	assertEarlierIntact(t, p)
	assertOnly(t, dir, "plan.xlsx")
}

// TestWriteKilledBeforeRename kills a real process while its temporary file
// is complete but not yet renamed: the earlier workbook must survive.
func TestWriteKilledBeforeRename(t *testing.T) {
	if os.Getenv("WORKBOOK_HELPER_BLOCK") != "" {
		return
	}
	dir := t.TempDir()
	p := filepath.Join(dir, "plan.xlsx")
	writeEarlier(t, p)
	cmd := exec.Command(os.Args[0], "-test.run=^TestHelperBlockBeforeRename$")
	cmd.Env = append(os.Environ(), "WORKBOOK_HELPER_BLOCK="+p)
	stdout, err := cmd.StdoutPipe()
	if err != nil {
		t.Fatal(err)
	}
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	ready := make(chan bool, 1)
	go func() {
		sc := bufio.NewScanner(stdout)
		for sc.Scan() {
			if sc.Text() == "ready to rename" {
				ready <- true
				return
			}
		}
		ready <- false
	}()
	select {
	case ok := <-ready:
		if !ok {
			_ = cmd.Process.Kill()
			_ = cmd.Wait()
			t.Fatal("helper ended without reaching the rename")
		}
	case <-time.After(60 * time.Second):
		_ = cmd.Process.Kill()
		_ = cmd.Wait()
		t.Fatal("helper did not reach the rename")
	}
	if err := cmd.Process.Kill(); err != nil {
		t.Fatal(err)
	}
	_ = cmd.Wait()
	assertEarlierIntact(t, p)
	// A killed process cannot clean up: its complete temporary file stays,
	// hidden, beside the workbook.
	entries, _ := os.ReadDir(dir)
	var temps int
	for _, e := range entries {
		if strings.HasPrefix(e.Name(), ".plan.xlsx.") && strings.HasSuffix(e.Name(), ".tmp") {
			temps++
		}
	}
	if temps != 1 {
		t.Errorf("found %d temporary files, want the killed writer's one", temps)
	}
}

func TestHelperBlockBeforeRename(t *testing.T) {
	p := os.Getenv("WORKBOOK_HELPER_BLOCK")
	if p == "" {
		t.Skip("helper for TestWriteKilledBeforeRename")
	}
	_ = write(p, sampleReport(), Options{Force: true}, hooks{beforeRename: func() error {
		os.Stdout.WriteString("ready to rename\n")
		select {} // wait to be killed
	}})
	t.Fatal("write returned")
}

func TestWriteInvalidReportLeavesNothing(t *testing.T) {
	dir := t.TempDir()
	r := sampleReport()
	r.Strategies = nil
	if err := Write(filepath.Join(dir, "plan.xlsx"), r, Options{}); !errors.Is(err, ErrInvalidReport) {
		t.Fatalf("err = %v, want ErrInvalidReport", err)
	}
	assertOnly(t, dir)
}
