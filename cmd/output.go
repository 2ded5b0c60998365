package cmd

import (
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
)

// checkOutputPath refuses a workbook path that is an input, has the wrong
// extension, or exists without --force — before any work is done.
func checkOutputPath(out, input string, force bool) error {
	if out == "" {
		return nil
	}
	if !strings.EqualFold(filepath.Ext(out), ".xlsx") {
		return badInputf("-o %s: the workbook name must end in .xlsx", out)
	}
	if same(out, input) {
		return badInputf("-o %s: the output would overwrite the input file", out)
	}
	if _, err := os.Stat(out); err == nil && !force {
		return badInputf("-o %s: the file exists; use --force to replace it", out)
	} else if err != nil && !errors.Is(err, os.ErrNotExist) {
		dir := filepath.Dir(out)
		if st, derr := os.Stat(dir); derr == nil && !st.IsDir() {
			return fmt.Errorf("-o %s: %s is a file, not a folder: the workbook cannot be written there", out, dir)
		}
		return fmt.Errorf("-o %s: %w", out, err)
	}
	return nil
}

// same reports whether two paths name the same file.
func same(a, b string) bool {
	aa, err1 := filepath.Abs(a)
	bb, err2 := filepath.Abs(b)
	if err1 == nil && err2 == nil && aa == bb {
		return true
	}
	sa, err1 := os.Stat(a)
	sb, err2 := os.Stat(b)
	return err1 == nil && err2 == nil && os.SameFile(sa, sb)
}
