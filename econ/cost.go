package econ

import (
	"fmt"
	"math"
	"time"

	"wattstage/curves"
)

// Sample is the mean electrical power drawn over one interval of an energy
// series: an interval of a time-stamped profile, or a bin of an untimed one.
type Sample struct {
	Start time.Time    // start of the interval, in the zone whose clock the tariff follows; zero for an untimed bin
	Hours float64      // length of the interval, or a bin's hours a year, h
	Power curves.Power // mean electrical input over the interval, W
}

// maxTimedHours bounds one time-stamped sample: an interval longer than a
// month cannot be given a month's demand.
const maxTimedHours = 31 * 24

// PeriodUse is the energy and cost in one time-of-use period.
type PeriodUse struct {
	Name   string  // the period's name; "outside periods" for the rest
	Hours  float64 // h
	Energy float64 // kWh
	Cost   float64 // currency
}

// Month is one calendar month of a time-stamped bill.
type Month struct {
	Year       int
	Month      time.Month
	Hours      float64 // h of the series in the month
	Energy     float64 // kWh
	PeakKW     float64 // highest interval mean power, kW
	EnergyCost float64 // currency
	DemandCost float64 // currency: PeakKW × the demand charge
}

// Bill is the cost of an energy series under a tariff.
type Bill struct {
	Timed      bool        // the series was time-stamped
	Hours      float64     // h
	Energy     float64     // kWh
	PeakKW     float64     // highest interval mean power, kW
	EnergyCost float64     // currency
	DemandCost float64     // currency
	Total      float64     // EnergyCost + DemandCost
	Emissions  float64     // kg CO₂e: Energy × the tariff's factor
	Periods    []PeriodUse // per time-of-use period, then "outside periods"; nil for a flat tariff
	Months     []Month     // per calendar month, for a time-stamped series
	Warnings   []string    // estimates the bill rests on
	// SampleCost is the energy cost of each sample, in the series' order
	// (currency); it adds up to EnergyCost. Untimed bins are priced at the
	// same week-share price as the whole bill.
	SampleCost []float64 `json:"-"`
}

// Cost prices an energy series under a tariff.
//
// A time-stamped series is priced hour by hour of the local clock of each
// sample's Start (an interval crossing an hour boundary is split at it), so
// time-of-use periods apply exactly, and the demand charge is levied on each
// calendar month's highest interval mean power. Holidays are not modelled:
// they are priced as the weekday or weekend they fall on.
//
// An untimed series (bins) cannot be placed in the day. Time-of-use energy
// is then estimated by the share of the week's 168 hours each period covers,
// which assumes the load does not depend on the time of day (it usually
// does, so the estimate is rough), and the demand charge by the highest bin
// power applied to all 12 months. Both estimates come with a warning.
//
// Demand from hourly means understates a utility's peak, which is usually
// the highest 15-minute mean; for pump groups, whose load changes slowly,
// the difference is small, and a warning says so when the intervals are
// longer than 15 minutes.
func Cost(t Tariff, series []Sample) (*Bill, error) {
	if err := t.Validate(); err != nil {
		return nil, err
	}
	timed := 0
	for i, s := range series {
		switch {
		case !nonNegative(s.Hours):
			return nil, fmt.Errorf("%w: samples[%d]: hours %g must be a finite number ≥ 0", ErrSeries, i, s.Hours)
		case !nonNegative(float64(s.Power)):
			return nil, fmt.Errorf("%w: samples[%d]: power %g W must be a finite number ≥ 0", ErrSeries, i, float64(s.Power))
		case !s.Start.IsZero() && s.Hours > maxTimedHours:
			return nil, fmt.Errorf("%w: samples[%d]: a time-stamped interval of %g h is longer than a month", ErrSeries, i, s.Hours)
		}
		if !s.Start.IsZero() {
			timed++
		}
	}
	if timed != 0 && timed != len(series) {
		return nil, fmt.Errorf("%w: %d of %d samples are time-stamped; give all or none a start", ErrSeries, timed, len(series))
	}
	b := newBill(&t, timed > 0 && timed == len(series))
	b.SampleCost = make([]float64, len(series))
	if b.Timed {
		b.costTimed(&t, series)
	} else {
		b.costUntimed(&t, series)
	}
	b.Total = b.EnergyCost + b.DemandCost
	b.Emissions = b.Energy * t.EmissionsFactor
	return b, nil
}

// newBill is an empty bill with a slot for each time-of-use period.
func newBill(t *Tariff, timed bool) *Bill {
	b := &Bill{Timed: timed}
	if len(t.Periods) > 0 {
		b.Periods = make([]PeriodUse, len(t.Periods)+1)
		for i := range t.Periods {
			b.Periods[i].Name = t.PeriodName(i)
		}
		b.Periods[len(t.Periods)].Name = t.PeriodName(-1)
	}
	return b
}

// periodSlot is where a period's use is kept in Bill.Periods: the periods
// in order, then the hours outside them.
func (b *Bill) periodSlot(i int) *PeriodUse {
	if i < 0 {
		return &b.Periods[len(b.Periods)-1]
	}
	return &b.Periods[i]
}

func (b *Bill) costTimed(t *Tariff, series []Sample) {
	m := &Meter{t: *t, b: b, months: map[[2]int]int{}, lastIdx: -1}
	for si, s := range series {
		b.SampleCost[si] = m.price(s)
	}
	m.finish()
}

func monthHours(y int, m time.Month) float64 {
	return float64(time.Date(y, m+1, 1, 0, 0, 0, 0, time.UTC).Sub(time.Date(y, m, 1, 0, 0, 0, 0, time.UTC)).Hours())
}

func minTime(a, b time.Time) time.Time {
	if a.Before(b) {
		return a
	}
	return b
}

func sortMonths(ms []Month) {
	for i := 1; i < len(ms); i++ {
		for j := i; j > 0 && (ms[j].Year < ms[j-1].Year || ms[j].Year == ms[j-1].Year && ms[j].Month < ms[j-1].Month); j-- {
			ms[j], ms[j-1] = ms[j-1], ms[j]
		}
	}
}

func (b *Bill) costUntimed(t *Tariff, series []Sample) {
	for _, s := range series {
		kw := float64(s.Power) / curves.KW
		b.Hours += s.Hours
		b.Energy += kw * s.Hours
		if s.Hours > 0 {
			b.PeakKW = max(b.PeakKW, kw)
		}
	}
	price := t.EnergyPrice
	if len(t.Periods) > 0 {
		price = 0
		for i := -1; i < len(t.Periods); i++ {
			share := t.WeekShare(i)
			p := t.EnergyPrice
			if i >= 0 {
				p = t.Periods[i].Price
			}
			price += share * p
			u := b.periodSlot(i)
			u.Hours = share * b.Hours
			u.Energy = share * b.Energy
			u.Cost = share * b.Energy * p
		}
		b.Warnings = append(b.Warnings, "time-of-use prices applied to untimed bins by each period's share of the week's hours (load assumed independent of the time of day)")
	}
	b.EnergyCost = b.Energy * price
	for i, s := range series {
		b.SampleCost[i] = float64(s.Power) / curves.KW * s.Hours * price
	}
	if t.DemandCharge > 0 {
		b.DemandCost = 12 * b.PeakKW * t.DemandCharge
		b.Warnings = append(b.Warnings, "demand charge estimated from untimed bins: the highest bin power applied to all 12 months")
		if math.Abs(b.Hours-curves.HoursPY) > 0.01*curves.HoursPY {
			b.Warnings = append(b.Warnings, fmt.Sprintf("the bins hold %.0f h, not a year (%d h), yet bear 12 months of demand charge", b.Hours, curves.HoursPY))
		}
	}
}
