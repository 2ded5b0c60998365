package curves

import (
	"errors"
	"fmt"
	"math"
	"testing"
)

// TestDOEDriveWorkedCase: the worked case (docs/sources.md §5) of the DOE pump test
// procedure (10 CFR 431 subpart Y, appendix A) motor + continuous-control
// loss factor [C, re-computed D]: 75 hp motor at the 95 % default.
func TestDOEDriveWorkedCase(t *testing.T) {
	m := Motor{Rated: 75 * Horsepower, FullLoadEff: 0.95}
	// [C, D] L_full = 75 (1/0.95 − 1) = 3.9474 hp.
	if got := float64(m.FullLoadLoss()) / Horsepower; math.Abs(got-3.9474) > 5e-5 {
		t.Errorf("L_full = %.6f hp, want 3.9474 hp", got)
	}
	cases := []struct {
		name  string
		shaft float64 // hp, pump shaft input on the DOE reference curve [C, D]
		z     float64 // loss factor [C, D]
		input float64 // driver input by the appendix A polynomial, hp [C, D]
		floor float64 // the motor alone, where it is above the polynomial: hp [D]; 0 = not floored
	}{
		// [D] at R = 0.043394 the DOE motor factor y = −0.4508R³ + 1.2399R²
		// − 0.4301R + 0.6410 = 0.62463, so the motor alone takes 3.25452 +
		// 0.62463 × 3.9474 = 5.7202 hp, above the polynomial's 4.7782 hp.
		{"25 % of BEP flow", 3.25452, 0.38599, 4.7782, 5.7202},
		{"50 % of BEP flow", 10.41447, 0.64587, 12.9639, 0},
		{"75 % of BEP flow", 25.38526, 1.13673, 29.8724, 0},
		{"BEP", 52.07233, 1.83557, 59.3180, 0},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			r := c.shaft / 75
			// z to the five decimals given: ±5e-6.
			if z := DOEDriveLossFactor(m.Rated, r); math.Abs(z-c.z) > 5e-6 {
				t.Errorf("z(%.5f) = %.6f, want %.5f", r, z, c.z)
			}
			// The appendix A polynomial's driver input to the four decimals
			// given: ±5e-5 hp.
			poly := c.shaft + DOEDriveLossFactor(m.Rated, r)*float64(m.FullLoadLoss())/Horsepower
			if math.Abs(poly-c.input) > 5e-5 {
				t.Errorf("appendix A driver input %.5f hp, want %.4f hp", poly, c.input)
			}
			ch := DOEDrive{}.Input(m, Power(c.shaft*Horsepower), 1)
			want := c.input
			if c.floor > 0 {
				want = c.floor
			}
			if got := float64(ch.Electrical) / Horsepower; math.Abs(got-want) > 5e-5 {
				t.Errorf("driver input %.5f hp, want %.4f hp", got, want)
			}
			if floored := DOEFloored(m, Power(c.shaft*Horsepower)); floored != (c.floor > 0) {
				t.Errorf("floored %v", floored)
			}
			if math.Abs(ch.Load-r) > 1e-12 {
				t.Errorf("load %.6f, want %.6f", ch.Load, r)
			}
		})
	}
	// [C, D] R at BEP = 52.07233 / 75 = 0.6943.
	if r := 52.07233 / 75; math.Abs(r-0.6943) > 5e-5 {
		t.Errorf("R at BEP %.5f", r)
	}
}

// TestDOEDriveCoefficients: the size bands of docs/sources.md §5 [C], including
// their edges (≤ 5, > 5 to ≤ 20, > 20 to ≤ 50, > 50 hp).
func TestDOEDriveCoefficients(t *testing.T) {
	cases := []struct {
		hp      float64
		a, b, c float64
	}{
		{1, -0.4658, 1.4965, 0.5303},
		{5, -0.4658, 1.4965, 0.5303},
		{7.5, -1.3198, 2.9551, 0.1052},
		{20, -1.3198, 2.9551, 0.1052},
		{25, -1.5122, 3.0777, 0.1847},
		{50, -1.5122, 3.0777, 0.1847},
		{60, -0.8914, 2.8846, 0.2625},
		{500, -0.8914, 2.8846, 0.2625},
	}
	for _, c := range cases {
		t.Run(fmt.Sprintf("%g hp", c.hp), func(t *testing.T) {
			a, b, cc := DOEDriveCoefficients(Power(c.hp * Horsepower))
			if a != c.a || b != c.b || cc != c.c {
				t.Errorf("got (%g, %g, %g), want (%g, %g, %g)", a, b, cc, c.a, c.b, c.c)
			}
		})
	}
	// Motors rated in kW fall in the band of their hp equivalent [D]:
	// 15 kW = 20.1 hp (> 20), 37 kW = 49.6 hp (≤ 50).
	if a, _, _ := DOEDriveCoefficients(15000); a != -1.5122 {
		t.Errorf("15 kW: A = %g, want −1.5122", a)
	}
	if a, _, _ := DOEDriveCoefficients(37000); a != -1.5122 {
		t.Errorf("37 kW: A = %g, want −1.5122", a)
	}
}

// constantMotor has a flat efficiency, so that motor input / rated input
// equals shaft / rated output and a drive table can be read at its own rows.
func constantMotor(hp, eff float64) Motor {
	return Motor{Rated: Power(hp * Horsepower), FullLoadEff: eff, Table: []LoadEff{{0, eff}, {2, eff}}}
}

// TestTableDriveTipSheet11: US DOE Motor Systems Tip Sheet #11, VFD
// efficiency vs load [C], used as a TableDrive: the drive reproduces its own
// rows and interpolates linearly between them.
func TestTableDriveTipSheet11(t *testing.T) {
	loads := []float64{0.016, 0.125, 0.25, 0.42, 0.50, 0.75, 1.00}
	sheets := []struct {
		name string
		hp   float64
		eff  []float64
	}{
		{"10 hp drive", 10, []float64{0.41, 0.83, 0.90, 0.93, 0.94, 0.95, 0.96}},
		{"100 hp drive", 100, []float64{0.55, 0.89, 0.94, 0.95, 0.96, 0.97, 0.97}},
	}
	for _, sh := range sheets {
		table := make([]LoadEff, len(loads))
		for i := range loads {
			table[i] = LoadEff{loads[i], sh.eff[i]}
		}
		if err := CheckTable(table); err != nil {
			t.Fatalf("%s: %v", sh.name, err)
		}
		d := TableDrive{Table: table}
		m := constantMotor(sh.hp, 0.93)
		for i, l := range loads {
			t.Run(fmt.Sprintf("%s/%.1f%%", sh.name, 100*l), func(t *testing.T) {
				ch := d.Input(m, Power(l)*m.Rated, 1)
				if math.Abs(ch.DriveEff-sh.eff[i]) > 1e-12 {
					t.Errorf("drive efficiency %.12g, table %g", ch.DriveEff, sh.eff[i])
				}
				// [D] electrical = shaft / (η_motor η_drive).
				want := l * float64(m.Rated) / (0.93 * sh.eff[i])
				if relErr(float64(ch.Electrical), want) > 1e-12 {
					t.Errorf("electrical %.9g W, want %.9g W", float64(ch.Electrical), want)
				}
			})
		}
		// [D] linear between rows: midway 50–75 % is the mean of the rows.
		mid := d.Input(m, Power(0.625)*m.Rated, 1).DriveEff
		if want := (sh.eff[4] + sh.eff[5]) / 2; math.Abs(mid-want) > 1e-12 {
			t.Errorf("%s: at 62.5 %% %.12g, want %.12g", sh.name, mid, want)
		}
	}
}

// Synthetic IEC 61800-9-2 loss table (test input; the eight (speed; torque)
// points are those of the standard [C]).
var iecTest = []IECPoint{
	{0, 25, 0.9}, {0, 50, 1.1}, {0, 100, 1.7},
	{50, 25, 1.1}, {50, 50, 1.4}, {50, 100, 2.2},
	{90, 50, 1.8}, {90, 100, 2.9},
}

func TestIECDriveTable(t *testing.T) {
	d, err := NewIECDrive(iecTest)
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range iecTest {
		t.Run(fmt.Sprintf("point (%g;%g)", p.Speed, p.Torque), func(t *testing.T) {
			if got := d.LossPct(p.Speed, p.Torque); math.Abs(got-p.LossPct) > 1e-12 {
				t.Errorf("loss %.12g %%, table %g %%", got, p.LossPct)
			}
		})
	}
	cases := []struct {
		name          string
		speed, torque float64
		want          float64
	}{
		// [D] bilinear: centre of the (0–50; 25–50) cell is the mean of its corners.
		{"centre of a cell", 25, 37.5, (0.9 + 1.1 + 1.1 + 1.4) / 4},
		// [D] along an edge: linear in speed at 100 % torque.
		{"70 % speed, full torque", 70, 100, (2.2 + 2.9) / 2},
		// The documented fill-in for the missing (90;25): (50;25) + (90;50) − (50;50).
		{"(90;25) filled in", 90, 25, 1.1 + 1.8 - 1.4},
		// Held in torque below 25 %.
		{"torque below 25 %", 50, 10, 1.1},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if got := d.LossPct(c.speed, c.torque); math.Abs(got-c.want) > 1e-12 {
				t.Errorf("loss %.12g %%, want %.12g %%", got, c.want)
			}
		})
	}
	// Through Input: speed 50 %, shaft 25 % of rated → torque 50 %; the loss
	// is 1.4 % of the motor's rated input [D].
	m := Motor{Rated: 30 * Horsepower, FullLoadEff: 0.936}
	shaft := 0.25 * m.Rated
	ch := d.Input(m, shaft, 0.5)
	want := float64(shaft+m.Loss(shaft)) + 0.014*float64(m.Rated)/0.936
	if relErr(float64(ch.Electrical), want) > 1e-12 {
		t.Errorf("electrical %.9g W, want %.9g W", float64(ch.Electrical), want)
	}
}

func TestIECDriveRejects(t *testing.T) {
	drop := func(i int) []IECPoint {
		return append(append([]IECPoint(nil), iecTest[:i]...), iecTest[i+1:]...)
	}
	replace := func(i int, p IECPoint) []IECPoint {
		out := append([]IECPoint(nil), iecTest...)
		out[i] = p
		return out
	}
	cases := []struct {
		name string
		pts  []IECPoint
		want error // nil: any error
	}{
		{"seven points", drop(3), ErrIECTable},
		{"empty", nil, ErrIECTable},
		{"a point twice", replace(7, iecTest[6]), ErrIECTable},
		{"(90;25) is not one of the eight", replace(7, IECPoint{90, 25, 1.5}), ErrIECTable},
		{"speed off the grid", replace(2, IECPoint{70, 100, 1.7}), ErrIECTable},
		{"nine points", append(append([]IECPoint(nil), iecTest...), IECPoint{0, 25, 0.9}), ErrIECTable},
		{"negative loss", replace(0, IECPoint{0, 25, -0.1}), nil},
		{"NaN loss", replace(0, IECPoint{0, 25, math.NaN()}), nil},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := NewIECDrive(c.pts)
			if err == nil || (c.want != nil && !errors.Is(err, c.want)) {
				t.Errorf("got %v, want %v", err, c.want)
			}
		})
	}
}

func TestFixedSpeed(t *testing.T) {
	m := Motor{Rated: 25 * Horsepower, FullLoadEff: 0.936}
	var d Drive = FixedSpeed{}
	if d.Variable() {
		t.Error("a fixed-speed unit reports a variable drive")
	}
	for _, r := range []float64{0.3, 0.8, 1.1} {
		ch := d.Input(m, Power(r)*m.Rated, 1)
		// [V] docs/sources.md §5: a fixed-speed unit has no drive loss.
		if ch.DriveEff != 1 {
			t.Errorf("R=%g: drive efficiency %g, want 1", r, ch.DriveEff)
		}
		if got, want := float64(ch.Electrical), r*float64(m.Rated)+float64(m.Loss(Power(r)*m.Rated)); relErr(got, want) > 1e-12 {
			t.Errorf("R=%g: electrical %.9g W, want shaft + motor loss %.9g W", r, got, want)
		}
	}
	for _, v := range []Drive{DOEDrive{}, TableDrive{}, IECDrive{}} {
		if !v.Variable() {
			t.Errorf("%s: not variable", v.Describe())
		}
	}
}

// TestDriveChainInvariants: for every drive model and several motor sizes,
// across loads 0.05–1.15: electrical ≥ shaft, efficiencies in (0, 1], and
// motor × drive efficiency = shaft / electrical.
func TestDriveChainInvariants(t *testing.T) {
	iec, err := NewIECDrive(iecTest)
	if err != nil {
		t.Fatal(err)
	}
	tip10 := TableDrive{Table: []LoadEff{{0.016, 0.41}, {0.125, 0.83}, {0.25, 0.90}, {0.42, 0.93}, {0.5, 0.94}, {0.75, 0.95}, {1, 0.96}}}
	drives := []Drive{FixedSpeed{}, DOEDrive{}, tip10, iec}
	for _, hp := range []float64{3, 10, 40, 75, 250} {
		eff, _ := PremiumEfficiency(Power(hp*Horsepower), 4)
		motors := []Motor{
			{Rated: Power(hp * Horsepower), FullLoadEff: eff},
			{Rated: Power(hp * Horsepower), FullLoadEff: eff, Table: []LoadEff{{0.25, eff - 0.06}, {0.5, eff - 0.015}, {1, eff}}},
		}
		for mi, m := range motors {
			for _, d := range drives {
				t.Run(fmt.Sprintf("%g hp/motor %d/%s", hp, mi, d.Describe()), func(t *testing.T) {
					for r := 0.05; r <= 1.15+1e-9; r += 0.05 {
						speed := math.Min(1, math.Cbrt(r)) // a pump's load falls about as speed³
						ch := d.Input(m, Power(r)*m.Rated, speed)
						if ch.Electrical < ch.Shaft {
							t.Errorf("R=%.2f: electrical %.6g W below shaft %.6g W", r, float64(ch.Electrical), float64(ch.Shaft))
						}
						if ch.MotorEff <= 0 || ch.MotorEff > 1 || ch.DriveEff <= 0 || ch.DriveEff > 1 {
							t.Errorf("R=%.2f: motor %.4f, drive %.4f", r, ch.MotorEff, ch.DriveEff)
						}
						if relErr(ch.MotorEff*ch.DriveEff, ch.Overall()) > 1e-12 {
							t.Errorf("R=%.2f: motor × drive %.12g, overall %.12g", r, ch.MotorEff*ch.DriveEff, ch.Overall())
						}
					}
				})
			}
		}
	}
}

// TestElectricalMatchesInput: the optimiser's fast path must give the same
// wire power as the full chain, for every drive model (an internal
// consistency check; no outside source).
func TestElectricalMatchesInput(t *testing.T) {
	iec, err := NewIECDrive([]IECPoint{{0, 25, 1.0}, {0, 50, 1.2}, {0, 100, 1.9}, {50, 25, 1.3}, {50, 50, 1.6}, {50, 100, 2.4}, {90, 50, 2.0}, {90, 100, 3.0}})
	if err != nil {
		t.Fatal(err)
	}
	m := Motor{Rated: Power(30 * Horsepower), FullLoadEff: 0.936}
	drives := []Drive{FixedSpeed{}, DOEDrive{}, TableDrive{Table: []LoadEff{{0.1, 0.8}, {0.5, 0.95}, {1, 0.97}}}, iec}
	for _, d := range drives {
		for _, load := range []float64{0.02, 0.1, 0.4, 0.8, 1.1} {
			shaft := Power(load) * m.Rated
			speed := 0.3 + 0.6*load
			got, want := d.Electrical(m, shaft, speed), d.Input(m, shaft, speed).Electrical
			if got != want {
				t.Errorf("%s at load %.2f: Electrical %v, Input %v", d.Describe(), load, got, want)
			}
		}
	}
}

// TestDOEFloorNeverBelowMotor: the DOE default motor-and-drive input is
// never below the motor alone at the same load (the appendix A fit is, at
// light load), for every size band and load up to the service factor.
func TestDOEFloorNeverBelowMotor(t *testing.T) {
	for _, hp := range []float64{3, 10, 30, 75, 200} {
		m := Motor{Rated: Power(hp * Horsepower), FullLoadEff: 0.92}
		for r := 0.005; r <= 1.15; r += 0.005 {
			shaft := Power(r) * m.Rated
			e := DOEDrive{}.Electrical(m, shaft, 1)
			if alone := shaft + m.Loss(shaft); e < alone*(1-1e-12) {
				t.Fatalf("%g hp at R %.3f: input %v W below the motor alone %v W", hp, r, e, alone)
			}
			ch := DOEDrive{}.Input(m, shaft, 1)
			if ch.DriveEff > 1 || ch.MotorEff > 1 || math.Abs(float64(ch.Electrical-e)) > 1e-9*float64(e) {
				t.Fatalf("%g hp at R %.3f: chain %+v, electrical %v", hp, r, ch, e)
			}
		}
	}
}
