package handover

import (
	"fmt"
	"math"
	"strings"

	"wattstage/optimize"
	"wattstage/study"
	"wattstage/workbook"
)

// Staging returns the Staging sheet's content: the study's derived
// setpoints, as rows, settings and the sequence of operation.
func Staging(res *study.Result) workbook.Staging {
	sp, p := res.Setpoints, res.Plant
	if sp == nil {
		return workbook.Staging{Settings: []workbook.Quantity{{Label: "Setpoints", Text: "could not be derived: " + res.SetpointsError}}}
	}
	u := p.Units
	var st workbook.Staging
	speed := func(v float64) float64 {
		if math.IsNaN(v) {
			return math.NaN()
		}
		return 100 * v
	}
	for _, t := range sp.Transitions {
		st.Rows = append(st.Rows, workbook.StagingRow{From: sum(t.Lower), To: sum(t.Upper), Units: optimize.StartStop(p, t.Start, t.Stop),
			UpSpeed: speed(t.Up.Speed), UpFlow: u.FlowOut(t.Up.Flow), UpDelay: t.Up.Delay.Minutes(),
			DownSpeed: speed(t.Down.Speed), DownFlow: u.FlowOut(t.Down.Flow), DownDelay: t.Down.Delay.Minutes(),
			Note: fmt.Sprintf("up set by %s; down set by %s", t.Up.Limit, t.Down.Limit)})
	}
	o := sp.Options
	st.Settings = []workbook.Quantity{
		{Label: "Deadband (stage-down below stage-up)", Value: 100 * o.Deadband, Unit: "% of stage-up flow", Decimals: 0},
		{Label: "Speed margin", Value: 100 * o.SpeedMargin, Unit: "% of rated speed", Decimals: 0},
		{Label: "Capacity margin", Value: 100 * o.CapacityMargin, Unit: "% below running out", Decimals: 0},
		{Label: "Stage-up delay", Value: o.UpDelay.Minutes(), Unit: "min", Decimals: 0},
		{Label: "Stage-down delay", Value: o.DownDelay.Minutes(), Unit: "min", Decimals: 0},
		{Label: "Lead/lag rotation", Text: "rotate the lead unit of each model weekly or by run hours (common practice)"},
	}
	for _, para := range strings.Split(sp.SequenceOfOperation(), "\n\n") {
		if para = strings.Join(strings.Fields(para), " "); para != "" {
			st.Sequence = append(st.Sequence, para)
		}
	}
	return st
}

func sum(v []int) int {
	n := 0
	for _, x := range v {
		n += x
	}
	return n
}
