package workbook

import (
	"bufio"
	"errors"
	"os"
	"os/exec"
	"os/signal"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// Faults of issue 15, class 5 and class 3: what an output path may be, the
// permissions a written workbook gets, and the temporary file of a write a
// signal stops.

func TestCheckPath(t *testing.T) {
	dir := t.TempDir()
	regular := filepath.Join(dir, "old.xlsx")
	writeEarlier(t, regular)
	input := filepath.Join(dir, "plant.yaml")
	writeEarlier(t, input)
	link := func(name, to string) string {
		p := filepath.Join(dir, name)
		if err := os.Symlink(to, p); err != nil {
			t.Fatal(err)
		}
		return p
	}
	dangling := link("dangling.xlsx", filepath.Join(dir, "nowhere.xlsx"))
	toDevice := link("device.xlsx", os.DevNull)
	toRegular := link("link.xlsx", regular)
	toInput := link("input.xlsx", input)
	fifo := filepath.Join(dir, "pipe.xlsx")
	if err := syscall.Mkfifo(fifo, 0o644); err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		name  string
		path  string
		force bool
		want  error  // nil: accepted
		says  string // in the message
	}{
		{"new file", filepath.Join(dir, "new.xlsx"), false, nil, ""},
		{"empty name", "", true, ErrBadPath, "no file name"},
		{"a folder", dir, true, ErrBadPath, "is a folder"},
		{"missing folder", filepath.Join(dir, "reports", "plan.xlsx"), true, ErrBadPath, "does not exist"},
		{"under a file", filepath.Join(regular, "plan.xlsx"), true, ErrBadPath, "is a file, not a folder"},
		{"dangling link", dangling, true, ErrBadPath, "which does not exist"},
		{"link to a device", toDevice, true, ErrBadPath, "character device"},
		{"the device itself", os.DevNull, true, ErrBadPath, "character device"},
		{"a named pipe", fifo, true, ErrBadPath, "named pipe"},
		{"existing without force", regular, false, ErrExists, "--force"},
		{"existing with force", regular, true, nil, ""},
		{"link to a regular file", toRegular, true, nil, ""},
		{"link to an input", toInput, true, ErrSameAsInput, "input"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			err := CheckPath(c.path, Options{Force: c.force, InputPaths: []string{input}})
			if c.want == nil {
				if err != nil {
					t.Fatalf("refused: %v", err)
				}
				return
			}
			if !errors.Is(err, c.want) || !strings.Contains(err.Error(), c.says) {
				t.Fatalf("err = %v, want %v saying %q", err, c.want, c.says)
			}
		})
	}
	// Nothing was created or changed by the checks.
	assertEarlierIntact(t, regular)
	if _, err := os.Stat(filepath.Join(dir, "reports")); !os.IsNotExist(err) {
		t.Error("the missing folder was created")
	}
}

// TestWriteThroughLinkToDevice: the fault of issue 15 — an output that is a
// link to a device was replaced by a regular file. It is now refused and
// the link is left as it was.
func TestWriteThroughLinkToDevice(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "plan.xlsx")
	if err := os.Symlink(os.DevNull, p); err != nil {
		t.Fatal(err)
	}
	err := Write(p, sampleReport(), Options{Force: true})
	if !errors.Is(err, ErrBadPath) {
		t.Fatalf("err = %v, want ErrBadPath", err)
	}
	if to, err := os.Readlink(p); err != nil || to != os.DevNull {
		t.Errorf("the link changed: %q, %v", to, err)
	}
	assertOnly(t, dir, "plan.xlsx")
}

// TestWriteThroughLinkToFile: a link to a regular file replaces the file
// it points to and stays a link.
func TestWriteThroughLinkToFile(t *testing.T) {
	dir := t.TempDir()
	real := filepath.Join(dir, "real.xlsx")
	writeEarlier(t, real)
	p := filepath.Join(dir, "plan.xlsx")
	if err := os.Symlink("real.xlsx", p); err != nil {
		t.Fatal(err)
	}
	if err := Write(p, sampleReport(), Options{Force: true}); err != nil {
		t.Fatal(err)
	}
	if fi, err := os.Lstat(p); err != nil || fi.Mode()&os.ModeSymlink == 0 {
		t.Fatalf("the link was replaced: %v %v", fi.Mode(), err)
	}
	if b, err := os.ReadFile(real); err != nil || !isZip(b) {
		t.Fatalf("the linked file was not replaced by a workbook (%v)", err)
	}
	assertOnly(t, dir, "plan.xlsx", "real.xlsx")
}

func isZip(b []byte) bool { return len(b) > 4 && string(b[:4]) == "PK\x03\x04" }

// TestWriteModes: a replaced file keeps its permissions; a new one gets
// 0666 less the umask (open(2): the mode is masked by the umask), not the
// 0600 of a temporary file nor a fixed 0644.
func TestWriteModes(t *testing.T) {
	old := syscall.Umask(0o027)
	defer syscall.Umask(old)
	dir := t.TempDir()
	fresh := filepath.Join(dir, "new.xlsx")
	if err := Write(fresh, sampleReport(), Options{}); err != nil {
		t.Fatal(err)
	}
	if fi, err := os.Stat(fresh); err != nil || fi.Mode().Perm() != 0o640 {
		t.Errorf("new workbook mode %v (%v), want 0640 = 0666 &^ umask 0027", fi.Mode().Perm(), err)
	}
	replaced := filepath.Join(dir, "old.xlsx")
	if err := os.WriteFile(replaced, earlier, 0o604); err != nil {
		t.Fatal(err)
	}
	if err := os.Chmod(replaced, 0o604); err != nil {
		t.Fatal(err)
	}
	if err := Write(replaced, sampleReport(), Options{Force: true}); err != nil {
		t.Fatal(err)
	}
	if fi, err := os.Stat(replaced); err != nil || fi.Mode().Perm() != 0o604 {
		t.Errorf("replaced workbook mode %v (%v), want the earlier file's 0604", fi.Mode().Perm(), err)
	}
}

// TestAbortWritesRemovesTemporaryFile: a process whose write is stopped by
// SIGTERM between the complete temporary file and the rename — as the
// command line handles it: AbortWrites, then exit — leaves neither a
// temporary file nor a changed workbook. The helper blocks before the
// rename, so the signal always lands there.
func TestAbortWritesRemovesTemporaryFile(t *testing.T) {
	for _, sig := range []syscall.Signal{syscall.SIGINT, syscall.SIGTERM} {
		t.Run(sig.String(), func(t *testing.T) {
			dir := t.TempDir()
			p := filepath.Join(dir, "plan.xlsx")
			writeEarlier(t, p)
			cmd := exec.Command(os.Args[0], "-test.run=^TestHelperAbortOnSignal$")
			cmd.Env = append(os.Environ(), "WORKBOOK_HELPER_ABORT="+p)
			stdout, err := cmd.StdoutPipe()
			if err != nil {
				t.Fatal(err)
			}
			if err := cmd.Start(); err != nil {
				t.Fatal(err)
			}
			ready := make(chan bool, 1)
			removed := make(chan string, 1)
			eof := make(chan struct{})
			go func() {
				defer close(eof)
				sc := bufio.NewScanner(stdout)
				for sc.Scan() {
					switch l := sc.Text(); {
					case l == "ready to rename":
						ready <- true
					case strings.HasPrefix(l, "removed "):
						removed <- strings.TrimPrefix(l, "removed ")
					}
				}
				close(removed)
			}()
			select {
			case <-ready:
			case <-time.After(60 * time.Second):
				_ = cmd.Process.Kill()
				_ = cmd.Wait()
				t.Fatal("helper did not reach the rename")
			}
			if err := cmd.Process.Signal(sig); err != nil {
				t.Fatal(err)
			}
			// Read the helper's output to its end before Wait, which closes
			// the pipe (exec.Cmd.StdoutPipe: reads must finish first).
			<-eof
			_ = cmd.Wait()
			if code := cmd.ProcessState.ExitCode(); code != 128+int(sig) {
				t.Errorf("helper exit %d, want %d", code, 128+int(sig))
			}
			if n, ok := <-removed; !ok || !strings.HasPrefix(filepath.Base(n), ".plan.xlsx.") {
				t.Errorf("helper did not report removing its temporary file (%q)", n)
			}
			assertEarlierIntact(t, p)
			assertOnly(t, dir, "plan.xlsx")
		})
	}
}

func TestHelperAbortOnSignal(t *testing.T) {
	p := os.Getenv("WORKBOOK_HELPER_ABORT")
	if p == "" {
		t.Skip("helper for TestAbortWritesRemovesTemporaryFile")
	}
	sigs := make(chan os.Signal, 1)
	signal.Notify(sigs, syscall.SIGINT, syscall.SIGTERM)
	go func() {
		s := <-sigs
		for _, n := range AbortWrites() {
			os.Stdout.WriteString("removed " + n + "\n")
		}
		os.Exit(128 + int(s.(syscall.Signal)))
	}()
	_ = write(p, sampleReport(), Options{Force: true}, hooks{beforeRename: func() error {
		os.Stdout.WriteString("ready to rename\n")
		select {} // wait for the signal
	}})
	t.Fatal("write returned")
}

// TestAbortedWriteDoesNotRename: a write still running when AbortWrites is
// called does not replace the workbook.
func TestAbortedWriteDoesNotRename(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "plan.xlsx")
	writeEarlier(t, p)
	defer func() {
		temps.mu.Lock()
		temps.aborted = false
		temps.mu.Unlock()
	}()
	err := write(p, sampleReport(), Options{Force: true}, hooks{beforeRename: func() error {
		if n := AbortWrites(); len(n) != 1 {
			t.Errorf("AbortWrites removed %v, want the one temporary file", n)
		}
		return nil
	}})
	if !errors.Is(err, ErrInterrupted) {
		t.Fatalf("err = %v, want ErrInterrupted", err)
	}
	assertEarlierIntact(t, p)
	assertOnly(t, dir, "plan.xlsx")
}

func TestLockFile(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "plan.xlsx")
	if got := LockFile(p); got != "" {
		t.Fatalf("lock file %q in an empty folder", got)
	}
	for _, name := range []string{"~$plan.xlsx", ".~lock.plan.xlsx#"} {
		lock := filepath.Join(dir, name)
		if err := os.WriteFile(lock, nil, 0o644); err != nil {
			t.Fatal(err)
		}
		if got := LockFile(p); got != lock {
			t.Errorf("LockFile = %q, want %q", got, lock)
		}
		_ = os.Remove(lock)
	}
}
