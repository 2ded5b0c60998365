//go:build linux

package cmd_test

import (
	"bytes"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"syscall"
	"testing"
	"time"

	"wattstage/cmd"
)

// Faults that need the command in a process of its own: a file-size limit
// standing in for a full disk, a folder the user may not write to, and a
// process killed while it writes. The child is this test binary started
// with childEnv set: TestMain then runs cmd.Main on its arguments, as the
// one-line main does, instead of the tests.

const (
	childEnv      = "WATTSTAGE_TEST_CHILD"       // "1": run the command line
	childFSizeEnv = "WATTSTAGE_TEST_CHILD_FSIZE" // bytes: RLIMIT_FSIZE for the child
)

func TestMain(m *testing.M) {
	if os.Getenv(childEnv) == "1" {
		if v := os.Getenv(childFSizeEnv); v != "" {
			n, err := strconv.ParseUint(v, 10, 64)
			if err == nil {
				// A write past the limit fails with EFBIG, as on a full
				// disk: the Go runtime ignores SIGXFSZ, so the process is
				// not killed (setrlimit(2), signal(7)).
				err = syscall.Setrlimit(syscall.RLIMIT_FSIZE, &syscall.Rlimit{Cur: n, Max: n})
			}
			if err != nil {
				os.Stderr.WriteString("child: file-size limit: " + err.Error() + "\n")
				os.Exit(99)
			}
		}
		os.Exit(cmd.Main(os.Args[1:], os.Stdin, os.Stdout, os.Stderr))
	}
	os.Exit(m.Run())
}

// child returns the command line run in a child process.
func child(t *testing.T, bin string, env []string, args ...string) *exec.Cmd {
	t.Helper()
	c := exec.Command(bin, args...)
	c.Env = append(append(os.Environ(), childEnv+"=1"), env...)
	c.Stdin = strings.NewReader("")
	return c
}

func runChild(t *testing.T, c *exec.Cmd) result {
	t.Helper()
	var out, errw bytes.Buffer
	c.Stdout, c.Stderr = &out, &errw
	err := c.Run()
	code := 0
	if ee, ok := err.(*exec.ExitError); ok {
		code = ee.ExitCode()
	} else if err != nil {
		t.Fatal(err)
	}
	if code == 99 {
		t.Fatalf("child setup failed: %s", errw.String())
	}
	return result{code: code, out: out.String(), err: errw.String()}
}

func testBinary(t *testing.T) string {
	t.Helper()
	bin, err := os.Executable()
	if err != nil {
		t.Fatal(err)
	}
	return bin
}

// noTempFiles fails if a workbook's temporary file was left in dir.
func noTempFiles(t *testing.T, dir string) {
	t.Helper()
	for _, n := range listDir(t, dir) {
		if strings.HasSuffix(n, ".tmp") {
			t.Errorf("temporary file %s left in %s", n, dir)
		}
	}
}

// TestDiskFullKeepsEarlierWorkbook: a workbook is written, then a run of
// another plant is asked to replace it (--force) but cannot write more than
// 8 KiB to any file — the replacement (tens of KiB) cannot be completed, as
// on a full disk. The run exits 1, says the write failed and that the
// earlier file is untouched, the earlier file is byte-identical and no
// temporary file is left.
func TestDiskFullKeepsEarlierWorkbook(t *testing.T) {
	dir := t.TempDir()
	copyExamples(t, dir)
	wb := filepath.Join(dir, "plan.xlsx")
	if r := run(t, "plan", filepath.Join(dir, "condenser-water.yaml"), "-o", wb); r.code != 0 {
		t.Fatalf("first run: exit %d: %s", r.code, r.err)
	}
	old := fileHash(t, wb)
	const limit = 8 << 10
	if fi, err := os.Stat(wb); err != nil || fi.Size() <= 2*limit {
		t.Fatalf("the workbook (%v) is too small for an %d-byte limit to stop its writing", err, limit)
	}

	args := []string{"plan", filepath.Join(dir, "chilled-water.yaml"), "-o", wb, "--force"}
	r := runChild(t, child(t, testBinary(t), []string{childFSizeEnv + "=" + strconv.Itoa(limit)}, args...))
	if r.code != cmd.ExitFailure {
		t.Fatalf("%s", r.describe(args))
	}
	for _, want := range []string{wb, "file too large", "untouched"} {
		if !strings.Contains(r.err, want) {
			t.Errorf("stderr does not say %q:\n%s", want, r.err)
		}
	}
	if fileHash(t, wb) != old {
		t.Fatal("the earlier workbook changed")
	}
	noTempFiles(t, dir)

	// The same run without the limit replaces it: the failure above was the
	// limit, and a replaced file would have shown.
	if r := runChild(t, child(t, testBinary(t), nil, args...)); r.code != 0 {
		t.Fatalf("%s", r.describe(args))
	}
	if fileHash(t, wb) == old {
		t.Error("without the limit the workbook was not replaced")
	}
}

// TestUnwritableFolderKeepsEarlierWorkbook: the workbook's folder is made
// read-only (mode 0555) after a first workbook was written into it; a second
// run with --force cannot create its temporary file there. It exits 1, says
// permission was denied, and the earlier file is byte-identical.
//
// Root ignores folder permissions (capabilities(7), CAP_DAC_OVERRIDE), so
// under root the second run is a child process running as the unprivileged
// user nobody (uid/gid 65534), with the test binary and the plant copied
// where that user can read them.
func TestUnwritableFolderKeepsEarlierWorkbook(t *testing.T) {
	base, err := os.MkdirTemp("", "wattstage-unwritable-")
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() {
		_ = os.Chmod(filepath.Join(base, "out"), 0o755)
		_ = os.RemoveAll(base)
	})
	if err := os.Chmod(base, 0o755); err != nil {
		t.Fatal(err)
	}
	copyExamples(t, base)
	out := filepath.Join(base, "out")
	if err := os.Mkdir(out, 0o755); err != nil {
		t.Fatal(err)
	}
	wb := filepath.Join(out, "plan.xlsx")
	if r := run(t, "plan", filepath.Join(base, "condenser-water.yaml"), "-o", wb); r.code != 0 {
		t.Fatalf("first run: exit %d: %s", r.code, r.err)
	}
	old := fileHash(t, wb)
	if err := os.Chmod(out, 0o555); err != nil {
		t.Fatal(err)
	}

	args := []string{"plan", filepath.Join(base, "chilled-water.yaml"), "-o", wb, "--force"}
	var r result
	if os.Geteuid() != 0 {
		r = run(t, args...)
	} else {
		bin := filepath.Join(base, "wattstage.test")
		src, err := os.Open(testBinary(t))
		if err != nil {
			t.Fatal(err)
		}
		dst, err := os.OpenFile(bin, os.O_CREATE|os.O_WRONLY|os.O_TRUNC, 0o755)
		if err != nil {
			t.Fatal(err)
		}
		_, err = io.Copy(dst, src)
		src.Close()
		if cerr := dst.Close(); err != nil || cerr != nil {
			t.Fatal(err, cerr)
		}
		c := child(t, bin, nil, args...)
		c.Dir = base
		c.SysProcAttr = &syscall.SysProcAttr{Credential: &syscall.Credential{Uid: 65534, Gid: 65534}}
		r = runChild(t, c)
	}
	if r.code != cmd.ExitFailure {
		t.Fatalf("%s", r.describe(args))
	}
	for _, want := range []string{out, "permission denied"} {
		if !strings.Contains(r.err, want) {
			t.Errorf("stderr does not say %q:\n%s", want, r.err)
		}
	}
	if fileHash(t, wb) != old {
		t.Fatal("the earlier workbook changed")
	}
	noTempFiles(t, out)
}

// TestKilledWhileWritingKeepsAWholeWorkbook: a run replacing a workbook
// (--force) is killed (SIGKILL: no clean-up runs) as soon as its temporary
// file appears. Whatever the moment, the file at the output path must be
// whole: the earlier workbook byte for byte, or — had the rename already
// happened — the new one byte for byte. A writer that truncated the old
// file first would leave neither.
//
// Whether the kill lands inside the write depends on timing; the test tries
// a few times and logs how often it did.
func TestKilledWhileWritingKeepsAWholeWorkbook(t *testing.T) {
	dir := t.TempDir()
	copyExamples(t, dir)
	wb := filepath.Join(dir, "plan.xlsx")
	newPlant := filepath.Join(dir, "chilled-water.yaml")
	// The new workbook as a completed run writes it (writing is deterministic).
	ref := filepath.Join(dir, "reference.xlsx")
	if r := run(t, "plan", newPlant, "-o", ref); r.code != 0 {
		t.Fatalf("reference run: %s", r.err)
	}
	want := fileHash(t, ref)

	const tries = 5
	landed := 0
	for try := 0; try < tries; try++ {
		_ = os.Remove(wb)
		if r := run(t, "plan", filepath.Join(dir, "condenser-water.yaml"), "-o", wb); r.code != 0 {
			t.Fatalf("first run: %s", r.err)
		}
		old := fileHash(t, wb)
		c := child(t, testBinary(t), nil, "plan", newPlant, "-o", wb, "--force")
		c.Stdout, c.Stderr = io.Discard, io.Discard
		if err := c.Start(); err != nil {
			t.Fatal(err)
		}
		done := make(chan struct{})
		go func() { _ = c.Wait(); close(done) }()
		sawTemp := waitForTemp(dir, "."+filepath.Base(wb)+".", done)
		_ = c.Process.Kill()
		<-done
		switch got := fileHash(t, wb); {
		case got == old:
			if sawTemp {
				landed++
			}
		case got == want:
			t.Logf("try %d: the kill came after the rename; the new workbook is whole", try+1)
		default:
			t.Fatalf("try %d: the workbook at %s is neither the earlier nor the new one", try+1, wb)
		}
		// A killed run cannot remove its temporary file; it is never the
		// workbook and a later run ignores it.
		for _, n := range listDir(t, dir) {
			if strings.HasSuffix(n, ".tmp") {
				_ = os.Remove(filepath.Join(dir, n))
			}
		}
	}
	t.Logf("%d of %d kills landed while the temporary file existed; the earlier workbook was intact each time", landed, tries)
}

// waitForTemp polls dir until a file name starting with prefix and ending
// in .tmp appears, or the child is done.
func waitForTemp(dir, prefix string, done <-chan struct{}) bool {
	for {
		select {
		case <-done:
			return false
		default:
		}
		es, err := os.ReadDir(dir)
		if err == nil {
			for _, e := range es {
				if strings.HasPrefix(e.Name(), prefix) && strings.HasSuffix(e.Name(), ".tmp") {
					return true
				}
			}
		}
		time.Sleep(20 * time.Microsecond)
	}
}
