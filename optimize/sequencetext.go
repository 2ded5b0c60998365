package optimize

import (
	"fmt"
	"math"
	"strings"
	"time"

	"wattstage/plant"
)

// SequenceOfOperation writes the derived sequence in plain words, in short
// paragraphs a controls contractor can paste into a submittal, with the
// cautions that belong with it.
func (sp *Setpoints) SequenceOfOperation() string {
	p := sp.Plant
	u := p.Units
	var b strings.Builder
	para := func(format string, a ...any) {
		b.WriteString(wrap(fmt.Sprintf(format, a...), 78))
		b.WriteString("\n\n")
	}
	var installed []string
	anyDrive := false
	for _, m := range p.Models {
		how := "across the line"
		if m.Drive.Variable() {
			how, anyDrive = "on variable-speed drives", true
		}
		installed = append(installed, fmt.Sprintf("%d × %s (%s)", m.Count, m.Name, how))
	}
	speedNote := ""
	if anyDrive {
		speedNote = " All running pumps on drives receive one common speed signal from the differential-pressure loop."
	}
	para("Pump staging, %s. Installed: %s.%s Plant flow below means the flow measured at the pumps, bypass flow included; speeds are in percent of rated speed.",
		p.Name, strings.Join(installed, ", "), speedNote)
	var stages []string
	for _, st := range sp.Stages {
		stages = append(stages, fmt.Sprintf("stage %d runs %s", st.Number, DescribeCounts(p, st.Counts)))
	}
	para("Stages: %s.", strings.Join(stages, "; "))
	for _, t := range sp.Transitions {
		up := fmt.Sprintf("Stage %d to %d: when the plant flow stays above %s", t.From, t.To, u.FormatFlow(t.Up.Flow))
		if !math.IsNaN(t.Up.Speed) {
			up += fmt.Sprintf(" (or, staging on speed, the speed stays above %.1f %%)", 100*t.Up.Speed)
		}
		up += fmt.Sprintf(" for %s, %s.", minutes(t.Up.Delay), changeWords(p, t.Start, t.Stop))
		down := fmt.Sprintf(" Stage %d to %d: when the plant flow stays below %s", t.To, t.From, u.FormatFlow(t.Down.Flow))
		if !math.IsNaN(t.Down.Speed) {
			down += fmt.Sprintf(" (or, staging on speed, the speed stays below %.1f %%)", 100*t.Down.Speed)
		} else if anyDrive {
			down += " (stage down on flow: the speed is not a usable signal here)"
		}
		down += fmt.Sprintf(" for %s, %s.", minutes(t.Down.Delay), changeWords(p, t.Stop, t.Start))
		para("%s%s", up, down)
	}
	para("If the running pumps cannot hold the differential-pressure setpoint at maximum speed, stage up at once without waiting for the delay. When a pump is started, let it prove flow before another is stopped.")
	if o := sp.OneOut; o != nil {
		loads := 0.0
		for _, un := range o.AtMax.Units {
			loads = math.Max(loads, un.Load)
		}
		serves := "cannot serve the design flow"
		if o.ServesDesign {
			serves = "still serve the design flow"
		}
		sf := ""
		if loads > 1 {
			sf = " (into the motor service factor: confirm with the motor manufacturer that this is acceptable for the duration of the outage)"
		}
		para("Failure response: on a pump or drive fault, or loss of proof of flow, start the next available pump of the same model at once, without the delay; if none is left, stage up. With one %s out of service the remaining pumps %s: they deliver at most %s on the control curve (%.0f %% of design flow), with motors at up to %.0f %% of rated load%s.",
			o.Removed, serves, u.FormatFlow(o.MaxFlow), 100*float64(o.MaxFlow/p.DesignFlow), 100*loads, sf)
	}
	para("Lead/lag: rotate the lead among the identical pumps of each model (for example weekly, or to equal run hours) so that wear and starts spread evenly, and exercise idle pumps. Which model runs in each stage is part of the sequence above and does not rotate.")
	var mins []string
	for _, m := range p.Models {
		s := fmt.Sprintf("%s minimum flow %s at rated speed", m.Name, u.FormatFlow(m.MinFlow))
		if m.Drive.Variable() {
			s += fmt.Sprintf(", minimum speed %.0f %%", 100*m.MinSpeed)
		}
		mins = append(mins, s)
	}
	if p.MinFlow > 0 {
		mins = append(mins, fmt.Sprintf("the bypass holds the plant minimum flow of %s", u.FormatFlow(p.MinFlow)))
	}
	para("Limits used: %s.", strings.Join(mins, "; "))
	para("These are starting values computed from the pump, motor and drive data given, not measured ones. Confirm the minimum flows and minimum speeds with the pump, chiller or boiler manufacturers, verify the values on site and adjust them on commissioning. The sequence is the responsibility of the licensed engineer of record under the local codes.")
	return strings.TrimRight(b.String(), "\n") + "\n"
}

func minutes(d time.Duration) string {
	return fmt.Sprintf("%.0f min", d.Minutes())
}

// changeWords says which units to start and stop, incoming first.
func changeWords(p *plant.Plant, start, stop []int) string {
	var on, off []string
	for i, n := range start {
		if n > 0 {
			on = append(on, fmt.Sprintf("%d × %s", n, p.Models[i].Name))
		}
	}
	for i, n := range stop {
		if n > 0 {
			off = append(off, fmt.Sprintf("%d × %s", n, p.Models[i].Name))
		}
	}
	switch {
	case len(on) > 0 && len(off) > 0:
		return "start " + strings.Join(on, " and ") + ", then stop " + strings.Join(off, " and ")
	case len(on) > 0:
		return "start " + strings.Join(on, " and ")
	}
	return "stop " + strings.Join(off, " and ")
}
