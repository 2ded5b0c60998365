package study

import (
	"math"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
)

// groupPowerPoints is the number of plant flows on the group power chart.
const groupPowerPoints = 30

// groupPower runs every strategy on a grid of plant flows up to the design
// flow (untimed, so time-ordered strategies show the state they would settle
// in) for the chart of group input against plant flow.
func groupPower(p *plant.Plant, ks []Keyed) []PowerCurve {
	if p.DesignFlow <= 0 {
		return nil
	}
	grid := make([]optimize.Step, groupPowerPoints)
	for k := range grid {
		grid[k] = optimize.Step{Load: curves.Flow(float64(p.DesignFlow) * float64(k+1) / groupPowerPoints), Hours: 1, MeasuredKW: math.NaN()}
	}
	var out []PowerCurve
	for _, k := range ks {
		run := k.Strategy.Run(grid)
		c := PowerCurve{Key: k.Key, Name: run.Name}
		for i, st := range grid {
			c.Flow = append(c.Flow, st.Load)
			if run.Points[i].Status == optimize.Served {
				c.KW = append(c.KW, float64(run.Points[i].Power)/curves.KW)
			} else {
				c.KW = append(c.KW, math.NaN())
			}
		}
		out = append(out, c)
	}
	return out
}
