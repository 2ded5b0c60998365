package optimize

import (
	"fmt"

	"wattstage/curves"
	"wattstage/econ"
	"wattstage/plant"
)

// Strategy keys, as the --baseline flag and reports name them.
const (
	KeyLowest    = "lowest"
	KeyCommon    = "common"
	KeyCurrent   = "current"
	KeyDerived   = "derived"
	KeyPartial   = "partial"
	KeyThrottled = "throttled"
	KeyBypass    = "bypass"
)

// DefaultBaseline is the strategy savings are counted against when none is
// chosen: the plant's current sequence where the file gives one (the plant
// runs on drives today: the question is tuning), else fixed speed with
// throttling (the question is a drive retrofit).
func DefaultBaseline(p *plant.Plant) string {
	if p.Sequence != nil && drives(p) > 0 {
		return KeyCurrent
	}
	return KeyThrottled
}

// PlanOptions set up an annual comparison.
type PlanOptions struct {
	// Baseline is the key of the strategy savings are counted against;
	// empty means DefaultBaseline.
	Baseline string
	// Sensitivities are the cases of the savings range; nil means
	// DefaultSensitivities, an empty non-nil slice none.
	Sensitivities []Sensitivity
	// Extra strategies to compare (e.g. a derived setpoint sequence), each
	// with its key.
	Extra []Keyed
	// Binned, when set, are the same profile's steps binned by flow: the
	// lowest-power staging is also run on them and the totals compared.
	Binned []Step
	// Progress, when set, is called before each strategy runs.
	Progress func(label string, i, n int)
}

// Keyed is a strategy with its key.
type Keyed struct {
	Key      string
	Strategy Strategy
}

// Outcome is one strategy's year.
type Outcome struct {
	Key         string
	Run         Run
	Energy      Energy
	Bill        *econ.Bill
	DrivesAdded int             // drives bought against the baseline
	Appraisal   *econ.Appraisal // against the baseline; nil for the baseline itself
}

// RangeCase is the lowest-power strategy's savings in one sensitivity case.
type RangeCase struct {
	Sensitivity Sensitivity
	BaselineKWh float64
	LowestKWh   float64
	SavedKWh    float64
	SavedCost   float64 // energy and demand, currency/yr
}

// Plan is the annual comparison of every strategy on one plant.
type Plan struct {
	Plant    *plant.Plant
	Steps    []Step
	Outcomes []Outcome
	// Strategies are the strategies that made the outcomes, in their order.
	Strategies []Keyed
	Baseline   int // index into Outcomes
	PartLoad   []PartLoadCheck
	UnitOut    *UnitOutCheck
	Range      []RangeCase // low and high cases; the expected case is the Outcome
	// BinnedKWh is the lowest-power staging's energy on PlanOptions.Binned
	// (0 when none was given), to compare with the point-by-point total.
	BinnedKWh float64
	Warnings  []string
}

// Strategies returns the standard strategies for a plant, in report order.
func Strategies(p *plant.Plant) []Keyed {
	common := NewLowest("best count, one common speed", p, Options{CommonSpeed: true})
	common.Note = "the lowest-power count of running units, all at one common speed signal"
	ks := []Keyed{
		{KeyLowest, NewLowest("lowest-power staging", p, Options{})},
		{KeyCommon, common},
	}
	if p.Sequence != nil && drives(p) > 0 {
		ks = append(ks, Keyed{KeyCurrent, NewStaged("current sequence", p, *p.Sequence)})
	}
	if v, label := partialRetrofit(p); v != nil {
		l := NewLowest(label, v, Options{})
		l.Note = "lowest-power staging with one unit of the largest model left across the line (a partial drive retrofit)"
		ks = append(ks, Keyed{KeyPartial, l})
	}
	ks = append(ks,
		Keyed{KeyThrottled, NewThrottled("fixed speed, throttled", p)},
		Keyed{KeyBypass, NewConstantBypass("constant flow, bypass", p)},
	)
	return ks
}

// partialRetrofit returns the plant with drives on all but one unit of its
// largest model (e.g. "drives on 2 of 3"), where that is a real choice.
func partialRetrofit(p *plant.Plant) (*plant.Plant, string) {
	total, withDrive := 0, 0
	big, bp := -1, 0.0
	for i, m := range p.Models {
		total += m.Count
		if m.Drive.Variable() {
			withDrive += m.Count
			if hp := float64(m.Pump.BEPFlow) * float64(m.Pump.BEPHead); hp > bp {
				big, bp = i, hp
			}
		}
	}
	if big < 0 || withDrive < 2 {
		return nil, ""
	}
	w := make([]int, len(p.Models))
	for i, m := range p.Models {
		if m.Drive.Variable() {
			w[i] = m.Count
		}
	}
	w[big]--
	v := PartialVariant(p, w, p.Models[big].Drive)
	return v, fmt.Sprintf("drives on %d of %d units", withDrive-1, total)
}

// NewPlan runs every strategy over the steps, prices them and appraises
// each against the baseline.
func NewPlan(p *plant.Plant, steps []Step, opt PlanOptions) (*Plan, error) {
	ks := append(Strategies(p), opt.Extra...)
	base := opt.Baseline
	if base == "" {
		base = DefaultBaseline(p)
	}
	pl := &Plan{Plant: p, Steps: steps, Baseline: -1, Strategies: ks}
	for i, k := range ks {
		if opt.Progress != nil {
			opt.Progress(k.Strategy.Name(), i, len(ks))
		}
		run := k.Strategy.Run(steps)
		o := Outcome{Key: k.Key, Run: run, Energy: Sum(run, steps)}
		bill, err := econ.Cost(p.Tariff, samples(o.Energy, steps))
		if err != nil {
			return nil, err
		}
		o.Bill = bill
		pl.Outcomes = append(pl.Outcomes, o)
		if k.Key == base {
			pl.Baseline = i
		}
	}
	if pl.Baseline < 0 {
		var keys []string
		for _, k := range ks {
			keys = append(keys, k.Key)
		}
		return nil, fmt.Errorf("optimize: no strategy %q to use as baseline (have %v)", base, keys)
	}
	b := &pl.Outcomes[pl.Baseline]
	for i := range pl.Outcomes {
		o := &pl.Outcomes[i]
		if i == pl.Baseline {
			continue
		}
		o.DrivesAdded = max(0, o.Run.Drives-b.Run.Drives)
		terms := p.Retrofit
		if o.DrivesAdded == 0 {
			terms.OtherCost = 0 // the other retrofit costs come with drives
		}
		a, err := econ.Appraise(terms, b.Bill, o.Bill, o.DrivesAdded)
		if err != nil {
			return nil, err
		}
		o.Appraisal = a
		if o.Energy.HoursUnmet > b.Energy.HoursUnmet {
			pl.Warnings = append(pl.Warnings, fmt.Sprintf("%s leaves %.0f h unmet (baseline %.0f h): its savings count energy it did not deliver",
				o.Run.Name, o.Energy.HoursUnmet, b.Energy.HoursUnmet))
		}
	}
	pl.Warnings = append(pl.Warnings, beatenNotes(pl)...)
	if p.DesignFlow > 0 {
		pl.PartLoad = append(pl.PartLoad, CheckPartLoad("lowest-power staging", p, ks[0].Strategy))
		for _, k := range ks {
			if k.Key == KeyCurrent {
				pl.PartLoad = append(pl.PartLoad, CheckPartLoad("current sequence", p, k.Strategy))
			}
		}
	}
	if uo, err := CheckUnitOut(p, Options{}); err == nil {
		pl.UnitOut = &uo
	}
	if len(opt.Binned) > 0 {
		pl.BinnedKWh = Sum(ks[0].Strategy.Run(opt.Binned), opt.Binned).KWh
	}
	sens := opt.Sensitivities
	if sens == nil {
		sens = DefaultSensitivities
	}
	for _, s := range sens {
		rc, err := rangeCase(p, steps, s, base)
		if err != nil {
			return nil, err
		}
		pl.Range = append(pl.Range, rc)
	}
	return pl, nil
}

// rangeCase reruns the lowest-power staging and the baseline on a varied
// plant.
func rangeCase(p *plant.Plant, steps []Step, s Sensitivity, base string) (RangeCase, error) {
	v := Vary(p, s)
	var lowest, baseline Strategy
	for _, k := range Strategies(v) {
		if k.Key == KeyLowest {
			lowest = k.Strategy
		}
		if k.Key == base {
			baseline = k.Strategy
		}
	}
	if baseline == nil {
		baseline = NewThrottled("baseline", v)
	}
	le, be := Sum(lowest.Run(steps), steps), Sum(baseline.Run(steps), steps)
	lb, err := econ.Cost(p.Tariff, samples(le, steps))
	if err != nil {
		return RangeCase{}, err
	}
	bb, err := econ.Cost(p.Tariff, samples(be, steps))
	if err != nil {
		return RangeCase{}, err
	}
	return RangeCase{Sensitivity: s, BaselineKWh: be.KWh, LowestKWh: le.KWh, SavedKWh: be.KWh - le.KWh,
		SavedCost: bb.Total - lb.Total}, nil
}

// samples turns an energy series into tariff samples.
func samples(e Energy, steps []Step) []econ.Sample {
	out := make([]econ.Sample, len(steps))
	for i, st := range steps {
		out[i] = econ.Sample{Start: st.Time, Hours: st.Hours, Power: curves.Power(e.KW[i] * 1000)}
	}
	return out
}

// Outcome returns the outcome with the key, or nil.
func (pl *Plan) Outcome(key string) *Outcome {
	for i := range pl.Outcomes {
		if pl.Outcomes[i].Key == key {
			return &pl.Outcomes[i]
		}
	}
	return nil
}

// beatenNotes says where a strategy on other equipment (fewer drives)
// draws less than the lowest-power staging: near full speed a drive's own
// losses can exceed what speed control saves.
func beatenNotes(pl *Plan) []string {
	lo := pl.Outcome(KeyLowest)
	if lo == nil {
		return nil
	}
	var out []string
	for _, o := range pl.Outcomes {
		if o.Key == KeyLowest || o.Run.Drives >= lo.Run.Drives {
			continue
		}
		hours, worst := 0.0, 0.0
		for i, st := range pl.Steps {
			a, b := lo.Run.Points[i], o.Run.Points[i]
			if a.Status == Served && b.Status == Served && b.Power < a.Power {
				hours += st.Hours
				worst = max(worst, float64(a.Power-b.Power)/float64(a.Power))
			}
		}
		if hours > 0 {
			out = append(out, fmt.Sprintf("%s draws less than the lowest-power staging for %.0f h (by up to %.1f %%): near full speed a drive's own losses exceed what speed control saves there; a drive bypass would recover it",
				o.Run.Name, hours, 100*worst))
		}
	}
	return out
}
