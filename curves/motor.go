package curves

import (
	"errors"
	"fmt"
	"math"
	"sort"
)

// LoadEff is one row of a user table: efficiency (0–1) at a load fraction.
type LoadEff struct {
	Load float64 // fraction of rated output (motor) or rated load (drive)
	Eff  float64 // 0–1
}

// Table errors.
var (
	ErrTableShort    = errors.New("curves: an efficiency table needs at least 2 rows")
	ErrTableOrder    = errors.New("curves: table loads must rise strictly")
	ErrTableEffRange = errors.New("curves: table efficiency must be above 0 and at most 100 %")
)

// CheckTable validates a load/efficiency table.
func CheckTable(t []LoadEff) error {
	if len(t) < 2 {
		return ErrTableShort
	}
	for i, r := range t {
		if !finite(r.Load) || !finite(r.Eff) {
			return fmt.Errorf("row %d: %w", i+1, ErrNotFinite)
		}
		if r.Eff <= 0 || r.Eff > 1 {
			return fmt.Errorf("row %d: %w", i+1, ErrTableEffRange)
		}
		if r.Load < 0 || (i > 0 && r.Load <= t[i-1].Load) {
			return fmt.Errorf("row %d: %w", i+1, ErrTableOrder)
		}
	}
	return nil
}

// interpTable interpolates linearly, holding the end values outside the
// table.
func interpTable(t []LoadEff, load float64) float64 {
	if load <= t[0].Load {
		return t[0].Eff
	}
	n := len(t)
	if load >= t[n-1].Load {
		return t[n-1].Eff
	}
	i := sort.Search(n, func(i int) bool { return t[i].Load >= load })
	a, b := t[i-1], t[i]
	return a.Eff + (b.Eff-a.Eff)*(load-a.Load)/(b.Load-a.Load)
}

// Motor is an induction motor's rating and part-load behaviour.
type Motor struct {
	Rated         Power     // rated output, W
	FullLoadEff   float64   // nominal full-load efficiency, 0–1
	ServiceFactor float64   // allowed continuous overload factor; 0 means 1.15
	Table         []LoadEff // optional part-load efficiency table; nil uses the DOE loss factor
}

// DefaultServiceFactor is the usual NEMA service factor of general-purpose
// open and TEFC motors (common practice).
const DefaultServiceFactor = 1.15

// SF returns the service factor, defaulted.
func (m Motor) SF() float64 {
	if m.ServiceFactor == 0 {
		return DefaultServiceFactor
	}
	return m.ServiceFactor
}

// FullLoadLoss returns P_rated (1/η_FL − 1).
func (m Motor) FullLoadLoss() Power {
	return Power(float64(m.Rated) * (1/m.FullLoadEff - 1))
}

// MotorLossFactor is the US DOE default motor part-load loss factor (10 CFR
// 431 subpart Y, appendix A): y(R) = −0.4508 R³ + 1.2399 R² − 0.4301 R + 0.6410,
// part-load losses = y · full-load losses.
func MotorLossFactor(r float64) float64 {
	return ((-0.4508*r+1.2399)*r-0.4301)*r + 0.6410
}

// Loss returns the motor's losses at a shaft output.
func (m Motor) Loss(shaft Power) Power {
	r := float64(shaft) / float64(m.Rated)
	if m.Table != nil {
		e := interpTable(m.Table, r)
		return Power(float64(shaft) * (1/e - 1))
	}
	return Power(MotorLossFactor(r) * float64(m.FullLoadLoss()))
}

// Efficiency returns the motor efficiency at a shaft output.
func (m Motor) Efficiency(shaft Power) float64 {
	if shaft <= 0 {
		return 0
	}
	return float64(shaft) / float64(shaft+m.Loss(shaft))
}

// premiumRow is one row of the full-load efficiency table for enclosed
// (TEFC) motors at 2, 4 and 6 poles, in %.
type premiumRow struct {
	hp         float64
	p2, p4, p6 float64
}

// premiumTEFC is 10 CFR 431.25 Table 5 (= NEMA MG 1 Table 12-12, NEMA
// Premium), enclosed motors. The 4-pole 5/10/25/50/100/200 hp and 2-pole
// 10/50/100 hp values were read in the regulation; the rest are from memory.
var premiumTEFC = []premiumRow{
	{1, 77.0, 85.5, 82.5}, {1.5, 84.0, 86.5, 87.5}, {2, 85.5, 86.5, 88.5},
	{3, 86.5, 89.5, 89.5}, {5, 88.5, 89.5, 89.5}, {7.5, 89.5, 91.7, 91.0},
	{10, 90.2, 91.7, 91.0}, {15, 91.0, 92.4, 91.7}, {20, 91.0, 93.0, 91.7},
	{25, 91.7, 93.6, 93.0}, {30, 91.7, 93.6, 93.0}, {40, 92.4, 94.1, 94.1},
	{50, 93.0, 94.5, 94.1}, {60, 93.6, 95.0, 94.5}, {75, 93.6, 95.4, 94.5},
	{100, 94.1, 95.4, 95.0}, {125, 95.0, 95.4, 95.0}, {150, 95.0, 95.8, 95.8},
	{200, 95.4, 96.2, 95.8}, {250, 95.8, 96.2, 95.8}, {300, 95.8, 96.2, 95.8},
	{350, 95.8, 96.2, 95.8}, {400, 95.8, 96.2, 95.8}, {450, 95.8, 96.2, 95.8},
	{500, 95.8, 96.2, 95.8},
}

// ErrNoDefaultEff is returned where the premium table has no value.
var ErrNoDefaultEff = errors.New("curves: no default motor efficiency for this size and speed (give full_load_efficiency)")

// PoleCount guesses the pole count of an induction motor from its rated
// speed in rpm on 50 or 60 Hz supply (synchronous speed 7200/p or 6000/p
// with a few percent slip).
func PoleCount(rpm float64) int {
	best, bp := math.Inf(1), 0
	for _, p := range []int{2, 4, 6} {
		for _, f := range []float64{50, 60} {
			sync := 120 * f / float64(p)
			if rpm <= sync*1.01 && sync-rpm < best {
				best, bp = sync-rpm, p
			}
		}
	}
	return bp
}

// PremiumEfficiency returns the default full-load efficiency (0–1) of an
// enclosed motor of the given rated output and pole count from 10 CFR 431.25
// Table 5. A size between two rows takes the lower row (the conservative
// choice, common practice).
func PremiumEfficiency(rated Power, poles int) (float64, error) {
	hp := float64(rated) / Horsepower
	if poles != 2 && poles != 4 && poles != 6 || hp < 1-1e-6 || hp > 500+1e-6 {
		return 0, ErrNoDefaultEff
	}
	var row premiumRow
	for _, r := range premiumTEFC {
		if r.hp <= hp*(1+1e-6) {
			row = r
		}
	}
	switch poles {
	case 2:
		return row.p2 / 100, nil
	case 4:
		return row.p4 / 100, nil
	}
	return row.p6 / 100, nil
}
