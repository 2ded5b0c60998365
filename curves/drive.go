package curves

import (
	"errors"
	"fmt"
	"math"
)

// Drive is how a motor is fed: across the line at fixed speed, or through a
// variable-speed drive whose losses follow one of several models.
type Drive interface {
	// Variable reports whether the drive can change speed.
	Variable() bool
	// Input returns the power chain at a shaft output and speed ratio.
	Input(m Motor, shaft Power, speed float64) Chain
	// Electrical returns Input(m, shaft, speed).Electrical, without the
	// efficiency split (the optimiser's hot path).
	Electrical(m Motor, shaft Power, speed float64) Power
	// Describe names the loss model for reports.
	Describe() string
}

// Chain is the power chain of one running unit from shaft to wire.
type Chain struct {
	Shaft      Power   // pump shaft input, W
	Electrical Power   // wire input, W
	MotorEff   float64 // motor efficiency 0–1
	DriveEff   float64 // drive efficiency 0–1 (1 for a fixed-speed unit)
	Load       float64 // motor load fraction R = shaft / rated output
}

// Overall returns the motor × drive efficiency.
func (c Chain) Overall() float64 {
	if c.Electrical <= 0 {
		return 0
	}
	return float64(c.Shaft) / float64(c.Electrical)
}

var (
	_ Drive = FixedSpeed{}
	_ Drive = DOEDrive{}
	_ Drive = TableDrive{}
	_ Drive = IECDrive{}
)

// FixedSpeed is a motor started across the line: no drive losses, speed
// fixed at rated.
type FixedSpeed struct{}

func (FixedSpeed) Variable() bool                                   { return false }
func (FixedSpeed) Describe() string                                 { return "fixed speed (across the line)" }
func (FixedSpeed) Electrical(m Motor, shaft Power, _ float64) Power { return shaft + m.Loss(shaft) }
func (FixedSpeed) Input(m Motor, shaft Power, _ float64) Chain {
	loss := m.Loss(shaft)
	return Chain{Shaft: shaft, Electrical: shaft + loss, MotorEff: m.Efficiency(shaft), DriveEff: 1,
		Load: float64(shaft) / float64(m.Rated)}
}

// DOEDrive is the US DOE pump test procedure default for a motor on a
// continuous (variable-speed) control (10 CFR 431 subpart Y, appendix A):
// combined motor and drive losses = z(R) · full-load motor losses with
// z = A R² + B R + C by motor size, floored so that it is never below the
// motor's own part-load loss fed through a drive at the US DOE Motor
// Systems Tip Sheet #11 efficiency (doeFloor): the appendix A fit drops
// below the motor alone at light load. The split into motor and drive
// efficiency uses the motor's own part-load model for the motor.
type DOEDrive struct{}

// DOEDriveCoefficients returns A, B, C of the DOE motor-and-drive loss factor
// for a motor rated output.
func DOEDriveCoefficients(rated Power) (a, b, c float64) {
	hp := float64(rated) / Horsepower
	switch {
	case hp <= 5:
		return -0.4658, 1.4965, 0.5303
	case hp <= 20:
		return -1.3198, 2.9551, 0.1052
	case hp <= 50:
		return -1.5122, 3.0777, 0.1847
	}
	return -0.8914, 2.8846, 0.2625
}

// DOEDriveLossFactor returns z(R) for a motor of the given rated output.
func DOEDriveLossFactor(rated Power, r float64) float64 {
	a, b, c := DOEDriveCoefficients(rated)
	return (a*r+b)*r + c
}

func (DOEDrive) Variable() bool { return true }
func (DOEDrive) Describe() string {
	return "variable-speed drive, DOE default motor+drive part-load loss"
}

// Electrical is shaft + z(R) · full-load motor losses, or the floor where
// that is higher.
func (DOEDrive) Electrical(m Motor, shaft Power, _ float64) Power {
	r := float64(shaft) / float64(m.Rated)
	e := shaft + Power(DOEDriveLossFactor(m.Rated, r)*float64(m.FullLoadLoss()))
	if shaft > 0 {
		e = max(e, doeFloor(m, shaft))
	}
	return e
}

// DOEFloored reports whether the floor sets the DOE default's input at this
// shaft power (the appendix A fit alone would give less).
func DOEFloored(m Motor, shaft Power) bool {
	r := float64(shaft) / float64(m.Rated)
	return shaft > 0 && shaft+Power(DOEDriveLossFactor(m.Rated, r)*float64(m.FullLoadLoss())) < doeFloor(m, shaft)
}

func (d DOEDrive) Input(m Motor, shaft Power, speed float64) Chain {
	r := float64(shaft) / float64(m.Rated)
	elec := d.Electrical(m, shaft, speed)
	c := Chain{Shaft: shaft, Electrical: elec, Load: r}
	motorIn := shaft + m.Loss(shaft)
	if motorIn > elec || shaft <= 0 {
		c.MotorEff, c.DriveEff = c.Overall(), 1
		return c
	}
	c.MotorEff = float64(shaft) / float64(motorIn)
	c.DriveEff = float64(motorIn) / float64(elec)
	return c
}

// TableDrive is a variable-speed drive whose efficiency follows a user table
// of (load fraction, efficiency), where the load fraction is the motor
// input over the motor's rated input.
type TableDrive struct {
	Table []LoadEff
}

func (TableDrive) Variable() bool   { return true }
func (TableDrive) Describe() string { return "variable-speed drive, efficiency table" }
func (d TableDrive) Electrical(m Motor, shaft Power, speed float64) Power {
	return d.Input(m, shaft, speed).Electrical
}
func (d TableDrive) Input(m Motor, shaft Power, _ float64) Chain {
	motorIn := shaft + m.Loss(shaft)
	ratedIn := float64(m.Rated) / m.FullLoadEff
	de := interpTable(d.Table, float64(motorIn)/ratedIn)
	return Chain{Shaft: shaft, Electrical: Power(float64(motorIn) / de), MotorEff: m.Efficiency(shaft),
		DriveEff: de, Load: float64(shaft) / float64(m.Rated)}
}

// IECPoint is one of the eight IEC 61800-9-2 drive loss points: relative
// motor speed and torque (%) and the loss as a percentage of the drive's
// rated output (here the motor's rated input).
type IECPoint struct {
	Speed, Torque float64 // %, from {0, 50, 90} and {25, 50, 100}
	LossPct       float64 // % of rated power
}

// IECPoints are the eight (speed; torque) operating points of IEC 61800-9-2.
var IECPoints = [8][2]float64{{0, 25}, {0, 50}, {0, 100}, {50, 25}, {50, 50}, {50, 100}, {90, 50}, {90, 100}}

// ErrIECTable is returned for a loss table that does not hold the eight
// IEC 61800-9-2 points once each.
var ErrIECTable = errors.New("curves: IEC 61800-9-2 loss table needs the 8 points (0;25) (0;50) (0;100) (50;25) (50;50) (50;100) (90;50) (90;100) once each")

// IECDrive is a variable-speed drive described by its IEC 61800-9-2 loss
// table. Losses between the points are interpolated bilinearly in speed
// and torque; the missing (90;25) point is taken as (50;25) plus the rise
// from (50;50) to (90;50); outside the grid the nearest edge is extended
// linearly in speed and held in torque.
type IECDrive struct {
	grid [3][3]float64 // [speed 0/50/90][torque 25/50/100], % loss
}

// NewIECDrive checks and stores an 8-point loss table.
func NewIECDrive(pts []IECPoint) (IECDrive, error) {
	var d IECDrive
	seen := map[[2]float64]bool{}
	for _, p := range pts {
		if !finite(p.LossPct) || p.LossPct < 0 || p.LossPct >= 100 {
			return d, fmt.Errorf("curves: IEC loss at (%g;%g) must be from 0 to below 100 %%", p.Speed, p.Torque)
		}
		si, ti := iecIndex(p.Speed, []float64{0, 50, 90}), iecIndex(p.Torque, []float64{25, 50, 100})
		if si < 0 || ti < 0 || (si == 2 && ti == 0) || seen[[2]float64{p.Speed, p.Torque}] {
			return d, ErrIECTable
		}
		seen[[2]float64{p.Speed, p.Torque}] = true
		d.grid[si][ti] = p.LossPct
	}
	if len(seen) != 8 {
		return d, ErrIECTable
	}
	d.grid[2][0] = d.grid[1][0] + d.grid[2][1] - d.grid[1][1]
	return d, nil
}

func iecIndex(v float64, axis []float64) int {
	for i, a := range axis {
		if v == a {
			return i
		}
	}
	return -1
}

// LossPct returns the interpolated loss (% of rated power) at speed and
// torque given in %.
func (d IECDrive) LossPct(speed, torque float64) float64 {
	sp := []float64{0, 50, 90}
	tq := []float64{25, 50, 100}
	torque = math.Max(25, math.Min(100, torque))
	ti := 0
	if torque > 50 {
		ti = 1
	}
	tf := (torque - tq[ti]) / (tq[ti+1] - tq[ti])
	si := 0
	if speed > 50 {
		si = 1
	}
	sf := (speed - sp[si]) / (sp[si+1] - sp[si]) // may exceed 1 above 90 %: linear extension
	if speed < 0 {
		sf = 0
	}
	at := func(i int) float64 { return d.grid[i][ti]*(1-tf) + d.grid[i][ti+1]*tf }
	return at(si)*(1-sf) + at(si+1)*sf
}

func (IECDrive) Variable() bool   { return true }
func (IECDrive) Describe() string { return "variable-speed drive, IEC 61800-9-2 loss table" }
func (d IECDrive) Electrical(m Motor, shaft Power, speed float64) Power {
	return d.Input(m, shaft, speed).Electrical
}
func (d IECDrive) Input(m Motor, shaft Power, speed float64) Chain {
	motorIn := shaft + m.Loss(shaft)
	ratedIn := float64(m.Rated) / m.FullLoadEff
	r := float64(shaft) / float64(m.Rated)
	torque := 100 * r / math.Max(speed, 1e-6)
	loss := Power(d.LossPct(100*speed, torque) / 100 * ratedIn)
	elec := motorIn + loss
	return Chain{Shaft: shaft, Electrical: elec, MotorEff: m.Efficiency(shaft),
		DriveEff: float64(motorIn) / float64(elec), Load: r}
}
