package optimize

import (
	"fmt"
	"io"
	"math"
	"strings"
	"text/tabwriter"
	"time"
	"unicode/utf8"

	"wattstage/curves"
	"wattstage/plant"
)

// Basis says which signal a derived sequence stages on.
type Basis int

const (
	// FlowBasis stages on the plant (pumped) flow.
	FlowBasis Basis = iota
	// SpeedBasis stages on the common speed signal of the running drive
	// units; a transition without a usable speed value falls back to flow.
	SpeedBasis
)

func (b Basis) String() string {
	if b == SpeedBasis {
		return "speed"
	}
	return "flow"
}

var _ Strategy = (*Sequenced)(nil)

// Sequenced runs a derived staging sequence as an automation system would:
// the stages in order, one common speed for the running drive units, a stage
// added when the signal stays above the stage-up value for the stage-up delay
// and dropped when it stays below the stage-down value for the stage-down
// delay. A stage that cannot serve the load stages up at once (a capacity
// alarm). On bins (no time order) each bin takes the stage its flow falls
// in going up.
type Sequenced struct {
	Label     string
	Setpoints *Setpoints
	Basis     Basis
	solver    *Solver
}

// NewSequenced returns the derived sequence as a strategy.
func NewSequenced(label string, sp *Setpoints, basis Basis) *Sequenced {
	return &Sequenced{Label: label, Setpoints: sp, Basis: basis, solver: New(sp.Plant, Options{CommonSpeed: true})}
}

func (q *Sequenced) Name() string { return q.Label }

func (q *Sequenced) Run(steps []Step) Run {
	r, _ := q.RunCycling(steps)
	return r
}

// Cycling counts the stage changes of a time-ordered run and the unit
// starts they cause.
type Cycling struct {
	Changes    int     // stage changes
	Days       float64 // days the steps stand for
	PerDay     float64 // Changes / Days
	MaxPerHour int     // most stage changes within one clock hour
	Models     []ModelStarts
}

// ModelStarts are the starts of one model's units. With lead/lag rotation
// the starts spread over the model's units; MaxPerHour counts them all, as
// if one unit took them (the conservative reading).
type ModelStarts struct {
	Model      int
	Name       string
	Starts     int
	MaxPerHour int
	// Allowed is the NEMA MG 10 starts per hour of one motor of this size
	// and pole count (values from memory; across-the-line starts of design
	// A/B motors with load inertia within the table's limit); NaN outside
	// the table.
	Allowed float64
	Over    bool // MaxPerHour above Allowed
}

type cycleCounter struct {
	c       Cycling
	perHour map[time.Time]int
	model   []map[time.Time]int
}

func newCycleCounter(p *plant.Plant) *cycleCounter {
	cc := &cycleCounter{perHour: map[time.Time]int{}}
	for i, m := range p.Models {
		cc.c.Models = append(cc.c.Models, ModelStarts{Model: i, Name: m.Name,
			Allowed: StartsPerHour(m.Motor.Rated, curves.PoleCount(m.RatedSpeed))})
		cc.model = append(cc.model, map[time.Time]int{})
	}
	return cc
}

// change records stage change from → to (stage indexes from 0) at time at.
func (cc *cycleCounter) change(sp *Setpoints, from, to int, at time.Time) {
	cc.c.Changes++
	h := at.Truncate(time.Hour)
	cc.perHour[h]++
	a, b := sp.Stages[from].Counts, sp.Stages[to].Counts
	for i := range a {
		if n := b[i] - a[i]; n > 0 {
			cc.c.Models[i].Starts += n
			cc.model[i][h] += n
		}
	}
}

func (cc *cycleCounter) finish(hours float64) Cycling {
	c := cc.c
	c.Days = hours / 24
	if c.Days > 0 {
		c.PerDay = float64(c.Changes) / c.Days
	}
	for _, n := range cc.perHour {
		c.MaxPerHour = max(c.MaxPerHour, n)
	}
	for i := range c.Models {
		for _, n := range cc.model[i] {
			c.Models[i].MaxPerHour = max(c.Models[i].MaxPerHour, n)
		}
		c.Models[i].Over = !math.IsNaN(c.Models[i].Allowed) && float64(c.Models[i].MaxPerHour) > c.Models[i].Allowed
	}
	return c
}

// RunCycling runs the sequence and counts its stage changes and starts.
func (q *Sequenced) RunCycling(steps []Step) (Run, Cycling) {
	sp := q.Setpoints
	p := sp.Plant
	r := Run{Name: q.Label, Drives: drives(p),
		Note: fmt.Sprintf("the derived staging sequence on %s, with its deadbands and delays; one common speed for the running units", q.Basis)}
	cc := newCycleCounter(p)
	last := len(sp.Stages) - 1
	k := -1 // current stage index; -1 = not started
	var upSince, downSince, prev time.Time
	hours := 0.0
	for _, st := range steps {
		hours += st.Hours
		pumped := max(st.Load, p.MinFlow)
		if !st.Timed() {
			r.Points = append(r.Points, q.serve(st.Load, q.goingUp(pumped)))
			continue
		}
		if k < 0 || (!prev.IsZero() && st.Time.Sub(prev) > 6*time.Hour) {
			// Start, or restart after a long gap in the trend, in the stage the
			// flow falls in going up.
			k = q.goingUp(pumped)
			upSince, downSince = time.Time{}, time.Time{}
		}
		prev = st.Time
		res := q.at(st.Load, k)
		for res.Status != Served && k < last {
			cc.change(sp, k, k+1, st.Time)
			k++
			res = q.at(st.Load, k)
			upSince, downSince = time.Time{}, time.Time{}
		}
		r.Points = append(r.Points, res)
		if res.Status != Served {
			continue
		}
		end := st.Time.Add(time.Duration(st.Hours * float64(time.Hour)))
		switch {
		case k < last && q.above(res, pumped, k):
			if upSince.IsZero() {
				upSince = st.Time
			}
			downSince = time.Time{}
			if end.Sub(upSince) >= sp.Transitions[k].Up.Delay {
				cc.change(sp, k, k+1, end)
				k++
				upSince = time.Time{}
			}
		case k > 0 && q.below(res, pumped, k-1):
			if downSince.IsZero() {
				downSince = st.Time
			}
			upSince = time.Time{}
			if end.Sub(downSince) >= sp.Transitions[k-1].Down.Delay {
				if q.at(st.Load, k-1).Status == Served {
					cc.change(sp, k, k-1, end)
					k--
				}
				downSince = time.Time{}
			}
		default:
			upSince, downSince = time.Time{}, time.Time{}
		}
	}
	cy := cc.finish(hours)
	r.Changes = cy.Changes
	return r, cy
}

// goingUp returns the stage a plant flow falls in as flow rises: the first
// whose stage-up flow lies above it.
func (q *Sequenced) goingUp(pumped curves.Flow) int {
	for k, t := range q.Setpoints.Transitions {
		if pumped < t.Up.Flow {
			return k
		}
	}
	return len(q.Setpoints.Stages) - 1
}

func (q *Sequenced) at(load curves.Flow, k int) Result {
	return q.solver.SolveWith(load, Constraint{Counts: q.Setpoints.Stages[k].Counts})
}

// serve solves a bin in stage k, or in the next stage up that serves it.
func (q *Sequenced) serve(load curves.Flow, k int) Result {
	first := q.at(load, k)
	for j := k; j < len(q.Setpoints.Stages); j++ {
		if r := q.at(load, j); r.Status == Served {
			return r
		}
	}
	return first
}

// above reports whether the stage-up condition of transition k holds.
func (q *Sequenced) above(res Result, pumped curves.Flow, k int) bool {
	t := q.Setpoints.Transitions[k]
	if q.Basis == SpeedBasis && !math.IsNaN(t.Up.Speed) {
		return commonSpeed(res, q.Setpoints.Plant) > t.Up.Speed
	}
	return pumped > t.Up.Flow
}

// below reports whether the stage-down condition of transition k holds.
func (q *Sequenced) below(res Result, pumped curves.Flow, k int) bool {
	t := q.Setpoints.Transitions[k]
	if q.Basis == SpeedBasis && !math.IsNaN(t.Down.Speed) {
		return commonSpeed(res, q.Setpoints.Plant) < t.Down.Speed
	}
	return pumped < t.Down.Flow
}

// mg10Row is one row of the NEMA MG 10 table of allowed starts per hour
// for design A and B motors at 2, 4 and 6 poles.
type mg10Row struct {
	hp         float64
	p2, p4, p6 float64
}

// mg10 holds NEMA MG 10 (Energy Management Guide for Selection and Use of
// Fixed Frequency Medium AC Squirrel-Cage Polyphase Induction Motors),
// Table 1, column A: maximum starts per hour. The values are from memory
// (the table itself was not at hand); use them as guidance and take the
// motor manufacturer's limit where it is given.
var mg10 = []mg10Row{
	{1, 15, 30, 34}, {1.5, 12.9, 25.7, 29.1}, {2, 11.5, 23, 26.1}, {3, 9.9, 19.8, 22.4},
	{5, 8.1, 16.3, 18.4}, {7.5, 7.0, 14.0, 15.8}, {10, 6.2, 12.5, 14.2}, {15, 5.4, 10.7, 12.1},
	{20, 4.9, 9.8, 11.1}, {25, 4.5, 9.0, 10.2}, {30, 4.2, 8.4, 9.5}, {40, 3.8, 7.6, 8.6},
	{50, 3.5, 7.0, 7.9}, {60, 3.3, 6.5, 7.4}, {75, 3.1, 6.1, 6.9}, {100, 2.8, 5.6, 6.3},
	{125, 2.6, 5.2, 5.9}, {150, 2.4, 4.9, 5.5}, {200, 2.3, 4.5, 5.1}, {250, 2.1, 4.2, 4.8},
}

// StartsPerHour returns the NEMA MG 10 guidance on starts per hour for a
// motor of the given rated output and pole count (values from memory). A
// size between two rows takes the larger motor's row, the fewer starts
// (conservative). NaN outside 1–250 hp or for an unknown pole count.
func StartsPerHour(rated curves.Power, poles int) float64 {
	hp := float64(rated) / curves.Horsepower
	if hp < 1-1e-6 || hp > 250*(1+1e-6) {
		return math.NaN()
	}
	for _, r := range mg10 {
		if r.hp >= hp*(1-1e-6) {
			switch poles {
			case 2:
				return r.p2
			case 4:
				return r.p4
			case 6:
				return r.p6
			}
			return math.NaN()
		}
	}
	return math.NaN()
}

// SequencePrice compares the derived sequence with the unconstrained optimum
// and with the plant's current thresholds over one profile.
type SequencePrice struct {
	Basis      Basis
	Optimum    Energy // lowest power at every step, each model at its own speed
	Sequence   Energy // the derived sequence
	Current    Energy // the plant's current thresholds; zero when it gives none
	HasCurrent bool
	// ExtraPct is the sequence's energy over the optimum's, in %;
	// CurrentExtraPct the current thresholds' (NaN without them).
	ExtraPct, CurrentExtraPct float64
	Cycling                   Cycling // stage changes of the derived sequence
	OptimumChanges            int     // stage changes of the optimum on a trend
	Warnings                  []string
}

// PriceSequence runs the optimum, the derived sequence and the plant's
// current thresholds (if any) over the steps and compares their energy.
func PriceSequence(sp *Setpoints, steps []Step, basis Basis) SequencePrice {
	p := sp.Plant
	pr := SequencePrice{Basis: basis, CurrentExtraPct: math.NaN()}
	opt := NewLowest("lowest power", p, Options{}).Run(steps)
	seqRun, cy := NewSequenced("derived sequence", sp, basis).RunCycling(steps)
	pr.Optimum, pr.Sequence, pr.Cycling = Sum(opt, steps), Sum(seqRun, steps), cy
	pr.OptimumChanges = opt.Changes
	pr.ExtraPct = 100 * (pr.Sequence.KWh/pr.Optimum.KWh - 1)
	if p.Sequence != nil {
		pr.Current, pr.HasCurrent = Sum(NewStaged("current thresholds", p, *p.Sequence).Run(steps), steps), true
		pr.CurrentExtraPct = 100 * (pr.Current.KWh/pr.Optimum.KWh - 1)
	}
	for _, e := range []Energy{pr.Sequence, pr.Current} {
		if e.Name != "" && math.Abs(e.HoursUnmet-pr.Optimum.HoursUnmet) > 1e-9 {
			pr.Warnings = append(pr.Warnings, fmt.Sprintf("%s leaves %.1f h unserved, the optimum %.1f h: the energies cover different hours",
				e.Name, e.HoursUnmet, pr.Optimum.HoursUnmet))
		}
	}
	for _, m := range cy.Models {
		if m.Over {
			pr.Warnings = append(pr.Warnings, fmt.Sprintf("%s: up to %d starts in one hour, above the %.1f per hour NEMA MG 10 guidance (from memory) for its motor; lengthen the delays or widen the deadband",
				m.Name, m.MaxPerHour, m.Allowed))
		}
	}
	return pr
}

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

// wrap breaks text into lines of at most width runes at spaces, keeping a
// unit ("%", "gpm", "min", …) on the line of its number.
func wrap(s string, width int) string {
	var words []string
	for _, w := range strings.Fields(s) {
		if n := len(words); n > 0 && (isUnitWord(w) || strings.HasSuffix(words[n-1], " ×")) {
			words[n-1] += " " + w
			continue
		}
		words = append(words, w)
	}
	var b strings.Builder
	n := 0
	for i, w := range words {
		l := utf8.RuneCountInString(w)
		if i > 0 {
			if n+1+l > width {
				b.WriteByte('\n')
				n = 0
			} else {
				b.WriteByte(' ')
				n++
			}
		}
		b.WriteString(w)
		n += l
	}
	return b.String()
}

func isUnitWord(w string) bool {
	switch strings.TrimRight(w, ".,;:)") {
	case "%", "gpm", "m³/h", "L/s", "ft", "m", "min", "kW", "hp", "×":
		return true
	}
	return false
}
