package study

import (
	"fmt"
	"math"
	"time"

	"wattstage/curves"
	"wattstage/optimize"
)

// Period is what the profile covers and how it is brought to a year.
//
// Every energy, cost and emission is computed for the period the data
// covers, then scaled to a year by Factor = 8,760 h ÷ CoveredHours (common
// practice: a trend shorter than a year stands for a year only if its
// season is typical, so the scaling is always stated). Demand charges are
// not scaled by hours: see econ.Bill.Annualise.
type Period struct {
	Timed        bool      // the steps are time-stamped (a trend solved interval by interval)
	Start, End   time.Time // first step's start and last step's end; zero for bins
	Hours        float64   // hours from Start to End (the span); for bins, CoveredHours
	CoveredHours float64   // hours the steps stand for
	Factor       float64   // HoursPY / CoveredHours; 0 when the steps cover no hours
}

// Coverage is the share of the span the steps cover (1 for bins).
func (p Period) Coverage() float64 {
	if p.Hours <= 0 {
		return 0
	}
	return p.CoveredHours / p.Hours
}

// PeriodOf measures the steps.
func PeriodOf(steps []optimize.Step) Period {
	var p Period
	for _, st := range steps {
		p.CoveredHours += st.Hours
	}
	p.Hours = p.CoveredHours
	if len(steps) > 0 && steps[0].Timed() {
		p.Timed = true
		last := steps[len(steps)-1]
		p.Start = steps[0].Time
		p.End = last.Time.Add(time.Duration(last.Hours * float64(time.Hour)))
		p.Hours = p.End.Sub(p.Start).Hours()
	}
	if p.CoveredHours > 0 {
		p.Factor = curves.HoursPY / p.CoveredHours
	}
	return p
}

// warning says how the period was brought to a year, or nothing when
// it is a year of bins.
func (p Period) warning() string {
	switch {
	case p.Factor == 0:
		return "the profile covers no hours: nothing can be brought to a year"
	case p.Timed:
		return fmt.Sprintf("the trend covers %s h from %s to %s (%.1f %% of that span); energy, cost and emissions are scaled to a year by 8,760 ÷ %s = %.4f and demand charges by the mean of the covered months' peaks; a season that is not typical of the year makes the annual figures wrong",
			groupedDec(p.CoveredHours, 1), p.Start.Format("2006-01-02 15:04"), p.End.Format("2006-01-02 15:04"), 100*p.Coverage(),
			groupedDec(p.CoveredHours, 1), p.Factor)
	case math.Abs(p.CoveredHours-curves.HoursPY) > 0.5:
		return fmt.Sprintf("the bins hold %s h, not a year of 8,760 h: energy, cost and emissions are scaled to a year by %.4f",
			groupedDec(p.CoveredHours, 1), p.Factor)
	}
	return ""
}
