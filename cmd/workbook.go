package cmd

import (
	"errors"
	"fmt"
	"strings"
	"time"

	"wattstage/handover"
	"wattstage/study"
	"wattstage/workbook"
)

// writeWorkbook renders the study into the workbook and writes it atomically.
func writeWorkbook(path, input string, force bool, res *study.Result) error {
	rep, err := handover.Build(res)
	if err != nil {
		return err
	}
	rep.Date = time.Now().Format("2006-01-02")
	inputs := []string{input}
	if res.Trend != nil {
		inputs = append(inputs, res.Trend.Name)
	}
	err = workbook.Write(path, rep, workbook.Options{Force: force, InputPaths: inputs})
	switch {
	case errors.Is(err, workbook.ErrExists):
		return badInputf("-o %s: the file exists; use --force to replace it", path)
	case errors.Is(err, workbook.ErrSameAsInput):
		return badInputf("-o %s: the output would overwrite an input file", path)
	case errors.Is(err, workbook.ErrBadPath):
		return badInputf("-o %s: %s", path, strings.TrimPrefix(err.Error(), workbook.ErrBadPath.Error()+": "))
	case err != nil:
		return fmt.Errorf("writing the workbook %s: %w", path, err)
	}
	return nil
}
