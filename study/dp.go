package study

import (
	"math"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
)

// loggedDP runs the lowest-power staging at the differential pressure the
// trend logged at the sensor instead of the modelled setpoint: the head the
// pumps need is the logged DP plus the friction between the pumps and the
// sensor, (H_design − H_ctl)(Q/Q_design)², the same friction the control
// curve carries. Steps without a logged DP keep the modelled setpoint.
type loggedDP struct {
	label  string
	plant  *plant.Plant
	sys    curves.DPControl
	solver *optimize.Solver
}

var _ optimize.Strategy = (*loggedDP)(nil)

// newLoggedDP returns the strategy, or nil when the plant has no DP loop or
// the steps log no DP.
func newLoggedDP(p *plant.Plant, steps []optimize.Step) *loggedDP {
	sys, ok := p.System.(curves.DPControl)
	if !ok || !hasLoggedDP(steps) {
		return nil
	}
	return &loggedDP{label: "lowest-power at the logged DP", plant: p, sys: sys, solver: optimize.New(p, optimize.Options{})}
}

func hasLoggedDP(steps []optimize.Step) bool {
	for _, st := range steps {
		if st.DP > 0 {
			return true
		}
	}
	return false
}

func (l *loggedDP) Name() string { return l.label }

func (l *loggedDP) Run(steps []optimize.Step) optimize.Run { return optimize.Collect(l, steps) }

// needAt is the head at the pumps for a logged DP at a load flow.
func (l *loggedDP) needAt(dp curves.Head, q curves.Flow) curves.Head {
	x := float64(q / l.sys.DesignFlow)
	return dp + (l.sys.DesignHead-l.sys.ControlHead)*curves.Head(x*x)
}

func (l *loggedDP) Stream(steps []optimize.Step, visit func(int, *optimize.Result)) optimize.Run {
	r := optimize.Run{Name: l.label, Plant: l.plant, Drives: optimize.Drives(l.plant),
		Note: "the lowest-power staging holding the DP the trend logged at the sensor (the modelled setpoint where none was logged)"}
	prev := -1
	// A logged DP repeats with its flow (both logged to a resolution), and
	// the solve is a function of the two: a long trend answers repeats
	// from a bounded cache.
	var cache optimize.SolveCache[dpKey]
	for i, st := range steps {
		k := dpKey{load: st.Load}
		if st.DP > 0 {
			k.head = l.needAt(st.DP, st.Load)
		}
		res := cache.Solve(k, l.solve)
		visit(i, &res)
		if st.Timed() && res.Status == optimize.Served {
			if n := res.Running(); prev >= 0 && n != prev {
				r.Changes += abs(n - prev)
			}
			prev = res.Running()
		}
	}
	return r
}

// dpKey fixes a solve at a logged DP: the load flow and the head the pumps
// must make (0: the modelled setpoint).
type dpKey struct {
	load curves.Flow
	head curves.Head
}

func (l *loggedDP) solve(k dpKey) optimize.Result {
	return l.solver.SolveWith(k.load, optimize.Constraint{Head: k.head})
}

func abs(v int) int {
	if v < 0 {
		return -v
	}
	return v
}

// DPComparison sets the DP a trend logged at the sensor against the
// setpoint the model holds at the same loads (its reset included).
type DPComparison struct {
	N                 int         // intervals with a logged DP
	Hours             float64     // hours they stand for
	MeanLogged        curves.Head // hours-weighted mean logged DP, m
	MeanModel         curves.Head // hours-weighted mean modelled setpoint at the same loads, m
	MeanDiff          curves.Head // MeanLogged − MeanModel, m
	MaxAbs            curves.Head // largest |logged − modelled|, m
	AboveShare        float64     // share of those hours the logged DP is above the modelled setpoint by more than 5 %
	EnergyAtLogged    float64     // kWh/yr of the lowest-power staging at the logged DP
	EnergyAtSetpoints float64     // kWh/yr of the lowest-power staging at the modelled setpoints
}

// compareDP compares the logged DP with the modelled setpoint.
func compareDP(p *plant.Plant, steps []optimize.Step) *DPComparison {
	sys, ok := p.System.(curves.DPControl)
	if !ok || !hasLoggedDP(steps) {
		return nil
	}
	c := &DPComparison{}
	var sumL, sumM, above float64
	for _, st := range steps {
		if st.DP <= 0 {
			continue
		}
		m := sys.ControlAt(st.Load)
		c.N++
		c.Hours += st.Hours
		sumL += float64(st.DP) * st.Hours
		sumM += float64(m) * st.Hours
		c.MaxAbs = max(c.MaxAbs, curves.Head(math.Abs(float64(st.DP-m))))
		if st.DP > m*1.05 {
			above += st.Hours
		}
	}
	if c.Hours > 0 {
		c.MeanLogged, c.MeanModel = curves.Head(sumL/c.Hours), curves.Head(sumM/c.Hours)
		c.MeanDiff = c.MeanLogged - c.MeanModel
		c.AboveShare = above / c.Hours
	}
	return c
}
