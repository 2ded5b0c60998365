package cmd

import (
	"errors"
	"fmt"

	"wattstage/handover"
	"wattstage/optimize"
	"wattstage/workbook"
)

// writeWorkbook maps the plan into the workbook and writes it atomically.
func writeWorkbook(path, input string, force bool, in *planInput, pl *optimize.Plan) error {
	hi := handover.Input{Plant: in.plant, Plan: pl, Strategies: pl.Strategies, LoadSteps: pl.Steps,
		Staging: handover.Staging(in.plant)}
	if in.binned != nil && len(pl.Steps) != len(in.binned.Bins) {
		hi.LoadSteps = optimize.StepsFromBinned(in.binned)
		hi.LoadNote = fmt.Sprintf("Load points show the trend binned into %d bins of %s; the annual totals come from every interval (wattstage plan --json gives every interval). Strategies that stage in time order with delays and hysteresis (the current sequence, the derived setpoints) are shown at each bin as if the flow rose to it, so their bin kWh do not add up to their annual totals.",
			len(in.binned.Bins), in.plant.Units.FormatFlow(in.binned.Width))
	}
	rep, err := handover.Build(hi)
	if err != nil {
		return err
	}
	inputs := []string{input}
	if in.trend != nil {
		inputs = append(inputs, in.trend.Name)
	}
	err = workbook.Write(path, rep, workbook.Options{Force: force, InputPaths: inputs})
	switch {
	case errors.Is(err, workbook.ErrExists):
		return badInputf("-o %s: the file exists; use --force to replace it", path)
	case errors.Is(err, workbook.ErrSameAsInput):
		return badInputf("-o %s: the output would overwrite an input file", path)
	case err != nil:
		return fmt.Errorf("writing the workbook %s: %w", path, err)
	}
	return nil
}
