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
// covers, then scaled to a year by Factor = AnnualHours ÷ CoveredHours
// (common practice: a trend shorter than a year stands for a year only if
// its season is typical, so the scaling is always stated). AnnualHours is
// the plant file's profile.annual_hours, else 8,760 h for a trend and the
// bins' own hours for bins, which are hours a year with the plant off for
// the rest. Demand charges are not scaled by hours: see
// econ.Bill.Annualise.
type Period struct {
	Timed        bool      // the steps are time-stamped (a trend solved interval by interval)
	Start, End   time.Time // first step's start and last step's end; zero for bins
	Hours        float64   // hours from Start to End (the span); for bins, CoveredHours
	CoveredHours float64   // hours the steps stand for
	AnnualHours  float64   // the hours a year the steps stand for
	Factor       float64   // AnnualHours / CoveredHours; 0 when the steps cover no hours
	// Given is true when the plant file set the annual hours.
	Given bool
}

// Coverage is the share of the span the steps cover (1 for bins).
func (p Period) Coverage() float64 {
	if p.Hours <= 0 {
		return 0
	}
	return p.CoveredHours / p.Hours
}

// PeriodOf measures the steps; annualHours is the plant file's
// profile.annual_hours (0 = the default).
func PeriodOf(steps []optimize.Step, annualHours float64) Period {
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
	switch {
	case annualHours > 0:
		p.AnnualHours, p.Given = annualHours, true
	case p.Timed:
		p.AnnualHours = curves.HoursPY
	default:
		p.AnnualHours = p.CoveredHours
	}
	if p.CoveredHours > 0 {
		p.Factor = p.AnnualHours / p.CoveredHours
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
		return fmt.Sprintf("the trend covers %s h from %s to %s (%.1f %% of that span); energy, cost and emissions are scaled to a year of %s h by %s ÷ %s = %.4f and demand charges by the mean of the covered months' peaks; a season that is not typical of the year makes the annual figures wrong",
			groupedDec(p.CoveredHours, 1), p.Start.Format("2006-01-02 15:04"), p.End.Format("2006-01-02 15:04"), 100*p.Coverage(),
			Grouped(p.AnnualHours), Grouped(p.AnnualHours), groupedDec(p.CoveredHours, 1), p.Factor)
	case p.Given && math.Abs(p.Factor-1) > 1e-9:
		return fmt.Sprintf("the bins hold %s h; profile.annual_hours makes them %s h a year: energy, cost and emissions are scaled by %.4f",
			groupedDec(p.CoveredHours, 1), Grouped(p.AnnualHours), p.Factor)
	case !p.Given && math.Abs(p.CoveredHours-curves.HoursPY) > 0.5:
		return fmt.Sprintf("the bins hold %s h a year, not 8,760 h: the plant is taken as off for the other %s h (give profile.annual_hours to scale the bins to more hours instead)",
			groupedDec(p.CoveredHours, 1), groupedDec(curves.HoursPY-p.CoveredHours, 1))
	}
	return ""
}
