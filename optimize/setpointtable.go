package optimize

import (
	"fmt"
	"io"
	"math"
	"strings"
	"text/tabwriter"

	"wattstage/plant"
)

// WriteTable writes the staging table: the stages, then each change with
// its stage-up and stage-down values in flow and speed terms, the delays
// and the limit that sets each value. Units are in every header.
func (sp *Setpoints) WriteTable(w io.Writer) error {
	stages, changes := sp.Tables()
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

// Tables returns the cells of the staging table, header row first: the
// stages, and the changes with their stage-up and stage-down values, so
// that a report can lay them out its own way.
func (sp *Setpoints) Tables() (stages, changes [][]string) {
	u := sp.Plant.Units
	fu := u.FlowUnit()
	stages = append(stages, []string{"stage", "running units", "from (" + fu + ")", "to (" + fu + ")", "speed (% rated)", "limit at low end"})
	for _, st := range sp.Stages {
		stages = append(stages, []string{fmt.Sprint(st.Number), DescribeCounts(sp.Plant, st.Counts),
			fmt.Sprintf("%.1f", u.FlowOut(st.Low)), fmt.Sprintf("%.1f", u.FlowOut(st.High)), speedRange(st.LowSpeed, st.HighSpeed), orDash(string(st.LowLimit))})
	}
	changes = append(changes, []string{"change", "start / stop", "flow (" + fu + ")", "per unit (" + fu + ")", "design (%)",
		"speed before (%)", "speed after (%)", "delay (min)", "set by"})
	for _, t := range sp.Transitions {
		changes = append(changes, []string{fmt.Sprintf("%d → %d up", t.From, t.To), StartStop(sp.Plant, t.Start, t.Stop),
			fmt.Sprintf("%.1f", u.FlowOut(t.Up.Flow)), fmt.Sprintf("%.1f", u.FlowOut(t.Up.PerUnit)), fmt.Sprintf("%.1f", 100*t.Up.Design),
			pct(t.Up.Speed), pct(t.Up.After), fmt.Sprintf("%.0f", t.Up.Delay.Minutes()), string(t.Up.Limit)})
		sl := string(t.Down.Limit)
		if t.Down.SpeedLimit != t.Down.Limit {
			sl += "; speed: " + string(t.Down.SpeedLimit)
		}
		changes = append(changes, []string{fmt.Sprintf("%d → %d down", t.To, t.From), StartStop(sp.Plant, t.Stop, t.Start),
			fmt.Sprintf("%.1f", u.FlowOut(t.Down.Flow)), fmt.Sprintf("%.1f", u.FlowOut(t.Down.PerUnit)), fmt.Sprintf("%.1f", 100*t.Down.Design),
			pct(t.Down.Speed), pct(t.Down.SpeedAfter), fmt.Sprintf("%.0f", t.Down.Delay.Minutes()), sl})
	}
	return stages, changes
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

func orDash(s string) string {
	if s == "" {
		return "–"
	}
	return s
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
