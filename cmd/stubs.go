package cmd

import (
	"fmt"

	"wattstage/optimize"
	"wattstage/plant"
)

// derivedStrategy returns the derived setpoint sequence as an extra
// strategy (wired in when setpoints land).
func derivedStrategy(p *plant.Plant) []optimize.Keyed { return nil }

func writeWorkbook(path, input string, force bool, in *planInput, pl *optimize.Plan) error {
	return fmt.Errorf("workbook writer not wired yet")
}
