package optimize

import (
	"fmt"
	"math"
	"strings"
	"time"

	"wattstage/curves"
	"wattstage/internal/numfmt"
	"wattstage/plant"
)

// SequenceOfOperation writes the derived sequence in plain words, in short
// paragraphs a controls contractor can paste into a submittal: the units by
// tag, the speed loop (the differential-pressure setpoint and its reset, or
// the flow a fixed-curve plant holds), the one staging signal and why, each
// change with its values and near-equal band, the failure response, lead
// rotation, the limits used and the cautions that belong with it.
func (sp *Setpoints) SequenceOfOperation() string {
	var b strings.Builder
	para := func(format string, a ...any) {
		b.WriteString(wrap(fmt.Sprintf(format, a...), 78))
		b.WriteString("\n\n")
	}
	p := sp.Plant
	para("Pump staging, %s. %s Plant flow below means the flow measured at the pumps, bypass flow included; speeds are in percent of rated speed.",
		p.Name, sp.installedWords())
	para("%s", sp.speedLoopWords())
	para("Staging signal: %s. %s.", sp.Signal, capitalise(sp.SignalWhy))
	var stages []string
	for _, st := range sp.Stages {
		stages = append(stages, fmt.Sprintf("stage %d runs %s", st.Number, sp.stageWords(st.Counts)))
	}
	para("Stages: %s.", strings.Join(stages, "; "))
	for _, t := range sp.Transitions {
		para("%s", sp.transitionWords(t))
	}
	capacity := "cannot hold the differential-pressure setpoint at maximum speed"
	if _, ok := p.System.(curves.DPControl); !ok {
		capacity = "cannot deliver the plant flow setpoint at maximum speed"
	}
	para("If the running pumps %s, stage up at once without waiting for the delay. When a pump is started, let it prove flow before another is stopped.", capacity)
	para("%s", sp.failureWords())
	para("%s", sp.rotationWords())
	para("Limits used: %s.", strings.Join(sp.limitWords(), "; "))
	para("These are starting values computed from the pump, motor and drive data given, not measured ones. Confirm the minimum flows and minimum speeds with the pump, chiller or boiler manufacturers, verify the values on site and adjust them on commissioning. The sequence is the responsibility of the licensed engineer of record under the local codes.")
	return strings.TrimRight(b.String(), "\n") + "\n"
}

// installedWords names the installed units by tag, how they run, and the
// units in standby.
func (sp *Setpoints) installedWords() string {
	var duty, standby []string
	for _, m := range sp.Plant.Models {
		how := "across the line"
		if m.Drive.Variable() {
			how = "on variable-speed drives"
		}
		var tags []string
		for k := 0; k < m.Count; k++ {
			tags = append(tags, m.Tag(k))
		}
		duty = append(duty, fmt.Sprintf("%s (%s, %s)", strings.Join(tags, ", "), m.Name, how))
		for k := m.Count; k < m.Installed(); k++ {
			standby = append(standby, fmt.Sprintf("%s (%s)", m.Tag(k), m.Name))
		}
	}
	s := "Duty pumps: " + strings.Join(duty, "; ") + "."
	if len(standby) > 0 {
		s += " In standby, never part of a stage: " + strings.Join(standby, ", ") + "."
	}
	return s
}

// speedLoopWords says what sets the pumps' speed: the DP loop with its
// setpoint, reset and sensor, or, on a fixed curve, the flow the plant
// needs. Plants without drives have no speed loop.
func (sp *Setpoints) speedLoopWords() string {
	p := sp.Plant
	u := p.Units
	anyDrive := false
	lo, hi := 1.0, 0.0
	for _, m := range p.Models {
		if m.Drive.Variable() {
			anyDrive = true
			lo, hi = math.Min(lo, m.MinSpeed), math.Max(hi, m.MaxSpeed)
		}
	}
	if !anyDrive {
		return "Speed: every pump runs across the line at rated speed; a valve or the system sets its flow."
	}
	speeds := fmt.Sprintf("one common speed command to every running pump on a drive, between %.0f %% and %.0f %%", 100*lo, 100*hi)
	dp, ok := p.System.(curves.DPControl)
	if !ok {
		curve := "static head plus friction"
		if fc, ok := p.System.(curves.FixedCurve); ok {
			curve = fmt.Sprintf("%s static head plus friction rising to %s at %s", u.FormatHead(fc.Static), u.FormatHead(fc.DesignHead), sp.flowWords(fc.DesignFlow))
		}
		return fmt.Sprintf("Speed: there is no pressure loop. The system is a fixed curve (%s); the speed loop holds the plant flow the chillers or the process need, read at the plant flow meter, with %s. The curve then sets the head.",
			curve, speeds)
	}
	rho := p.Fluid.Density
	where := p.DPSensor
	if where == "" {
		where = "location not in the plant file: put it where the index circuit's valve needs the most pressure"
	}
	_, reset, proposed := sp.DPSchedule()
	s := fmt.Sprintf("Speed: a differential-pressure loop holds the setpoint at the sensor (%s), sending %s. Setpoint %s at and above %s",
		where, speeds, u.FormatPressure(dp.ControlHead, rho), sp.flowWords(reset.HighFlow))
	s += fmt.Sprintf(", reset linearly to %s at and below %s (the schedule table lists it against load).",
		u.FormatPressure(reset.LowHead, rho), sp.flowWords(reset.LowFlow))
	if proposed {
		s += " The plant file gives no reset: this one is proposed as a starting value and is not in the energy figures; replace it with a reset on valve position (trim the setpoint until the valve that needs the most pressure is nearly open) where the controls allow it."
	}
	return s
}

// flowWords writes a flow for the sequence's sentences, with the decimals
// of its setpoints (FlowText).
func (sp *Setpoints) flowWords(q curves.Flow) string {
	u := sp.Plant.Units
	return sp.FlowText(u.FlowOut(q)) + " " + u.FlowUnit()
}

// stageWords names the units a stage runs: by model, lead and lag pumps of
// each model rotating among its duty tags.
func (sp *Setpoints) stageWords(counts []int) string {
	var parts []string
	for i, n := range counts {
		if n == 0 {
			continue
		}
		m := sp.Plant.Models[i]
		role := "the lead pump"
		if n > 1 {
			role = fmt.Sprintf("%d pumps (lead and lag)", n)
		}
		if m.Count == 1 {
			parts = append(parts, m.Tag(0))
			continue
		}
		parts = append(parts, fmt.Sprintf("%s of %s", role, dutyTags(m)))
	}
	return strings.Join(parts, " with ")
}

func dutyTags(m plant.Model) string {
	var tags []string
	for k := 0; k < m.Count; k++ {
		tags = append(tags, m.Tag(k))
	}
	return strings.Join(tags, ", ")
}

// transitionWords writes one change on the chosen signal only, with the
// near-equal band and why the value sits where it does.
func (sp *Setpoints) transitionWords(t Transition) string {
	u := sp.Plant.Units
	fu := u.FlowUnit()
	flowUp := fmt.Sprintf("the plant flow stays above %s %s", sp.FlowText(sp.FlowSetpoint(t.Up.Flow)), fu)
	flowDown := fmt.Sprintf("the plant flow stays below %s %s", sp.FlowText(sp.FlowSetpoint(t.Down.Flow)), fu)
	speedUp := fmt.Sprintf("the speed stays above %.0f %%", 100*t.Up.Speed)
	speedDown := fmt.Sprintf("the speed stays below %.0f %%", 100*t.Down.Speed)
	up, down := flowUp, flowDown
	switch {
	case sp.Signal == SpeedBasis && !math.IsNaN(t.Up.Speed) && !math.IsNaN(t.Down.Speed):
		up, down = speedUp, speedDown
	case sp.Signal == FlowAndSpeedBasis && !math.IsNaN(t.Up.Speed) && !math.IsNaN(t.Down.Speed):
		up, down = flowUp+" or "+speedUp, flowDown+" and "+speedDown
	}
	s := fmt.Sprintf("Stage %d to %d: when %s for %s, %s. Stage %d to %d: when %s for %s, %s.",
		t.From, t.To, up, minutes(t.Up.Delay), sp.changeWords(t.Start, t.Stop),
		t.To, t.From, down, minutes(t.Down.Delay), sp.changeWords(t.Stop, t.Start))
	if bd := t.Band; bd != nil {
		lo, hi := sp.BandSetpoints(*bd)
		narrow := lo == hi // the band lies within one step of the resolution of lo
		s += fmt.Sprintf(" Stages %d and %d draw within %.1f %% of each other %s", t.From, t.To, 100*NearEqualTolerance, sp.BandWords(*bd))
		if lo, hi := math.Round(100*bd.LowSpeed), math.Round(100*bd.HighSpeed); lo == hi {
			s += fmt.Sprintf(" (speed %.0f %%)", lo)
		} else if !math.IsNaN(lo) && !math.IsNaN(hi) {
			s += fmt.Sprintf(" (speed %.0f–%.0f %%)", lo, hi)
		}
		switch {
		case t.Up.Limit == LimitCrossover && narrow:
			s += fmt.Sprintf(": the stage-up value is their crossover; a step to either side one stage draws over %.1f %% less, so keep it there.", 100*NearEqualTolerance)
		case t.Up.Limit == LimitCrossover:
			s += ": the stage-up value is their crossover, inside that band, and may move within it for stability at little cost."
		case bd.Contains(t.Up.Flow):
			s += fmt.Sprintf(": the stage-up value sits inside that band, set by the %s.", t.Up.Limit)
		default:
			s += fmt.Sprintf(": the stage-up value sits below that band, set by the %s; the lower stage cannot reach the crossover.", t.Up.Limit)
		}
	}
	return s
}

// changeWords says which units to start and stop: the next pump of each
// model in the rotation, incoming first.
func (sp *Setpoints) changeWords(start, stop []int) string {
	p := sp.Plant
	var on, off []string
	for i, n := range start {
		if n > 0 {
			on = append(on, unitsOf(p.Models[i], n, "next"))
		}
	}
	for i, n := range stop {
		if n > 0 {
			off = append(off, unitsOf(p.Models[i], n, "last started"))
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

func unitsOf(m plant.Model, n int, which string) string {
	if m.Count == 1 {
		return m.Tag(0)
	}
	if n == 1 {
		return fmt.Sprintf("the %s %s pump in the rotation", which, m.Name)
	}
	return fmt.Sprintf("the %s %d %s pumps in the rotation", which, n, m.Name)
}

// failureWords is the failure response: the standby unit where there is
// one, else the next available unit, and what the rest can do.
func (sp *Setpoints) failureWords() string {
	p := sp.Plant
	s := "Failure response: on a pump or drive fault, or loss of proof of flow, start the next available duty pump of the same model at once, without the delay"
	var standby []string
	for _, m := range p.Models {
		for k := m.Count; k < m.Installed(); k++ {
			standby = append(standby, m.Tag(k))
		}
	}
	if len(standby) > 0 {
		s += fmt.Sprintf("; if every duty pump of that model is running, start the standby pump (%s) of that model", strings.Join(standby, ", "))
	}
	s += "; if none is left, stage up."
	o := sp.OneOut
	if o == nil {
		return s
	}
	if o.Standby {
		return s + fmt.Sprintf(" With one %s out of service the standby pump takes its place: the stages and their values stay as they are.", o.Removed)
	}
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
	return s + fmt.Sprintf(" With one %s out of service the remaining pumps %s: they deliver at most %s on the system curve (%.0f %% of design flow), with motors at up to %.0f %% of rated load%s.",
		o.Removed, serves, sp.flowWords(o.MaxFlow), 100*float64(o.MaxFlow/p.DesignFlow), 100*loads, sf)
}

// rotationWords is the lead/lag rotation by tag.
func (sp *Setpoints) rotationWords() string {
	var groups []string
	standby := false
	for _, m := range sp.Plant.Models {
		if m.Count > 1 {
			groups = append(groups, dutyTags(m))
		}
		standby = standby || m.Standby > 0
	}
	s := "Lead/lag: "
	if len(groups) == 0 {
		s += "each model has one duty pump, so there is no rotation among duty pumps."
	} else {
		s += fmt.Sprintf("rotate the lead among %s (for example weekly, or to equal run hours) so that wear and starts spread evenly. Which model runs in each stage is part of the sequence above and does not rotate.",
			strings.Join(groups, "; and among "))
	}
	if standby {
		s += " Run each standby pump briefly every week (an exercise run, not part of a stage) so that it is ready; when a duty pump is out of service, the standby pump takes its place in the rotation."
	}
	return s
}

// limitWords are the limits the values rest on.
func (sp *Setpoints) limitWords() []string {
	p := sp.Plant
	var out []string
	for _, m := range p.Models {
		s := fmt.Sprintf("%s minimum flow %s at rated speed", m.Name, sp.flowWords(m.MinFlow))
		if m.Drive.Variable() {
			s += fmt.Sprintf(", minimum speed %.0f %%", 100*m.MinSpeed)
		}
		out = append(out, s)
	}
	if p.MinFlow > 0 {
		out = append(out, fmt.Sprintf("the bypass holds the plant minimum flow of %s", sp.flowWords(p.MinFlow)))
	}
	return out
}

func capitalise(s string) string {
	if s == "" {
		return s
	}
	return strings.ToUpper(s[:1]) + s[1:]
}

func minutes(d time.Duration) string {
	return fmt.Sprintf("%.0f min", d.Minutes())
}

// Thousands writes v with dec decimals and a comma between groups of three
// digits, e.g. 1,540; "–" for NaN or ±Inf.
func Thousands(v float64, dec int) string { return thousands(v, dec) }

func thousands(v float64, dec int) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return "–"
	}
	return numfmt.Grouped(v, dec)
}
