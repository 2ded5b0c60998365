package handover

import (
	"fmt"
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
	var st workbook.Staging
	st.Signal, st.SignalRule = sp.Signal.String(), strings.ToUpper(sp.SignalWhy[:1])+sp.SignalWhy[1:]+"."
	// The values the text and the CSV show: the chosen signal's only, the
	// flows at the sequence's resolution.
	rows := sp.Tables()[0].Rows
	val := func(v any) float64 {
		if f, ok := v.(float64); ok {
			return f
		}
		return 0 // not this signal: a gap on the sheet
	}
	for i, t := range sp.Transitions {
		up, down := rows[2*i], rows[2*i+1]
		note := fmt.Sprintf("up set by %s; down set by %s", t.Up.Limit, t.Down.Limit)
		if t.Band != nil {
			note += fmt.Sprintf("; stages within %.1f %% of each other %s", 100*optimize.NearEqualTolerance, sp.BandWords(*t.Band))
		}
		st.Rows = append(st.Rows, workbook.StagingRow{From: sum(t.Lower), To: sum(t.Upper), Units: optimize.StartStop(p, t.Start, t.Stop),
			UpSpeed: val(up[4]), UpFlow: val(up[3]), UpDelay: t.Up.Delay.Minutes(),
			DownSpeed: val(down[4]), DownFlow: val(down[3]), DownDelay: t.Down.Delay.Minutes(), Note: note})
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
