package study

import (
	"math"
	"sort"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
)

// NPSHUnit is one running unit of a state set against its suction: the
// NPSH available at the group's suction and the NPSH the pump requires at
// its flow and speed.
type NPSHUnit struct {
	Model     int         // index into the plant's models
	Speed     float64     // fraction of rated speed
	Flow      curves.Flow // the unit's flow, m³/s
	Available curves.Head // NPSHa, m, at the state's pumped flow
	Required  curves.Head // NPSHr, m, scaled to the unit's speed (s² · NPSHr₀(Q/s))
	// Ratio is Available / Required; the check asks for at least the
	// suction's margin.
	Ratio float64
	// Short is true when Ratio falls below the margin.
	Short bool
	// Extrapolated is true when the unit's flow at rated speed lies past
	// the last NPSHr datasheet point.
	Extrapolated bool
}

// NPSHAt sets every running unit of a served state that has NPSHr data
// against the plant's suction: NPSHa = (p_abs − p_v)/(ρ g) + z − h_f(Q/Q_f)²
// at the state's pumped flow, and NPSHr scaled to the unit's speed by the
// affinity laws (common practice). models are the models the state's
// indices refer to (a strategy's variant of the plant). Empty when the
// plant has no suction section or the state is not served.
func NPSHAt(p *plant.Plant, models []plant.Model, res optimize.Result) []NPSHUnit {
	if p.Suction == nil || res.Status != optimize.Served {
		return nil
	}
	a := p.Suction.Available(res.PumpedFlow)
	var out []NPSHUnit
	for _, u := range res.Units {
		c := models[u.Model].NPSHr
		if c == nil {
			continue
		}
		r := c.Required(u.Flow, u.Speed)
		ratio := float64(a) / float64(r)
		out = append(out, NPSHUnit{Model: u.Model, Speed: u.Speed, Flow: u.Flow, Available: a, Required: r, Ratio: ratio,
			Short: ratio < p.Suction.Margin, Extrapolated: c.Extrapolated(u.Flow, u.Speed)})
	}
	return out
}

// NPSHCheck is the NPSH check of a study: every operating point of every
// strategy set against the suction, and the lowest-power staging's points
// that fall short of the margin listed.
type NPSHCheck struct {
	// Made is false when the file lacks what the check needs; Note then
	// says what.
	Made bool
	Note string
	// Margin is the NPSHa/NPSHr ratio asked for.
	Margin float64
	// DesignAvailable is NPSHa at the design flow, m.
	DesignAvailable curves.Head
	// Unchecked names the models without NPSHr points (not checked).
	Unchecked []string
	// Strategies are the unit-hours each strategy runs, checked and short.
	Strategies []NPSHStrategy
	// Short are the lowest-power staging's points below the margin, by
	// load step (bins) or flow group (a trend) and model, worst first.
	Short []NPSHShort
}

// NPSHStrategy sums one strategy's operating points against the margin.
type NPSHStrategy struct {
	Key, Name    string
	UnitHours    float64 // unit-hours checked in the period
	Short        float64 // unit-hours below the margin
	Below        float64 // unit-hours below NPSHr itself (ratio under 1)
	Extrapolated float64 // unit-hours past the last NPSHr datasheet point
	LowestRatio  float64 // the lowest NPSHa/NPSHr of any point; NaN when none was checked
}

// NPSHShort is one operating point of the lowest-power staging below the
// margin: the worst unit of a model at a load step or flow group.
type NPSHShort struct {
	Flow         curves.Flow // the load flow of the step (of the worst step in a group)
	Model        int
	Units        int         // units of the model running there
	Speed        float64     // fraction of rated speed
	UnitFlow     curves.Flow // m³/s
	Available    curves.Head // m
	Required     curves.Head // m, NPSHr at the unit's speed
	Ratio        float64
	Extrapolated bool
	Hours        float64 // hours of the period at the step or group
}

// npshSetup starts the NPSH check: what the file gives for it, and whether
// it is made (Made); the strategies' operating points are then set against
// the suction as they are solved (npshRun) and gathered by npshFinish.
func (r *Result) npshSetup() *NPSHCheck {
	p := r.Plant
	c := &NPSHCheck{}
	var with []string
	for _, m := range p.Models {
		if m.NPSHr == nil {
			c.Unchecked = append(c.Unchecked, m.Name)
		} else {
			with = append(with, m.Name)
		}
	}
	switch {
	case p.Suction == nil && len(with) == 0:
		c.Note = "the plant file gives neither the suction conditions (suction:) nor any pump's NPSHr points (pumps[].npshr)"
	case p.Suction == nil:
		c.Note = "the plant file gives NPSHr points but not the suction conditions (suction: static head, loss, altitude or pressure)"
	case len(with) == 0:
		c.Note = "the plant file gives the suction conditions but no pump's NPSHr points (pumps[].npshr)"
	default:
		c.Made = true
		c.Margin = p.Suction.Margin
		c.DesignAvailable = p.Suction.Available(p.DesignFlow)
		c.Note = p.Suction.Basis
	}
	return c
}

// npshRun sets one strategy's operating points against the suction as
// they are solved, so that no state need be kept.
type npshRun struct {
	r      *Result
	models []plant.Model // the models the states' indices refer to
	ns     NPSHStrategy
	short  map[[2]int]*shortPoint // the lowest-power staging's points below the margin; nil for the others
}

// newNPSHRun starts the check of one strategy; models are those of the
// plant the strategy runs (a variant, for some).
func (r *Result) newNPSHRun(k Keyed, models []plant.Model) *npshRun {
	n := &npshRun{r: r, models: models, ns: NPSHStrategy{Key: k.Key, Name: k.Strategy.Name(), LowestRatio: math.NaN()}}
	if k.Key == KeyLowest {
		n.short = map[[2]int]*shortPoint{}
	}
	return n
}

func (n *npshRun) visit(i int, res *optimize.Result) {
	st := n.r.Steps[i]
	ns := &n.ns
	for _, u := range NPSHAt(n.r.Plant, n.models, *res) {
		ns.UnitHours += st.Hours
		if !(u.Ratio >= ns.LowestRatio) {
			ns.LowestRatio = u.Ratio
		}
		if u.Extrapolated {
			ns.Extrapolated += st.Hours
		}
		if u.Ratio < 1 {
			ns.Below += st.Hours
		}
		if !u.Short {
			continue
		}
		ns.Short += st.Hours
		if n.short != nil {
			n.r.addShort(n.short, i, u, *res)
		}
	}
}

// npshFinish gathers every strategy's check, in the strategies' order, and
// lists the lowest-power staging's short points, worst first.
func (r *Result) npshFinish() {
	c := r.NPSH
	if !c.Made {
		return
	}
	for _, s := range r.Strategies {
		n := s.npsh
		if n == nil {
			continue
		}
		n.ns.Name = s.Name
		c.Strategies = append(c.Strategies, n.ns)
		for _, v := range n.short {
			c.Short = append(c.Short, v.NPSHShort)
		}
	}
	sort.Slice(c.Short, func(i, j int) bool {
		if c.Short[i].Ratio != c.Short[j].Ratio {
			return c.Short[i].Ratio < c.Short[j].Ratio
		}
		return c.Short[i].Flow < c.Short[j].Flow
	})
}

// shortPoint is a short point being gathered: the last step whose hours
// it counted, so that two short units of a step count its hours once.
type shortPoint struct {
	NPSHShort
	last int
}

// addShort gathers a short unit into its point: one per model and load
// step (bins) or flow group (a trend), keeping the worst unit and adding
// the step's hours once.
func (r *Result) addShort(short map[[2]int]*shortPoint, step int, u NPSHUnit, res optimize.Result) {
	st := r.Steps[step]
	g := step
	if w := float64(r.LoadBinWidth); w > 0 {
		g = int(math.Floor(float64(st.Load) / w))
	}
	key := [2]int{u.Model, g}
	v := short[key]
	if v == nil {
		v = &shortPoint{NPSHShort: NPSHShort{Ratio: math.Inf(1)}, last: -1}
		short[key] = v
	}
	if v.last != step {
		v.Hours += st.Hours
		v.last = step
	}
	if u.Ratio < v.Ratio {
		v.Flow, v.Model, v.Speed, v.UnitFlow = st.Load, u.Model, u.Speed, u.Flow
		v.Available, v.Required, v.Ratio, v.Extrapolated = u.Available, u.Required, u.Ratio, u.Extrapolated
		v.Units = res.Counts[u.Model]
	}
}
