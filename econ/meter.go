package econ

import (
	"fmt"
	"time"

	"wattstage/curves"
)

// Meter prices a time-stamped energy series one sample at a time, as Cost
// does a whole series, so that a series of any length is priced in memory
// that does not grow with it: the bill's months and periods, not its
// samples, are kept. The bill it gives is the one Cost gives for the same
// samples, bit for bit (the sums are made in the same order), without
// SampleCost: Add returns each sample's cost instead.
type Meter struct {
	t      Tariff
	b      *Bill
	months map[[2]int]int // (year, month) → index in b.Months
	// The month of the last hour priced: a series runs in time order, so
	// nearly every hour is in it and skips the map.
	lastKey [2]int
	lastIdx int     // -1 before the first
	longest float64 // h, the longest sample
	n       int     // samples added
	err     error   // the first bad sample
}

// NewMeter returns a meter for a time-stamped series under the tariff.
func NewMeter(t Tariff) (*Meter, error) {
	if err := t.Validate(); err != nil {
		return nil, err
	}
	return &Meter{t: t, b: newBill(&t, true), months: map[[2]int]int{}, lastIdx: -1}, nil
}

// Add prices the next sample and returns its energy cost (currency). A
// sample Cost would refuse is not priced (0 is returned) and Bill reports
// the first such.
func (m *Meter) Add(s Sample) float64 {
	i := m.n
	m.n++
	if m.err != nil {
		return 0
	}
	switch {
	case !nonNegative(s.Hours):
		m.err = fmt.Errorf("%w: samples[%d]: hours %g must be a finite number ≥ 0", ErrSeries, i, s.Hours)
	case !nonNegative(float64(s.Power)):
		m.err = fmt.Errorf("%w: samples[%d]: power %g W must be a finite number ≥ 0", ErrSeries, i, float64(s.Power))
	case s.Start.IsZero():
		m.err = fmt.Errorf("%w: samples[%d] has no start; a meter prices time-stamped samples only", ErrSeries, i)
	case s.Hours > maxTimedHours:
		m.err = fmt.Errorf("%w: samples[%d]: a time-stamped interval of %g h is longer than a month", ErrSeries, i, s.Hours)
	}
	if m.err != nil {
		return 0
	}
	return m.price(s)
}

// Bill finishes the bill: the monthly demand, the totals and the warnings.
// Call it once, after the last Add.
func (m *Meter) Bill() (*Bill, error) {
	if m.err != nil {
		return nil, m.err
	}
	m.finish()
	b := m.b
	b.Total = b.EnergyCost + b.DemandCost
	b.Emissions = b.Energy * m.t.EmissionsFactor
	return b, nil
}

// price adds one checked sample to the bill, hour by hour of its local
// clock, and returns its energy cost.
func (m *Meter) price(s Sample) float64 {
	b, t := m.b, &m.t
	cost := 0.0
	kw := float64(s.Power) / curves.KW
	m.longest = max(m.longest, s.Hours)
	if s.Hours > 0 {
		b.PeakKW = max(b.PeakKW, kw)
	}
	b.Hours += s.Hours
	end := s.Start.Add(time.Duration(s.Hours * float64(time.Hour)))
	for from := s.Start; from.Before(end); {
		y, mo, _ := from.Date()
		// the local hour ends an hour after it started; subtracting the
		// wall-clock minutes keeps this right across clock changes
		next := from.Add(time.Hour - time.Duration(from.Minute())*time.Minute -
			time.Duration(from.Second())*time.Second - time.Duration(from.Nanosecond()))
		to := minTime(next, end)
		h := to.Sub(from).Hours()
		wd := from.Weekday()
		price, pi := t.price(from.Hour(), wd == time.Saturday || wd == time.Sunday)
		e := kw * h
		b.Energy += e
		b.EnergyCost += e * price
		cost += e * price
		if b.Periods != nil {
			u := b.periodSlot(pi)
			u.Hours += h
			u.Energy += e
			u.Cost += e * price
		}
		key := [2]int{y, int(mo)}
		mi := m.lastIdx
		if mi < 0 || key != m.lastKey {
			var ok bool
			if mi, ok = m.months[key]; !ok {
				mi = len(b.Months)
				m.months[key] = mi
				b.Months = append(b.Months, Month{Year: y, Month: mo})
			}
			m.lastKey, m.lastIdx = key, mi
		}
		mon := &b.Months[mi]
		mon.Hours += h
		mon.Energy += e
		mon.EnergyCost += e * price
		mon.PeakKW = max(mon.PeakKW, kw)
		from = to
	}
	return cost
}

// finish levies each month's demand charge and adds the warnings.
func (m *Meter) finish() {
	b, t := m.b, &m.t
	sortMonths(b.Months)
	for i := range b.Months {
		mo := &b.Months[i]
		mo.DemandCost = mo.PeakKW * t.DemandCharge
		b.DemandCost += mo.DemandCost
	}
	if t.DemandCharge > 0 && m.longest > 0.25+1e-9 {
		b.Warnings = append(b.Warnings, fmt.Sprintf(
			"demand charged on %g-hour mean power; a utility meter's 15-minute peak is usually somewhat higher", m.longest))
	}
	if t.DemandCharge > 0 && len(b.Months) > 0 {
		if f := b.Months[0]; f.Hours < 0.9*monthHours(f.Year, f.Month) {
			b.Warnings = append(b.Warnings, fmt.Sprintf("%s %d is only partly covered (%.0f h): the period's bill charges its whole month of demand; a year weights it by the share covered", f.Month, f.Year, f.Hours))
		}
		if n := len(b.Months); n > 1 {
			if l := b.Months[n-1]; l.Hours < 0.9*monthHours(l.Year, l.Month) {
				b.Warnings = append(b.Warnings, fmt.Sprintf("%s %d is only partly covered (%.0f h): the period's bill charges its whole month of demand; a year weights it by the share covered", l.Month, l.Year, l.Hours))
			}
		}
	}
}
