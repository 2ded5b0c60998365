package workbook

import (
	"crypto/rand"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"slices"
	"sync"
	"syscall"
)

// Options control how Write treats the output path.
type Options struct {
	// Force replaces an existing file at the output path. Default false: an
	// existing file is an error and is left alone.
	Force bool
	// InputPaths are the files the report was made from (plant file, trend
	// logs). The output may not be any of them, whatever Force says.
	InputPaths []string
}

var (
	// ErrExists: the output file exists and Options.Force is not set.
	ErrExists = errors.New("workbook: output file exists")
	// ErrSameAsInput: the output path names one of the input files.
	ErrSameAsInput = errors.New("workbook: output path is an input file")
	// ErrBadPath: the output path cannot take a workbook — empty, a folder,
	// a link to nothing, a device or other non-regular file, or in a folder
	// that does not exist. CheckPath finds these before any work is done.
	ErrBadPath = errors.New("workbook: output path")
	// ErrInterrupted: the write was stopped before the new workbook
	// replaced the old one.
	ErrInterrupted = errors.New("workbook: interrupted")
)

// Write writes the workbook for r to path atomically: the bytes go to a
// temporary file .NAME.RANDOM.tmp in the same folder, which is synced and
// then renamed over path. A failed or interrupted run leaves any earlier
// file at path as it was, and AbortWrites removes the temporary file of a
// write a signal stops. A replaced file keeps its permissions; a new one
// gets 0666 less the umask, as any file a program creates. When path is a
// symbolic link to a regular file, the file it points to is replaced and
// the link kept. The same Report always gives the same bytes.
func Write(path string, r *Report, opt Options) error {
	return write(path, r, opt, hooks{})
}

// WriteTo writes the workbook for r to w. It is the byte stream Write puts
// in its temporary file.
func WriteTo(w io.Writer, r *Report) error {
	data, err := Bytes(r)
	if err != nil {
		return err
	}
	_, err = w.Write(data)
	return err
}

// Bytes returns the workbook for r.
func Bytes(r *Report) ([]byte, error) {
	f, cells, err := build(r)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	return render(f, cells)
}

// hooks let the tests inject faults into Write; the zero value injects
// none.
type hooks struct {
	wrap         func(io.Writer) io.Writer // wraps the temporary file's writer
	beforeRename func() error              // runs once the temporary file is complete
}

// temps is the registry of temporary files being written, so that a signal
// handler can remove them (AbortWrites). Creating a temporary file and
// renaming it happen under mu, so a file is either renamed into place or
// removed, never left half-way.
var temps struct {
	mu      sync.Mutex
	names   []string
	aborted bool
}

// AbortWrites removes the temporary file of every Write in progress and
// makes every later Write fail with ErrInterrupted before it replaces
// anything. A command line calls it on SIGINT or SIGTERM before it exits,
// so that an interrupted run leaves no .NAME.*.tmp files behind. It
// returns the names removed.
func AbortWrites() []string {
	temps.mu.Lock()
	defer temps.mu.Unlock()
	temps.aborted = true
	var removed []string
	for _, n := range temps.names {
		if err := os.Remove(n); err == nil {
			removed = append(removed, n)
		}
	}
	temps.names = nil
	return removed
}

// createTemp creates .BASE.RANDOM.tmp in dir with mode 0666 less the umask
// and registers it.
func createTemp(dir, base string) (*os.File, error) {
	temps.mu.Lock()
	defer temps.mu.Unlock()
	if temps.aborted {
		return nil, fmt.Errorf("%w before the workbook was started", ErrInterrupted)
	}
	for range 100 {
		var b [6]byte
		_, _ = rand.Read(b[:])
		name := filepath.Join(dir, "."+base+"."+hex.EncodeToString(b[:])+".tmp")
		f, err := os.OpenFile(name, os.O_RDWR|os.O_CREATE|os.O_EXCL, 0o666)
		if errors.Is(err, fs.ErrExist) {
			continue
		}
		if err != nil {
			return nil, err
		}
		temps.names = append(temps.names, name)
		return f, nil
	}
	return nil, fmt.Errorf("no free temporary name in %s", dir)
}

// forget drops name from the registry and removes the file unless it was
// renamed.
func forget(name string, renamed bool) {
	temps.mu.Lock()
	defer temps.mu.Unlock()
	if i := slices.Index(temps.names, name); i >= 0 {
		temps.names = slices.Delete(temps.names, i, i+1)
		if !renamed {
			_ = os.Remove(name)
		}
	}
}

// renameTemp renames tmp over path unless the writes were aborted.
func renameTemp(tmp, path string) error {
	temps.mu.Lock()
	defer temps.mu.Unlock()
	if temps.aborted {
		return ErrInterrupted
	}
	return os.Rename(tmp, path)
}

func write(path string, r *Report, opt Options, h hooks) error {
	target, existing, err := checkOutput(path, opt)
	if err != nil {
		return err
	}
	data, err := Bytes(r)
	if err != nil {
		return err
	}
	dir, base := filepath.Split(target)
	if dir == "" {
		dir = "."
	}
	tmp, err := createTemp(dir, base)
	if err != nil {
		if errors.Is(err, ErrInterrupted) {
			return err
		}
		return fmt.Errorf("workbook: cannot write in folder %s: %w", dir, unwrapPath(err))
	}
	renamed := false
	defer func() {
		_ = tmp.Close()
		forget(tmp.Name(), renamed)
	}()
	var w io.Writer = tmp
	if h.wrap != nil {
		w = h.wrap(tmp)
	}
	if _, err := w.Write(data); err != nil {
		return fmt.Errorf("workbook: writing %s failed after the temporary file was started: %w; any earlier %s is untouched", path, err, base)
	}
	if existing != nil {
		// Keep the permissions of the file replaced; a new file keeps the
		// umask's, given when the temporary file was created.
		if err := tmp.Chmod(existing.Mode().Perm()); err != nil {
			return fmt.Errorf("workbook: writing %s: %w", path, err)
		}
	}
	if err := tmp.Sync(); err != nil {
		return fmt.Errorf("workbook: writing %s: flushing to disk: %w; any earlier %s is untouched", path, err, base)
	}
	if err := tmp.Close(); err != nil {
		return fmt.Errorf("workbook: writing %s: closing: %w; any earlier %s is untouched", path, err, base)
	}
	if h.beforeRename != nil {
		if err := h.beforeRename(); err != nil {
			return fmt.Errorf("%w before %s was replaced (%v); any earlier %s is untouched", ErrInterrupted, path, err, base)
		}
	}
	// Check again: the file may have appeared, or changed kind, while the
	// workbook was built.
	if fi, err := os.Lstat(target); err == nil {
		if !opt.Force {
			return existsError(path)
		}
		if !fi.Mode().IsRegular() {
			return notRegular(path, fi)
		}
	}
	if err := renameTemp(tmp.Name(), target); err != nil {
		if errors.Is(err, ErrInterrupted) {
			return fmt.Errorf("%w before %s was replaced; any earlier %s is untouched", ErrInterrupted, path, base)
		}
		return fmt.Errorf("workbook: replacing %s: %w; any earlier %s is untouched", path, unwrapPath(err), base)
	}
	renamed = true
	syncDir(dir)
	return nil
}

// CheckPath checks, before any work is done, that Write could put a
// workbook at path with these options: the path is not empty, is not an
// input, is not a folder, a device, a pipe or a link to nothing, its folder
// exists, and an existing file is replaced only with Force. Errors wrap
// ErrBadPath, ErrSameAsInput or ErrExists.
func CheckPath(path string, opt Options) error {
	_, _, err := checkOutput(path, opt)
	return err
}

// checkOutput checks path as CheckPath does and returns the file to
// replace — path itself, or the regular file a symbolic link at path
// points to — and, when that file exists, its info.
func checkOutput(path string, opt Options) (target string, existing fs.FileInfo, err error) {
	if path == "" {
		return "", nil, fmt.Errorf("%w: no file name given", ErrBadPath)
	}
	target = path
	li, lerr := os.Lstat(path)
	switch {
	case lerr == nil && li.Mode()&fs.ModeSymlink != 0:
		dest, err := filepath.EvalSymlinks(path)
		if err != nil {
			link, _ := os.Readlink(path)
			return "", nil, fmt.Errorf("%w: %s is a symbolic link to %s, which does not exist (%v); remove the link or give another name",
				ErrBadPath, path, link, unwrapPath(err))
		}
		target = dest
	case lerr != nil && !missing(lerr):
		return "", nil, fmt.Errorf("%w: %s: %w", ErrBadPath, path, unwrapPath(lerr))
	}
	if err := sameAsInput(path, target, opt.InputPaths); err != nil {
		return "", nil, err
	}
	fi, err := os.Stat(target)
	if err != nil {
		if !missing(err) {
			return "", nil, fmt.Errorf("%w: %s: %w", ErrBadPath, path, unwrapPath(err))
		}
		dir := filepath.Dir(target)
		switch st, derr := os.Stat(dir); {
		case derr != nil && errors.Is(derr, fs.ErrNotExist):
			return "", nil, fmt.Errorf("%w: the folder %s does not exist: create it first or give another folder", ErrBadPath, dir)
		case derr != nil:
			return "", nil, fmt.Errorf("%w: the folder %s: %w", ErrBadPath, dir, unwrapPath(derr))
		case !st.IsDir():
			return "", nil, fmt.Errorf("%w: %s is a file, not a folder: the workbook cannot be written there", ErrBadPath, dir)
		}
		return target, nil, nil
	}
	switch {
	case fi.IsDir():
		return "", nil, fmt.Errorf("%w: %s is a folder; give a file name such as %s", ErrBadPath, path, filepath.Join(path, "plan.xlsx"))
	case !fi.Mode().IsRegular():
		return "", nil, notRegular(path, fi)
	case !opt.Force:
		return "", nil, existsError(path)
	}
	return target, fi, nil
}

// missing reports whether err says the file is not there: it does not
// exist, or a folder on its path is a file.
func missing(err error) bool {
	return errors.Is(err, fs.ErrNotExist) || errors.Is(err, syscall.ENOTDIR)
}

// sameAsInput refuses an output that is one of the inputs, by name or as
// the same file (hard or symbolic link).
func sameAsInput(path, target string, inputs []string) error {
	out, statErr := os.Stat(target)
	for _, p := range []string{path, target} {
		abs, err := filepath.Abs(p)
		if err != nil {
			continue
		}
		for _, in := range inputs {
			if inAbs, err := filepath.Abs(in); err == nil && inAbs == abs {
				return fmt.Errorf("%w: %s is also an input; choose another output name", ErrSameAsInput, path)
			}
		}
	}
	if statErr == nil {
		for _, in := range inputs {
			if fi, err := os.Stat(in); err == nil && os.SameFile(fi, out) {
				return fmt.Errorf("%w: %s is the same file as input %s; choose another output name", ErrSameAsInput, path, in)
			}
		}
	}
	return nil
}

func notRegular(path string, fi fs.FileInfo) error {
	return fmt.Errorf("%w: %s is %s, not a regular file: it is not replaced; give another name", ErrBadPath, path, kindOf(fi.Mode()))
}

// kindOf names a file's type for a message.
func kindOf(m fs.FileMode) string {
	switch {
	case m&fs.ModeCharDevice != 0:
		return "a character device"
	case m&fs.ModeDevice != 0:
		return "a block device"
	case m&fs.ModeNamedPipe != 0:
		return "a named pipe (FIFO)"
	case m&fs.ModeSocket != 0:
		return "a socket"
	case m&fs.ModeSymlink != 0:
		return "a symbolic link"
	case m.IsDir():
		return "a folder"
	}
	return "a special file"
}

func existsError(path string) error {
	return fmt.Errorf("%w: %s already exists; use --force to replace it", ErrExists, path)
}

// LockFile returns the name of a spreadsheet's lock file beside path when
// one exists: the workbook is probably open, and replacing it may fail or
// be lost when the spreadsheet saves. Empty when there is none. The names
// are from memory: Microsoft Office's owner file ~$NAME (with the first
// two characters of a long NAME dropped) and LibreOffice's .~lock.NAME#.
func LockFile(path string) string {
	dir, base := filepath.Split(path)
	names := []string{"~$" + base, ".~lock." + base + "#"}
	if r := []rune(base); len(r) > 2 {
		names = append(names, "~$"+string(r[2:]))
	}
	for _, n := range names {
		if _, err := os.Lstat(filepath.Join(dir, n)); err == nil {
			return filepath.Join(dir, n)
		}
	}
	return ""
}

// unwrapPath drops the operation and path a *PathError repeats, keeping the
// reason ("permission denied").
func unwrapPath(err error) error {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		return pe.Err
	}
	var le *os.LinkError
	if errors.As(err, &le) {
		return le.Err
	}
	return err
}

// syncDir makes the rename durable where the system allows it; failure
// only weakens durability, so it is not reported.
func syncDir(dir string) {
	d, err := os.Open(dir)
	if err != nil {
		return
	}
	_ = d.Sync()
	_ = d.Close()
}
