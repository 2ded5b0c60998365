package handover

import (
	"fmt"
	"math"
	"slices"
	"strings"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
	"wattstage/study"
	"wattstage/workbook"
)

// curvePoints is the number of flow steps each pump curve is tabulated at.
const curvePoints = 16

// curveTables tabulates every chart from the result: per model the
// operating points on its curves and its efficiency, the stages in
// parallel (mixed plants), power by number of running units, the staging
// bands, each strategy's group power, the load profile and logged against
// predicted power.
func curveTables(res *study.Result) workbook.Curves {
	p := res.Plant
	u := p.Units
	var c workbook.Curves
	for i := range p.Models {
		c.Head = append(c.Head, operatingChart(res, i))
		c.Efficiency = append(c.Efficiency, efficiencyChart(p, i))
	}
	c.Parallel = parallelChart(res)
	c.CountPower = countPowerChart(res)
	c.Bands = bandsChart(res)
	gp := workbook.Chart{Title: "Group input power across plant flow, by strategy", XLabel: "Plant flow (" + u.FlowUnit() + ")",
		YLabel: "Input power (kW)", Markers: true}
	for _, pc := range res.GroupPower {
		series := workbook.Series{Name: pc.Name}
		for k, q := range pc.Flow {
			series.X = append(series.X, u.FlowOut(q))
			series.Y = append(series.Y, pc.KW[k])
		}
		gp.Series = append(gp.Series, series)
	}
	c.GroupPower = gp
	c.Hours, c.Energy = loadProfile(res)
	c.Measured = measuredChart(res)
	return c
}

// speedSet picks rated speed, the minimum speed and a few between.
func speedSet(m plant.Model) []float64 {
	if !m.Drive.Variable() {
		return []float64{1}
	}
	out := []float64{math.Min(1, m.MaxSpeed)}
	for _, s := range []float64{0.9, 0.8, 0.7, 0.6, 0.5} {
		if s > m.MinSpeed+0.05 && s < out[0] {
			out = append(out, s)
		}
	}
	return append(out, m.MinSpeed)
}

// topFlow is a model's runout at rated speed, or its last datasheet flow.
func topFlow(m *plant.Model) curves.Flow {
	if m.Runout > 0 {
		return m.Runout
	}
	return m.Pump.LastFlow
}

// efficiencyChart is pump efficiency against flow at several speeds.
func efficiencyChart(p *plant.Plant, i int) workbook.Chart {
	m := &p.Models[i]
	u := p.Units
	ec := workbook.Chart{Title: m.Name + ": pump efficiency at several speeds", XLabel: "Flow per unit (" + u.FlowUnit() + ")", YLabel: "Pump efficiency (%)"}
	for _, s := range speedSet(*m) {
		es := workbook.Series{Name: fmt.Sprintf("%.0f %% speed", 100*s)}
		for k := 1; k <= curvePoints; k++ {
			q := topFlow(m) * curves.Flow(s*float64(k)/curvePoints)
			es.X = append(es.X, u.FlowOut(q))
			es.Y = append(es.Y, 100*m.Pump.Eff(q, s))
		}
		ec.Series = append(ec.Series, es)
	}
	return ec
}

// operatingChart is model i's head at its maximum and minimum speed, the
// system curve shared by 1 … (its installed units) running, the points
// where the lowest-power staging runs its units at each load step, the
// BEP, the edges of the preferred region (70 % and 120 % of BEP flow,
// ANSI/HI 9.6.3) and the minimum flow and runout, each scaled by the
// affinity laws between minimum and maximum speed (flow ∝ s, head ∝ s²).
func operatingChart(res *study.Result, i int) workbook.Chart {
	p := res.Plant
	m := &p.Models[i]
	u := p.Units
	ch := workbook.Chart{Title: m.Name + ": operating points on the pump curves",
		XLabel: "Flow per unit (" + u.FlowUnit() + ")", YLabel: "Head (" + u.HeadUnit() + ")"}
	hi, lo := m.MaxSpeed, m.MinSpeed
	if !m.Drive.Variable() {
		hi, lo = 1, 1
	}
	speeds := []float64{hi}
	if lo < hi {
		speeds = append(speeds, lo)
	}
	for _, s := range speeds {
		name := fmt.Sprintf("head at %.0f %% speed", 100*s)
		if s == hi {
			name += " (maximum)"
		} else {
			name += " (minimum)"
		}
		se := workbook.Series{Name: name}
		for k := 0; k <= curvePoints; k++ {
			q := topFlow(m) * curves.Flow(s*float64(k)/curvePoints)
			if h := m.Pump.Head(q, s); h > 0 {
				se.X = append(se.X, u.FlowOut(q))
				se.Y = append(se.Y, u.HeadOut(h))
			}
		}
		ch.Series = append(ch.Series, se)
	}
	for n := 1; n <= m.Count; n++ {
		ss := workbook.Series{Name: fmt.Sprintf("system, %d running", n), Style: workbook.StyleDashed}
		// Up to a tenth past the design flow shared by the running units:
		// beyond it the curve only stretches the head axis.
		span := topFlow(m) * curves.Flow(hi)
		if p.DesignFlow > 0 {
			span = min(span, 1.1*p.DesignFlow/curves.Flow(n))
		}
		for k := 0; k <= curvePoints; k++ {
			q := span * curves.Flow(float64(k)/curvePoints)
			ss.X = append(ss.X, u.FlowOut(q))
			ss.Y = append(ss.Y, u.HeadOut(p.System.Required(q*curves.Flow(n))))
		}
		ch.Series = append(ch.Series, ss)
	}
	ops := workbook.Series{Name: "lowest-power staging, each load step", Style: workbook.StylePoints}
	seen := map[[2]float64]bool{}
	if lo := res.Strategy(study.KeyLowest); lo != nil {
		for _, lp := range lo.LoadPoints {
			for _, un := range lp.State.Units {
				if un.Model != i {
					continue
				}
				pt := [2]float64{u.FlowOut(un.Flow), u.HeadOut(un.Head)}
				if !seen[pt] {
					seen[pt] = true
					ops.X = append(ops.X, pt[0])
					ops.Y = append(ops.Y, pt[1])
				}
			}
		}
	}
	if len(ops.X) > 0 {
		ch.Series = append(ch.Series, ops)
	}
	ch.Series = append(ch.Series, workbook.Series{Name: "best efficiency point (rated speed)", Style: workbook.StylePoints,
		X: []float64{u.FlowOut(m.Pump.BEPFlow)}, Y: []float64{u.HeadOut(m.Pump.BEPHead)}})
	edge := func(name string, rated curves.Flow, style workbook.SeriesStyle) {
		if rated <= 0 {
			return
		}
		se := workbook.Series{Name: name, Style: style}
		if lo == hi {
			se.Style = workbook.StylePoints
		}
		for k := 0; k <= 8; k++ {
			s := lo + (hi-lo)*float64(k)/8
			q := rated * curves.Flow(s)
			if h := m.Pump.Head(q, s); h > 0 {
				se.X = append(se.X, u.FlowOut(q))
				se.Y = append(se.Y, u.HeadOut(h))
			}
			if lo == hi {
				break
			}
		}
		if len(se.X) > 0 {
			ch.Series = append(ch.Series, se)
		}
	}
	edge("preferred region, 70 % of BEP flow", 0.7*m.Pump.BEPFlow, workbook.StyleGuide)
	edge("preferred region, 120 % of BEP flow", 1.2*m.Pump.BEPFlow, workbook.StyleGuide)
	edge("minimum flow", m.MinFlow, workbook.StyleDashed)
	edge("runout", m.Runout, workbook.StyleDashed)
	return ch
}

// parallelChart is, for a plant of more than one model, the full-speed
// curve of each derived stage's units in parallel against plant flow, with
// the system curve: where each stage can run.
func parallelChart(res *study.Result) workbook.Chart {
	if len(res.StageCurves) == 0 {
		return workbook.Chart{}
	}
	p := res.Plant
	u := p.Units
	ch := workbook.Chart{Title: "Stages in parallel at full speed, and the system curve",
		XLabel: "Plant flow (" + u.FlowUnit() + ")", YLabel: "Head at the header (" + u.HeadUnit() + ")"}
	top := curves.Flow(0)
	for _, sc := range res.StageCurves {
		se := workbook.Series{Name: "stage " + countsText(p, sc.Counts)}
		for k, q := range sc.Flow {
			se.X = append(se.X, u.FlowOut(q))
			se.Y = append(se.Y, u.HeadOut(sc.Head[k]))
			top = max(top, q)
		}
		ch.Series = append(ch.Series, se)
	}
	if p.DesignFlow > 0 {
		top = min(top, 1.1*p.DesignFlow)
	}
	ss := workbook.Series{Name: "system curve", Style: workbook.StyleDashed}
	for k := 0; k <= curvePoints; k++ {
		q := top * curves.Flow(float64(k)/curvePoints)
		ss.X = append(ss.X, u.FlowOut(q))
		ss.Y = append(ss.Y, u.HeadOut(p.System.Required(q)))
	}
	ch.Series = append(ch.Series, ss)
	return ch
}

// countsText names a combination of running units, e.g. "2 × CWP-L + 1 ×
// CWP-S".
func countsText(p *plant.Plant, counts []int) string {
	var parts []string
	for i, n := range counts {
		if n > 0 {
			parts = append(parts, fmt.Sprintf("%d × %s", n, p.Models[i].Name))
		}
	}
	if len(parts) == 0 {
		return "none running"
	}
	return strings.Join(parts, " + ")
}

// countPowerChart is the lowest-power staging's group input with the
// number of running units held, one series per count, with the derived
// crossovers marked and the stage-up and stage-down flows drawn as
// vertical lines.
func countPowerChart(res *study.Result) workbook.Chart {
	p := res.Plant
	u := p.Units
	ch := workbook.Chart{Title: "Why each number of running units wins: input power by units running",
		XLabel: "Plant flow (" + u.FlowUnit() + ")", YLabel: "Input power (kW)"}
	for _, cp := range res.CountPower {
		se := workbook.Series{Name: fmt.Sprintf("%d running", cp.Running)}
		for k, q := range cp.Flow {
			se.X = append(se.X, u.FlowOut(q))
			se.Y = append(se.Y, cp.KW[k])
		}
		if hasFinite(se.Y) {
			ch.Series = append(ch.Series, se)
		}
	}
	if len(ch.Series) == 0 || res.Setpoints == nil {
		return ch
	}
	top := 0.0
	for _, se := range ch.Series {
		for _, y := range se.Y {
			if !math.IsNaN(y) {
				top = math.Max(top, y)
			}
		}
	}
	cross := workbook.Series{Name: "power crossover", Style: workbook.StylePoints}
	up := workbook.Series{Name: "stage-up flow", Style: workbook.StyleDashed}
	down := workbook.Series{Name: "stage-down flow", Style: workbook.StyleGuide}
	// Each stage change is a vertical line at its flow across the plot,
	// a gap between one and the next.
	mark := func(se *workbook.Series, q curves.Flow) {
		if q <= 0 {
			return
		}
		x := u.FlowOut(q)
		if len(se.X) > 0 {
			se.X = append(se.X, x)
			se.Y = append(se.Y, math.NaN())
		}
		se.X = append(se.X, x, x)
		se.Y = append(se.Y, 0, top)
	}
	for _, t := range res.Setpoints.Transitions {
		if t.Crossover > 0 && t.CrossoverPower > 0 {
			cross.X = append(cross.X, u.FlowOut(t.Crossover))
			cross.Y = append(cross.Y, float64(t.CrossoverPower)/curves.KW)
		}
		mark(&up, t.Up.Flow)
		mark(&down, t.Down.Flow)
	}
	for _, se := range []workbook.Series{cross, up, down} {
		if len(se.X) > 0 {
			ch.Series = append(ch.Series, se)
		}
	}
	return ch
}

// bandsChart draws the flow range of each derived stage as a bar at its
// number of running units, with the stage-up and stage-down flows as
// risers between the counts.
func bandsChart(res *study.Result) workbook.Chart {
	sp := res.Setpoints
	if sp == nil || len(sp.Stages) == 0 {
		return workbook.Chart{}
	}
	p := res.Plant
	u := p.Units
	ch := workbook.Chart{Title: "Staging bands: the flow each stage runs over",
		XLabel: "Plant flow (" + u.FlowUnit() + ")", YLabel: "Units running (count)", YStep: 1}
	for _, st := range sp.Stages {
		ch.Series = append(ch.Series, workbook.Series{
			Name:  fmt.Sprintf("stage %d: %s", st.Number, countsText(p, st.Counts)),
			X:     []float64{u.FlowOut(st.Low), u.FlowOut(st.High)},
			Y:     []float64{float64(st.Running), float64(st.Running)},
			Style: workbook.StyleBand,
		})
	}
	// Stage up and stage down as risers between the two counts at their
	// flows: the hysteresis loop a controls contractor programs.
	up := workbook.Series{Name: "stage up", Style: workbook.StyleLine}
	down := workbook.Series{Name: "stage down", Style: workbook.StyleDashed}
	riser := func(se *workbook.Series, q curves.Flow, from, to int) {
		if q <= 0 {
			return
		}
		x := u.FlowOut(q)
		if len(se.X) > 0 {
			se.X = append(se.X, x)
			se.Y = append(se.Y, math.NaN())
		}
		se.X = append(se.X, x, x)
		se.Y = append(se.Y, float64(from), float64(to))
	}
	for _, t := range sp.Transitions {
		riser(&up, t.Up.Flow, sum(t.Lower), sum(t.Upper))
		riser(&down, t.Down.Flow, sum(t.Upper), sum(t.Lower))
	}
	for _, se := range []workbook.Series{up, down} {
		if len(se.X) > 0 {
			ch.Series = append(ch.Series, se)
		}
	}
	ch.Series = append(ch.Series, nearEqualBands(res)...)
	return ch
}

// nearEqualBands draws, for each change, the band of plant flow where the
// two stages draw within optimize.NearEqualTolerance of each other (where
// the choice between them costs little and a setpoint may move for
// stability), as a bar halfway between the two stages' counts, at the
// flows the sequence writes (rounded inward to its resolution).
func nearEqualBands(res *study.Result) []workbook.Series {
	sp := res.Setpoints
	var out []workbook.Series
	for _, t := range sp.Transitions {
		if t.Band == nil {
			continue
		}
		lo, hi := sp.BandSetpoints(*t.Band)
		y := float64(sum(t.Lower)+sum(t.Upper)) / 2
		out = append(out, workbook.Series{
			Name: fmt.Sprintf("%d/%d within %.1f %%", sum(t.Lower), sum(t.Upper), 100*optimize.NearEqualTolerance),
			X:    []float64{lo, hi}, Y: []float64{y, y}, Style: workbook.StyleBand,
		})
	}
	return out
}

// loadProfile is the hours a year in each load step and the energy a year
// in each under the baseline and the lowest-power staging, from the load
// points (a bin each, or a flow group of a trend's intervals).
func loadProfile(res *study.Result) (hours, energy workbook.Bars) {
	lo, base := res.Strategy(study.KeyLowest), res.BaselineStrategy()
	if lo == nil || len(lo.LoadPoints) == 0 || len(base.LoadPoints) != len(lo.LoadPoints) {
		return
	}
	u := res.Plant.Units
	f := res.Period.Factor
	xl := "Plant flow of the load step (" + u.FlowUnit() + ")"
	hours = workbook.Bars{Title: "Load profile: hours a year at each load step", XLabel: xl, YLabel: "Hours (h/yr)"}
	energy = workbook.Bars{Title: "Energy a year at each load step", XLabel: xl, YLabel: "Energy (kWh/yr)"}
	hs := workbook.BarSeries{Name: "Hours"}
	bs := workbook.BarSeries{Name: base.Name}
	ls := workbook.BarSeries{Name: lo.Name}
	for k, lp := range lo.LoadPoints {
		label := study.Grouped(u.FlowOut(lp.Flow))
		if lp.Grouped {
			label = study.Grouped(u.FlowOut(lp.Low)) + "–" + study.Grouped(u.FlowOut(lp.High))
		}
		hours.Categories = append(hours.Categories, label)
		hs.Values = append(hs.Values, lp.Hours*f)
		ls.Values = append(ls.Values, lp.KWh*f)
		bs.Values = append(bs.Values, base.LoadPoints[k].KWh*f)
	}
	energy.Categories = hours.Categories
	hours.Series = []workbook.BarSeries{hs}
	energy.Series = []workbook.BarSeries{bs, ls}
	if base == lo {
		energy.Series = []workbook.BarSeries{ls}
	}
	return hours, energy
}

// measuredSample is the most single intervals drawn on the chart of logged
// against predicted power: enough to show the scatter, few enough that the
// table behind it prints on one page.
const measuredSample = 36

// measuredChart plots logged against predicted power for the strategy the
// calibration compares: a sample of single intervals (every k-th of those
// compared), the mean of each flow group, and the 1:1 line.
func measuredChart(res *study.Result) workbook.Chart {
	c := res.Calibration
	if c == nil {
		return workbook.Chart{}
	}
	var st *study.Strategy
	for i := range res.Strategies {
		if res.Strategies[i].Name == c.Strategy {
			st = &res.Strategies[i]
		}
	}
	if st == nil || !st.SeriesKept() {
		return workbook.Chart{}
	}
	var idx []int
	for i, step := range res.Steps {
		if !math.IsNaN(step.MeasuredKW) && st.Served(i) {
			idx = append(idx, i)
		}
	}
	if len(idx) == 0 {
		return workbook.Chart{}
	}
	ch := workbook.Chart{Title: "Logged against predicted power (" + c.Strategy + ")",
		XLabel: "Logged input power (kW)", YLabel: "Predicted input power (kW)"}
	stride := max(1, (len(idx)+measuredSample-1)/measuredSample)
	single := workbook.Series{Name: fmt.Sprintf("single intervals (every %d%s of %s)", stride, ordinal(stride), study.Grouped(float64(len(idx)))),
		Style: workbook.StylePoints}
	top := 0.0
	for k := 0; k < len(idx); k += stride {
		i := idx[k]
		single.X = append(single.X, res.Steps[i].MeasuredKW)
		single.Y = append(single.Y, st.Energy.KW[i])
	}
	ch.Series = append(ch.Series, single)
	if w := float64(res.LoadBinWidth); w > 0 {
		type acc struct{ m, p, n float64 }
		groups := map[int]*acc{}
		var keys []int
		for _, i := range idx {
			k := int(math.Floor(float64(res.Steps[i].Load) / w))
			if groups[k] == nil {
				groups[k] = &acc{}
				keys = append(keys, k)
			}
			g := groups[k]
			g.m += res.Steps[i].MeasuredKW
			g.p += st.Energy.KW[i]
			g.n++
		}
		means := workbook.Series{Name: "mean of each flow group", Style: workbook.StylePoints}
		slices.Sort(keys)
		for _, k := range keys {
			g := groups[k]
			means.X = append(means.X, g.m/g.n)
			means.Y = append(means.Y, g.p/g.n)
		}
		ch.Series = append(ch.Series, means)
	}
	for _, se := range ch.Series {
		for k := range se.X {
			top = math.Max(top, math.Max(se.X[k], se.Y[k]))
		}
	}
	ch.Series = append(ch.Series, workbook.Series{Name: "1:1 (prediction equals log)", Style: workbook.StyleGuide,
		X: []float64{0, top}, Y: []float64{0, top}})
	return ch
}

func ordinal(n int) string {
	switch {
	case n%100 >= 11 && n%100 <= 13:
		return "th"
	case n%10 == 1:
		return "st"
	case n%10 == 2:
		return "nd"
	case n%10 == 3:
		return "rd"
	}
	return "th"
}

func hasFinite(v []float64) bool {
	for _, x := range v {
		if !math.IsNaN(x) && !math.IsInf(x, 0) {
			return true
		}
	}
	return false
}
