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
	r.NPSH = r.npshSetup()
	keep := opt.KeepStates || len(r.Steps) <= KeepStatesUpTo || r.LoadBinWidth <= 0
	calib := r.calibrationKey(ks)
	// The strategies and the range cases are independent but for one
	// thing: every strategy compares its input step by step with the
	// lowest-power staging's as it streams (beatenNotes), so that one runs
	// first and keeps its series. The rest run on every core, each in its
	// own slot, so the result is the same whatever the order they finish in.
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
	lowest := -1
	for j, k := range ks {
		if k.Key == KeyLowest {
			lowest = j
		}
	}
	refDone := make(chan struct{})
	var ref *Strategy
	// Jobs: the lowest-power staging, the range cases (which need no
	// reference), then the other strategies, which wait for it.
	order := make([]int, 0, len(ks)+len(sens))
	if lowest >= 0 {
		order = append(order, lowest)
	} else {
		close(refDone)
	}
	for j := range sens {
		order = append(order, len(ks)+j)
	}
	for j := range ks {
		if j != lowest {
			order = append(order, j)
		}
	}
	parallel(len(order), func(o int) {
		j := order[o]
		if j < len(ks) {
			if j != lowest {
				<-refDone
			}
			report(ks[j].Strategy.Name())
			k := ks[j]
			r.Strategies[j], errs[j] = r.runStrategy(k, keep, k.Key == KeyLowest || k.Key == calib, ref)
			if j == lowest {
				if errs[j] == nil {
					ref = &r.Strategies[j]
				}
				close(refDone)
			}
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

// runStrategy runs one strategy over the steps and prices it as its
// states stream. Every state is kept when keep is set (profiles of up to
// KeepStatesUpTo steps, bins, the JSON detail); otherwise only aggregates,
// and with series each step's input and whether it was served (the
// lowest-power staging, which the others are compared with, and the
// strategy the calibration compares with the log). ref is the
// lowest-power staging, already run; nil for itself.
func (r *Result) runStrategy(k Keyed, keep, series bool, ref *Strategy) (Strategy, error) {
	acc, err := newAccumulator(r, keep, series, ref)
	if err != nil {
		return Strategy{}, err
	}
	if r.NPSH.Made {
		// A run over no steps names the plant the strategy runs (a variant,
		// for some), whose models the states' indices refer to.
		models := r.Plant.Models
		if p := k.Strategy.Stream(nil, nil).Plant; p != nil {
			models = p.Models
		}
		acc.npsh = r.newNPSHRun(k, models)
	}
	run := k.Strategy.Stream(r.Steps, acc.visit)
	run.Points = acc.points
	acc.e.Name, acc.e.Changes, acc.e.Drives = run.Name, run.Changes, run.Drives
	s := Strategy{Key: k.Key, Name: run.Name, Note: run.Note, Run: run, Drives: run.Drives,
		Energy: acc.e, Regions: acc.reg, served: acc.served, beaten: acc.beaten, npsh: acc.npsh}
	bill, err := acc.price.bill()
	if err != nil {
		return Strategy{}, err
	}
	s.Bill = bill
	s.Annual = bill.Annualise(r.Period.Factor)
	s.LoadPoints = acc.loadPoints(bill.SampleCost)
	return s, nil
}

// calibrationKey is the strategy the calibration compares with the
// trend's logged power: the current sequence, else the lowest-power
// staging; "" without logged power.
func (r *Result) calibrationKey(ks []Keyed) string {
	if r.Trend == nil || !r.Trend.HasPower() {
		return ""
	}
	for _, k := range ks {
		if k.Key == KeyCurrent {
			return KeyCurrent
		}
	}
	return KeyLowest
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
	r.npshFinish()
	if key := r.calibrationKey(ks); key != "" {
		s := r.Strategy(key)
		if c := Calibrate(s.Name, s.Energy.KW, s.served, r.Steps); c.N >= 2 {
			r.Calibration = &c
		}
	}
	if r.Trend != nil && r.Binned == nil && r.LoadBinWidth > 0 {
		if b, err := r.Trend.Bin(r.LoadBinWidth); err == nil {
			steps := optimize.StepsFromBinned(b)
			if e, _, err := r.streamAnnual(ks[0].Strategy, steps, nil); err == nil {
				r.Binning = &BinningCheck{Width: b.Width, Bins: len(b.Bins), CubeError: b.CubeError,
					EveryKWh: r.Strategies[0].Annual.Energy, BinnedKWh: e.KWh * r.Period.Factor}
			}
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
