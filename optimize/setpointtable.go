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
	u := sp.Plant.Units
	fu := u.FlowUnit()
	tw := tabwriter.NewWriter(w, 2, 8, 2, ' ', tabwriter.AlignRight)
	fmt.Fprintf(tw, "stage\trunning units\tfrom (%s)\tto (%s)\tspeed (%% rated)\tlimit at low end\t\n", fu, fu)
	for _, st := range sp.Stages {
		fmt.Fprintf(tw, "%d\t%s\t%.1f\t%.1f\t%s\t%s\t\n", st.Number, DescribeCounts(sp.Plant, st.Counts),
			u.FlowOut(st.Low), u.FlowOut(st.High), speedRange(st.LowSpeed, st.HighSpeed), orDash(string(st.LowLimit)))
	}
	fmt.Fprintln(tw)
	fmt.Fprintf(tw, "change\tstart / stop\tflow (%s)\tper unit (%s)\tdesign (%%)\tspeed before (%%)\tspeed after (%%)\tdelay (min)\tset by\t\n", fu, fu)
	for _, t := range sp.Transitions {
		fmt.Fprintf(tw, "%d → %d up\t%s\t%.1f\t%.1f\t%.1f\t%s\t%s\t%.0f\t%s\t\n", t.From, t.To, StartStop(sp.Plant, t.Start, t.Stop),
			u.FlowOut(t.Up.Flow), u.FlowOut(t.Up.PerUnit), 100*t.Up.Design, pct(t.Up.Speed), pct(t.Up.After), t.Up.Delay.Minutes(), t.Up.Limit)
		sl := string(t.Down.Limit)
		if t.Down.SpeedLimit != t.Down.Limit {
			sl += "; speed: " + string(t.Down.SpeedLimit)
		}
		fmt.Fprintf(tw, "%d → %d down\t%s\t%.1f\t%.1f\t%.1f\t%s\t%s\t%.0f\t%s\t\n", t.To, t.From, StartStop(sp.Plant, t.Stop, t.Start),
			u.FlowOut(t.Down.Flow), u.FlowOut(t.Down.PerUnit), 100*t.Down.Design, pct(t.Down.Speed), pct(t.Down.SpeedAfter), t.Down.Delay.Minutes(), sl)
	}
	return tw.Flush()
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
