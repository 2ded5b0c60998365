package cmd

import (
	"wattstage/optimize"
	"wattstage/plant"
	"wattstage/workbook"
)

// derivedStrategy returns the derived setpoint sequence as an extra
// strategy (wired in when setpoints land).
func derivedStrategy(p *plant.Plant) []optimize.Keyed { return nil }

// stagingFor returns the staging sheet's content (wired in when setpoints land).
func stagingFor(p *plant.Plant) workbook.Staging { return workbook.Staging{} }
