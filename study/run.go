package study

import (
	"fmt"
	"runtime"
	"sync"

	"wattstage/curves"
	"wattstage/econ"
	"wattstage/optimize"
)

// Energy is a strategy's energy over the period's steps.
type Energy = optimize.Energy

// Options set up a study. The zero value is the default study.
type Options struct {
	// Baseline is the key of the strategy savings are counted against;
	// empty means DefaultBaseline.
	Baseline string
	// Sensitivities are the cases of the savings range; nil means
	// DefaultSensitivities, an empty non-nil slice none.
	Sensitivities []Sensitivity
	// LoadBinWidth groups a trend's intervals into flow groups of this
	// width for the load points and the binning check; 0 = 5 % of the
	// design flow.
	LoadBinWidth curves.Flow
	// KeepStates keeps every state of every strategy (Strategy.Run.Points)
	// whatever the profile's length, for the JSON detail; memory then grows
	// with the profile.
	KeepStates bool
	// Progress, when set, is called before each long step (a strategy, a
	// sensitivity case) with its label, its index and the number of steps.
	Progress func(label string, i, n int)
	// Advance, when set, is called as the strategies and range cases solve
	// their steps with the share of that work done, from 0 to 1, at most
	// once per percent (from any goroutine, one call at a time).
	Advance func(share float64)
}

// ErrBaseline is returned by Run when the chosen baseline is not one of
// the plant's strategies.
var ErrBaseline = fmt.Errorf("study: baseline")

// Run runs the study: setpoints derived once, every strategy run once over
// the steps and priced once, every load point and chart table built from
// those runs, and every warning gathered with its origin.
func Run(in *Input, opt Options) (*Result, error) {
	p := in.Plant
	r := &Result{Plant: p, Trend: in.Trend, Binned: in.Binned, Steps: in.Steps, Period: PeriodOf(in.Steps, p.Profile.AnnualHours),
		Appraised: p.HasRetrofit, Cautions: Cautions, Baseline: -1}
	if r.Period.Factor == 0 {
		return nil, fmt.Errorf("study: the profile covers no hours")
	}
	// The fingerprint of the files read; empty when one cannot be read again.
	r.InputsSHA256, _ = InputsSHA256(in.inputPaths()...)
	sp, err := optimize.DeriveSetpoints(p, optimize.SetpointOptions{})
	if err != nil {
		r.SetpointsError = err.Error()
	} else {
		r.Setpoints = sp
	}
	ks := Strategies(p, r.Setpoints)
	if l := newLoggedDP(p, in.Steps); l != nil {
		ks = append(ks, Keyed{KeyLoggedDP, l})
	}
	base := opt.Baseline
	if base == "" {
		base = DefaultBaseline(p)
	}
	for i, k := range ks {
		if k.Key == base {
			r.Baseline = i
		}
	}
	if r.Baseline < 0 {
		var keys []string
		for _, k := range ks {
			keys = append(keys, k.Key)
		}
		return nil, fmt.Errorf("%w: no strategy %q (have %v)", ErrBaseline, base, keys)
	}
	sens := opt.Sensitivities
	if sens == nil {
		sens = DefaultSensitivities
	}
	if base == KeyLowest {
		sens = nil
	}
	r.LoadBinWidth = loadBinWidth(in, opt.LoadBinWidth)
	// The strategies and the range cases are independent: run them on
	// every core, each in its own slot, so the result is the same whatever
	// the order they finish in.
	r.Strategies = make([]Strategy, len(ks))
	cases := make([]RangeCase, len(sens))
	errs := make([]error, len(ks)+len(sens))
	var mu sync.Mutex
	done := 0
	report := func(label string) {
		if opt.Progress == nil {
			return
		}
		mu.Lock()
		defer mu.Unlock()
		opt.Progress(label, done, len(ks)+len(sens))
		done++
	}
	r.tick = newTicker((len(ks)+2*len(sens))*len(r.Steps), opt.Advance)
	parallel(len(ks)+len(sens), func(j int) {
		if j < len(ks) {
			report(ks[j].Strategy.Name())
			r.Strategies[j], errs[j] = r.runStrategy(ks[j], opt.KeepStates)
			return
		}
		s := sens[j-len(ks)]
		report("savings range: " + s.Label)
		cases[j-len(ks)], errs[j] = r.rangeCase(s, base)
	})
	for _, err := range errs {
		if err != nil {
			return nil, err
		}
	}
	if err := r.compare(); err != nil {
		return nil, err
	}
	for _, rc := range cases {
		r.addRangeCase(rc)
	}
	r.runChecks(ks)
	if c := compareDP(p, r.Steps); c != nil {
		if s := r.Strategy(KeyLoggedDP); s != nil {
			c.EnergyAtLogged = s.Annual.Energy
		}
		c.EnergyAtSetpoints = r.Strategies[0].Annual.Energy
		r.DP = c
	}
	r.GroupPower = groupPower(p, ks)
	r.CountPower, r.StageCurves = countPower(p), stageCurves(p, r.Setpoints)
	r.gatherWarnings(in)
	r.Recommendation = recommendation(r)
	return r, nil
}

// runStrategy runs one strategy over the steps and prices it. States are
// kept for profiles of up to KeepStatesUpTo steps or when asked (the JSON
// detail); otherwise only aggregates are.
func (r *Result) runStrategy(k Keyed, keep bool) (Strategy, error) {
	acc := newAccumulator(r, keep || len(r.Steps) <= KeepStatesUpTo || r.LoadBinWidth <= 0)
	run := k.Strategy.Stream(r.Steps, acc.visit)
	run.Points = acc.points
	acc.e.Name, acc.e.Changes, acc.e.Drives = run.Name, run.Changes, run.Drives
	s := Strategy{Key: k.Key, Name: run.Name, Note: run.Note, Run: run, Drives: run.Drives,
		Energy: acc.e, Regions: acc.reg, served: acc.served}
	bill, err := econ.Cost(r.Plant.Tariff, samples(s.Energy, r.Steps))
	if err != nil {
		return Strategy{}, err
	}
	s.Bill = bill
	s.Annual = bill.Annualise(r.Period.Factor)
	s.LoadPoints = acc.loadPoints(bill.SampleCost)
	return s, nil
}

// compare counts each strategy's savings against the baseline and
// appraises its investment.
func (r *Result) compare() error {
	b := r.BaselineStrategy()
	terms := r.Plant.Retrofit
	for i := range r.Strategies {
		s := &r.Strategies[i]
		if i == r.Baseline {
			continue
		}
		s.DrivesAdded = max(0, s.Drives-b.Drives)
		s.Savings = &Savings{Energy: b.Annual.Energy - s.Annual.Energy, EnergyCost: b.Annual.EnergyCost - s.Annual.EnergyCost,
			DemandCost: b.Annual.DemandCost - s.Annual.DemandCost, Emissions: b.Annual.Emissions - s.Annual.Emissions}
		s.Savings.Cost = s.Savings.EnergyCost + s.Savings.DemandCost
		if !r.Appraised {
			continue
		}
		// Programming and commissioning (the other costs) come with any
		// change of operation, drives bought or not.
		invest := float64(s.DrivesAdded)*terms.DriveCost + terms.OtherCost
		a, err := econ.AppraiseSavings(terms, s.Savings.EnergyCost, s.Savings.DemandCost, invest)
		if err != nil {
			return err
		}
		a.EnergySaved, a.EmissionsSaved = s.Savings.Energy, s.Savings.Emissions
		s.Appraisal = a
	}
	return nil
}

// samples turns an energy series into tariff samples.
func samples(e Energy, steps []optimize.Step) []econ.Sample {
	out := make([]econ.Sample, len(steps))
	for i, st := range steps {
		out[i] = econ.Sample{Start: st.Time, Hours: st.Hours, Power: curves.Power(e.KW[i] * curves.KW)}
	}
	return out
}

// runChecks adds the part-load, one-unit-out, NPSH, calibration and binning checks.
func (r *Result) runChecks(ks []Keyed) {
	p := r.Plant
	_, dpLoop := p.System.(curves.DPControl)
	switch {
	case !dpLoop:
		r.PartLoad = append(r.PartLoad, PartLoadCheck{Label: "lowest-power staging", Limit: PartLoadLimit,
			Note: "not applicable: §6.5.4.2 covers variable-flow hydronic systems under differential-pressure control; this plant serves a fixed system curve (open or static-plus-friction), whose flow the chillers or the process set"})
	case p.DesignFlow > 0:
		for _, k := range ks {
			switch k.Key {
			case KeyLowest:
				r.PartLoad = append(r.PartLoad, CheckPartLoad("lowest-power staging", p, k.Strategy))
			case KeyCurrent:
				r.PartLoad = append(r.PartLoad, CheckPartLoad("current sequence", p, k.Strategy))
			}
		}
	}
	if uo, err := optimize.CheckUnitOut(p, optimize.Options{}); err == nil {
		r.UnitOut = &uo
	}
	r.NPSH = r.checkNPSH()
	if r.Trend != nil && r.Trend.HasPower() {
		s := r.Strategy(KeyCurrent)
		if s == nil {
			s = r.Strategy(KeyLowest)
		}
		if c := Calibrate(s.Name, s.Energy.KW, s.served, r.Steps); c.N >= 2 {
			r.Calibration = &c
		}
	}
	if r.Trend != nil && r.Binned == nil && r.LoadBinWidth > 0 {
		if b, err := r.Trend.Bin(r.LoadBinWidth); err == nil {
			steps := optimize.StepsFromBinned(b)
			e := streamEnergy(ks[0].Strategy, steps, nil)
			r.Binning = &BinningCheck{Width: b.Width, Bins: len(b.Bins), CubeError: b.CubeError,
				EveryKWh: r.Strategies[0].Annual.Energy, BinnedKWh: e.KWh * r.Period.Factor}
		}
	}
}

// loadBinWidth is the width of the flow groups of a trend solved interval
// by interval; 0 when each step is its own load point.
func loadBinWidth(in *Input, given curves.Flow) curves.Flow {
	if in.Trend == nil || in.Binned != nil {
		return 0
	}
	if given > 0 {
		return given
	}
	top := in.Plant.DesignFlow
	if top <= 0 {
		for _, st := range in.Steps {
			top = max(top, st.Load)
		}
	}
	if top <= 0 {
		return 0
	}
	return top / 20
}

// parallel calls f(0) … f(n−1) on up to GOMAXPROCS goroutines and waits.
func parallel(n int, f func(int)) {
	workers := min(n, runtime.GOMAXPROCS(0))
	next := make(chan int)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for j := range next {
				f(j)
			}
		}()
	}
	for j := 0; j < n; j++ {
		next <- j
	}
	close(next)
	wg.Wait()
}
