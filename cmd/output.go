package cmd

import (
	"errors"
	"fmt"
	"io"
	"path/filepath"
	"strings"

	"wattstage/workbook"
)

// checkOutputPath refuses, before any work is done, a workbook path that
// cannot take the workbook: -o given empty, a name not ending in .xlsx, an
// input file, a folder, a link to nothing, a device or pipe, a folder that
// does not exist, or an existing file without --force. Each is an input
// error (exit 2). A spreadsheet lock file beside the path is warned about
// on errw: the workbook is probably open.
func checkOutputPath(errw io.Writer, out string, given bool, input string, force bool) error {
	if out == "" {
		if given {
			return badInputf("-o: the workbook name is empty; give a file name such as plan.xlsx, or leave -o out")
		}
		return nil
	}
	if !strings.EqualFold(filepath.Ext(out), ".xlsx") {
		return badInputf("-o %s: the workbook name must end in .xlsx", out)
	}
	err := workbook.CheckPath(out, workbook.Options{Force: force, InputPaths: []string{input}})
	switch {
	case errors.Is(err, workbook.ErrExists):
		return badInputf("-o %s: the file exists; use --force to replace it", out)
	case errors.Is(err, workbook.ErrSameAsInput):
		return badInputf("-o %s: the output would overwrite the input file", out)
	case err != nil:
		return badInputf("-o %s: %s", out, strings.TrimPrefix(err.Error(), workbook.ErrBadPath.Error()+": "))
	}
	if lock := workbook.LockFile(out); lock != "" {
		fmt.Fprintf(errw, "wattstage: warning: %s is there: %s is probably open in a spreadsheet; close it, or the new workbook may not be written or may be overwritten when the spreadsheet saves\n", lock, out)
	}
	return nil
}
