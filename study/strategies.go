package study

import (
	"fmt"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
)

// Strategy keys, as the --baseline flag, the JSON and the reports name them.
const (
	KeyLowest    = "lowest"
	KeyCommon    = "common"
	KeyCurrent   = "current"
	KeyDerived   = "derived"
	KeyPartial   = "partial"
	KeyThrottled = "throttled"
	KeyBypass    = "bypass"
	KeyNoReset   = "noreset"
	KeyLoggedDP  = "loggeddp"
	KeyPreferred = "preferred"
	KeyBypassed  = "drivebypass"
)

// DefaultBaseline is the strategy savings are counted against when none is
// chosen: the plant's current sequence where the file gives one (the plant
// runs on drives today: the question is tuning), else fixed speed with
// throttling (the question is a drive retrofit).
func DefaultBaseline(p *plant.Plant) string {
	if p.Sequence != nil {
		return KeyCurrent
	}
	return KeyThrottled
}

// Keyed is a strategy with its key.
type Keyed struct {
	Key      string
	Strategy optimize.Strategy
}

// Strategies returns the standard strategies for a plant, in report order;
// sp, when not nil, adds the derived setpoint sequence.
func Strategies(p *plant.Plant, sp *optimize.Setpoints) []Keyed {
	common := optimize.NewLowest("best count, one common speed", p, optimize.Options{CommonSpeed: true})
	common.Note = "the lowest-power count of running units, all at one common speed signal"
	ks := []Keyed{
		{KeyLowest, optimize.NewLowest("lowest-power staging", p, optimize.Options{})},
		{KeyCommon, common},
	}
	switch {
	case p.Sequence == nil:
	case p.Sequence.ByBands():
		ks = append(ks, Keyed{KeyCurrent, optimize.NewBanded("current sequence", p, *p.Sequence)})
	case optimize.Drives(p) > 0:
		ks = append(ks, Keyed{KeyCurrent, optimize.NewStaged("current sequence", p, *p.Sequence)})
	}
	if v := withoutReset(p); v != nil {
		l := optimize.NewLowest("lowest-power, no DP reset", v, optimize.Options{})
		l.Note = "the lowest-power staging with the control head held at its design setpoint (no reset): the value of the reset itself"
		ks = append(ks, Keyed{KeyNoReset, l})
	}
	pref := optimize.NewLowest("lowest-power, preferred region", p, optimize.Options{PreferredOnly: true})
	pref.Note = "the lowest-power staging with every unit kept inside 70–120 % of BEP flow at its speed (ANSI/HI 9.6.3): what staying in the preferred region costs"
	ks = append(ks, Keyed{KeyPreferred, pref})
	if b := optimize.NewDriveBypass("lowest-power, drive bypass", p); b != nil {
		ks = append(ks, Keyed{KeyBypassed, b})
	}
	if v, label := partialRetrofit(p); v != nil {
		l := optimize.NewLowest(label, v, optimize.Options{})
		l.Note = "lowest-power staging with one unit of the largest model left across the line (a partial drive retrofit)"
		ks = append(ks, Keyed{KeyPartial, l})
	}
	ks = append(ks,
		Keyed{KeyThrottled, optimize.NewThrottled("fixed speed, throttled", p)},
		Keyed{KeyBypass, optimize.NewConstantBypass("constant flow, bypass", p)},
	)
	if sp != nil && len(sp.Transitions) > 0 {
		ks = append(ks, Keyed{KeyDerived, optimize.NewSequenced("derived setpoints", sp, sp.Signal)})
	}
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
	v := optimize.PartialVariant(p, w, p.Models[big].Drive)
	installed := 0
	for _, m := range p.Models {
		installed += m.Installed()
	}
	return v, fmt.Sprintf("drives on %d of %d units", optimize.Drives(v), installed)
}

// withoutReset returns the plant with its differential-pressure setpoint
// held at the design control head, or nil when it has no reset.
func withoutReset(p *plant.Plant) *plant.Plant {
	dp, ok := p.System.(curves.DPControl)
	if !ok || dp.Reset == nil {
		return nil
	}
	q := *p
	dp.Reset = nil
	q.System = dp
	return &q
}
