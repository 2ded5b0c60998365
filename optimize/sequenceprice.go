package optimize

import (
	"fmt"
	"math"
)

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
		var cur Strategy = NewStaged("current thresholds", p, *p.Sequence)
		if p.Sequence.ByBands() {
			cur = NewBanded("current sequence", p, *p.Sequence)
		}
		pr.Current, pr.HasCurrent = Sum(cur.Run(steps), steps), true
		pr.CurrentExtraPct = 100 * (pr.Current.KWh/pr.Optimum.KWh - 1)
	}
	for _, e := range []Energy{pr.Sequence, pr.Current} {
		if e.Name != "" && math.Abs(e.HoursUnmet-pr.Optimum.HoursUnmet) > 1e-9 {
			pr.Warnings = append(pr.Warnings, fmt.Sprintf("%s leaves %.1f h unserved, the optimum %.1f h: the energies cover different hours",
				e.Name, e.HoursUnmet, pr.Optimum.HoursUnmet))
		}
	}
	var over, fast float64
	for i, st := range steps {
		for _, u := range seqRun.Points[i].Units {
			if seqRun.Points[i].Status != Served {
				continue
			}
			if u.Load > 1+1e-9 {
				over += st.Hours
			}
			if u.Speed > 1+1e-9 {
				fast += st.Hours
			}
		}
	}
	if over > 0 {
		pr.Warnings = append(pr.Warnings, fmt.Sprintf("the derived sequence runs motors into their service factor for %.0f unit-hours over the profile: confirm with the motor manufacturer", over))
	}
	if fast > 0 {
		pr.Warnings = append(pr.Warnings, fmt.Sprintf("the derived sequence runs units above rated speed for %.0f unit-hours over the profile: confirm the pump, motor and coupling are rated for it", fast))
	}
	for _, m := range cy.Models {
		if m.Over {
			pr.Warnings = append(pr.Warnings, fmt.Sprintf("%s: up to %d starts in one hour, above the %.1f per hour NEMA MG 10 guidance (from memory) for its motor; lengthen the delays or widen the deadband",
				m.Name, m.MaxPerHour, m.Allowed))
		}
	}
	return pr
}
