package workbook

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
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
	// ErrInterrupted: the write was stopped before the new workbook
	// replaced the old one.
	ErrInterrupted = errors.New("workbook: interrupted")
)

// Write writes the workbook for r to path atomically: the bytes go to a
// temporary file in the same folder, which is synced and then renamed over
// path. A failed or interrupted run leaves any earlier file at path as it
// was. The same Report always gives the same bytes.
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

func write(path string, r *Report, opt Options, h hooks) error {
	if err := checkOutput(path, opt); err != nil {
		return err
	}
	data, err := Bytes(r)
	if err != nil {
		return err
	}
	dir, base := filepath.Split(path)
	if dir == "" {
		dir = "."
	}
	tmp, err := os.CreateTemp(dir, "."+base+".*.tmp")
	if err != nil {
		return fmt.Errorf("workbook: cannot write in folder %s: %w", dir, unwrapPath(err))
	}
	keep := false
	defer func() {
		if !keep {
			_ = tmp.Close()
			_ = os.Remove(tmp.Name())
		}
	}()
	var w io.Writer = tmp
	if h.wrap != nil {
		w = h.wrap(tmp)
	}
	if _, err := w.Write(data); err != nil {
		return fmt.Errorf("workbook: writing %s failed after the temporary file was started: %w; any earlier %s is untouched", path, err, base)
	}
	if err := tmp.Sync(); err != nil {
		return fmt.Errorf("workbook: writing %s: flushing to disk: %w; any earlier %s is untouched", path, err, base)
	}
	if err := tmp.Close(); err != nil {
		return fmt.Errorf("workbook: writing %s: closing: %w; any earlier %s is untouched", path, err, base)
	}
	mode := fs.FileMode(0o644)
	if fi, err := os.Stat(path); err == nil {
		mode = fi.Mode().Perm()
	}
	if err := os.Chmod(tmp.Name(), mode); err != nil {
		return fmt.Errorf("workbook: writing %s: %w", path, err)
	}
	if h.beforeRename != nil {
		if err := h.beforeRename(); err != nil {
			return fmt.Errorf("%w before %s was replaced (%v); any earlier %s is untouched", ErrInterrupted, path, err, base)
		}
	}
	// Check again: the file may have appeared while the workbook was built.
	if !opt.Force {
		if _, err := os.Lstat(path); err == nil {
			return existsError(path)
		}
	}
	if err := os.Rename(tmp.Name(), path); err != nil {
		return fmt.Errorf("workbook: replacing %s: %w; any earlier %s is untouched", path, unwrapPath(err), base)
	}
	keep = true
	syncDir(dir)
	return nil
}

// checkOutput refuses an output path that is an input file, a folder, or
// an existing file without Force.
func checkOutput(path string, opt Options) error {
	if path == "" {
		return errors.New("workbook: no output path")
	}
	abs, err := filepath.Abs(path)
	if err != nil {
		return fmt.Errorf("workbook: output path %s: %w", path, err)
	}
	out, statErr := os.Stat(path)
	for _, in := range opt.InputPaths {
		inAbs, err := filepath.Abs(in)
		if err == nil && inAbs == abs {
			return fmt.Errorf("%w: %s is also an input; choose another output name", ErrSameAsInput, path)
		}
		if statErr == nil {
			if fi, err := os.Stat(in); err == nil && os.SameFile(fi, out) {
				return fmt.Errorf("%w: %s is the same file as input %s; choose another output name", ErrSameAsInput, path, in)
			}
		}
	}
	if statErr == nil {
		if out.IsDir() {
			return fmt.Errorf("workbook: output path %s is a folder; give a file name such as %s", path, filepath.Join(path, "plan.xlsx"))
		}
		if !opt.Force {
			return existsError(path)
		}
	}
	return nil
}

func existsError(path string) error {
	return fmt.Errorf("%w: %s already exists; use --force to replace it", ErrExists, path)
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
