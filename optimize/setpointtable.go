package optimize

import (
	"fmt"
	"io"
	"math"
	"strings"
	"text/tabwriter"

	"wattstage/plant"
)

// WriteTable writes the stages and the staging table of TextTables.
func (sp *Setpoints) WriteTable(w io.Writer) error {
	stages, changes := sp.TextTables()
	tw := tabwriter.NewWriter(w, 2, 8, 2, ' ', tabwriter.AlignRight)
	for i, rows := range [][][]string{stages, changes} {
		if i > 0 {
			fmt.Fprintln(tw)
		}
		for _, r := range rows {
			fmt.Fprintln(tw, strings.Join(r, "\t")+"\t")
		}
	}
	return tw.Flush()
}

// TextTables returns the cells of the stages and the staging table,
// header row first, from Tables, so the text shows the very values the
// CSV and JSON exports carry: each change on the chosen signal, the delay,
// the near-equal band and what sets the value. Units are in every header.
func (sp *Setpoints) TextTables() (stages, changes [][]string) {
	u := sp.Plant.Units
	fu := u.FlowUnit()
	tables := sp.Tables()
	stages = append(stages, []string{"stage", "runs", "from (" + fu + ")", "to (" + fu + ")", "speed (% rated)"})
	for i, st := range sp.Stages {
		r := tables[1].Rows[i]
		stages = append(stages, []string{fmt.Sprint(st.Number), fmt.Sprint(r[1]), sp.FlowText(r[2].(float64)), sp.FlowText(r[3].(float64)),
			speedRange(st.LowSpeed, st.HighSpeed)})
	}
	changes = append(changes, []string{"change", "signal", "flow (" + fu + ")", "speed (%)", "delay (min)", "near-equal band (" + fu + ")", "set by", "action"})
	for _, r := range tables[0].Rows {
		band := "–"
		if r[6] != nil {
			band = sp.bandCell(r[6].(float64), r[7].(float64))
		}
		flow := "–"
		if f, ok := r[3].(float64); ok {
			flow = sp.FlowText(f)
		}
		changes = append(changes, []string{fmt.Sprint(r[0]), fmt.Sprint(r[2]), flow, cellNum(r[4], 0), fmt.Sprintf("%.0f", r[5]), band, fmt.Sprint(r[8]), fmt.Sprint(r[1])})
	}
	return stages, changes
}

// cellNum writes a table value with thousands separators, "–" for none.
func cellNum(v any, dec int) string {
	if f, ok := v.(float64); ok {
		return thousands(f, dec)
	}
	return "–"
}

func pct(v float64) string {
	if math.IsNaN(v) {
		return "–"
	}
	return fmt.Sprintf("%.1f", 100*v)
}

func speedRange(lo, hi float64) string {
	switch {
	case math.IsNaN(lo) && math.IsNaN(hi):
		return "–"
	case math.IsNaN(lo):
		return pct(hi)
	case math.IsNaN(hi):
		return pct(lo)
	}
	return pct(lo) + "–" + pct(hi)
}

// StartStop writes "+1 × big −1 × small".
func StartStop(p *plant.Plant, start, stop []int) string {
	var parts []string
	for i, n := range start {
		if n > 0 {
			parts = append(parts, fmt.Sprintf("+%d × %s", n, p.Models[i].Name))
		}
	}
	for i, n := range stop {
		if n > 0 {
			parts = append(parts, fmt.Sprintf("−%d × %s", n, p.Models[i].Name))
		}
	}
	return strings.Join(parts, " ")
}
