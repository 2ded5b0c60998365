package curves

import (
	"errors"
	"fmt"
	"math"
	"testing"
)

// TestMotorDOEPartLoad: US DOE pump test procedure default motor part-load
// loss factor (10 CFR 431 subpart Y, appendix A) [C].
func TestMotorDOEPartLoad(t *testing.T) {
	m := Motor{Rated: 10 * Horsepower, FullLoadEff: 0.917}
	cases := []struct {
		load float64 // R = shaft / rated
		want float64 // motor efficiency
	}{
		// [D] docs/sources.md §4 derived check: 10 hp at 91.7 % → 82.06 / 89.05 /
		// 90.94 / 91.70 % at 25/50/75/100 % load.
		{0.25, 0.8206},
		{0.50, 0.8905},
		{0.75, 0.9094},
		{1.00, 0.9170},
	}
	for _, c := range cases {
		t.Run(fmt.Sprintf("%.0f%% load", 100*c.load), func(t *testing.T) {
			got := m.Efficiency(Power(c.load) * m.Rated)
			// Two decimals of a percentage: ±5e-5.
			if math.Abs(got-c.want) > 5e-5 {
				t.Errorf("efficiency %.5f, want %.4f", got, c.want)
			}
		})
	}
	// [D] y(1) = −0.4508 + 1.2399 − 0.4301 + 0.6410 = 1: full-load losses
	// are the nameplate losses.
	if y := MotorLossFactor(1); math.Abs(y-1) > 1e-12 {
		t.Errorf("y(1) = %.15g, want 1", y)
	}
	// [D] L_full = 10 hp (1/0.917 − 1) = 0.905125… hp.
	if got, want := float64(m.FullLoadLoss())/Horsepower, 10*(1/0.917-1); math.Abs(got-want) > 1e-12 {
		t.Errorf("full-load loss %.12g hp, want %.12g hp", got, want)
	}
}

// TestMotorShape: DOE fact sheet "Determining Electric Motor Load and
// Efficiency" [V]: efficiency drops sharply below ~50 % load. The fact sheet
// also puts peak efficiency near 75 % load, but the DOE test-procedure loss
// factor does not: y(R)/R falls for every R > 0, since
// d(y/R)/dR ∝ −0.9016 R³ + 1.2399 R² − 0.641 < 0 (its largest value, at
// R ≈ 0.917, is −0.294) [D], so the default efficiency rises monotonically
// up to full load and beyond. Both are checked here; the derived check of docs/sources.md §4
// check (90.94 % at 75 %, 91.70 % at 100 %) agrees.
func TestMotorShape(t *testing.T) {
	for _, hp := range []float64{5, 25, 100, 200} {
		eff, _ := PremiumEfficiency(Power(hp*Horsepower), 4)
		m := Motor{Rated: Power(hp * Horsepower), FullLoadEff: eff}
		e := func(r float64) float64 { return m.Efficiency(Power(r) * m.Rated) }
		t.Run(fmt.Sprintf("%g hp", hp), func(t *testing.T) {
			for r := 0.05; r < 1.2; r += 0.05 {
				if e(r+0.05) <= e(r) {
					t.Errorf("efficiency falls from %.4f to %.4f between %.0f and %.0f %% load", e(r), e(r+0.05), 100*r, 100*(r+0.05))
				}
			}
			if drop50, drop25 := e(0.75)-e(0.5), e(0.5)-e(0.25); drop25 <= 2*drop50 {
				t.Errorf("no sharp drop below 50 %%: −%.4f from 75→50 %%, −%.4f from 50→25 %%", drop50, drop25)
			}
		})
	}
}

// TestPremiumEfficiency: 10 CFR 431.25 Table 5 (= NEMA Premium, MG 1 Table
// 12-12), enclosed motors [V], values read in the regulation (docs/sources.md §4).
func TestPremiumEfficiency(t *testing.T) {
	cases := []struct {
		hp    float64
		poles int
		want  float64 // %
	}{
		{5, 4, 89.5}, {10, 4, 91.7}, {25, 4, 93.6}, {50, 4, 94.5}, {100, 4, 95.4}, {200, 4, 96.2},
		{10, 2, 90.2}, {50, 2, 93.0}, {100, 2, 94.1},
	}
	for _, c := range cases {
		t.Run(fmt.Sprintf("%g hp %d-pole", c.hp, c.poles), func(t *testing.T) {
			got, err := PremiumEfficiency(Power(c.hp*Horsepower), c.poles)
			if err != nil {
				t.Fatal(err)
			}
			if math.Abs(100*got-c.want) > 1e-9 {
				t.Errorf("%.2f %%, want %.1f %%", 100*got, c.want)
			}
		})
	}
}

func TestPremiumEfficiencyLookup(t *testing.T) {
	at := func(hp float64, poles int) (float64, error) { return PremiumEfficiency(Power(hp*Horsepower), poles) }
	// [P] a size between rows takes the lower row (the package's documented
	// conservative choice): 60 hp is a row, 62 hp takes it; 7.5 kW (10.06 hp)
	// takes the 10 hp row [V value 91.7 % 4-pole].
	cases := []struct {
		name string
		got  func() (float64, error)
		want func() (float64, error)
	}{
		{"62 hp takes the 60 hp row", func() (float64, error) { return at(62, 4) }, func() (float64, error) { return at(60, 4) }},
		{"7.5 kW takes the 10 hp row", func() (float64, error) { return PremiumEfficiency(7500, 4) }, func() (float64, error) { return 0.917, nil }},
		{"199.9 hp takes the 150 hp row", func() (float64, error) { return at(199.9, 4) }, func() (float64, error) { return at(150, 4) }},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			g, err1 := c.got()
			w, err2 := c.want()
			if err1 != nil || err2 != nil || g != w {
				t.Errorf("got %v (%v), want %v (%v)", g, err1, w, err2)
			}
		})
	}
	for _, bad := range []struct {
		name  string
		hp    float64
		poles int
	}{{"8 poles", 10, 8}, {"below 1 hp", 0.5, 4}, {"above 500 hp", 600, 4}} {
		t.Run(bad.name, func(t *testing.T) {
			if _, err := at(bad.hp, bad.poles); !errors.Is(err, ErrNoDefaultEff) {
				t.Errorf("got %v, want ErrNoDefaultEff", err)
			}
		})
	}
}

// TestPoleCount: synchronous speed 120 f / p [P]; induction motors run a few
// percent below it.
func TestPoleCount(t *testing.T) {
	cases := []struct {
		rpm   float64
		poles int
	}{
		{1780, 4}, // 60 Hz, sync 1800
		{3550, 2}, // 60 Hz, sync 3600
		{1180, 6}, // 60 Hz, sync 1200
		{1450, 4}, // 50 Hz, sync 1500
		{2900, 2}, // 50 Hz, sync 3000
		{960, 6},  // 50 Hz, sync 1000
		{1800, 4}, // nameplate at synchronous speed
	}
	for _, c := range cases {
		t.Run(fmt.Sprintf("%g rpm", c.rpm), func(t *testing.T) {
			if got := PoleCount(c.rpm); got != c.poles {
				t.Errorf("PoleCount(%g) = %d, want %d", c.rpm, got, c.poles)
			}
		})
	}
}

// TestMotorTableOverride: a user table replaces the DOE default and is
// interpolated linearly, held at its ends (the package's documented rule).
func TestMotorTableOverride(t *testing.T) {
	table := []LoadEff{{0.25, 0.80}, {0.5, 0.88}, {0.75, 0.91}, {1.0, 0.92}}
	if err := CheckTable(table); err != nil {
		t.Fatal(err)
	}
	m := Motor{Rated: 20 * Horsepower, FullLoadEff: 0.93, Table: table}
	cases := []struct {
		name string
		load float64
		want float64
	}{
		{"table row", 0.5, 0.88},
		{"table row at full load", 1.0, 0.92},
		{"midway 25–50 %", 0.375, 0.84}, // [D] (0.80 + 0.88)/2
		{"below the table: held", 0.1, 0.80},
		{"above the table: held", 1.1, 0.92},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			if got := m.Efficiency(Power(c.load) * m.Rated); math.Abs(got-c.want) > 1e-12 {
				t.Errorf("efficiency %.12g, want %g", got, c.want)
			}
		})
	}
	for _, bad := range []struct {
		name  string
		table []LoadEff
		want  error
	}{
		{"one row", []LoadEff{{1, 0.9}}, ErrTableShort},
		{"falling loads", []LoadEff{{0.5, 0.9}, {0.25, 0.85}}, ErrTableOrder},
		{"repeated load", []LoadEff{{0.5, 0.9}, {0.5, 0.85}}, ErrTableOrder},
		{"efficiency 0", []LoadEff{{0.5, 0}, {1, 0.85}}, ErrTableEffRange},
		{"efficiency above 1", []LoadEff{{0.5, 0.9}, {1, 1.01}}, ErrTableEffRange},
		{"NaN", []LoadEff{{0.5, math.NaN()}, {1, 0.9}}, ErrNotFinite},
	} {
		t.Run(bad.name, func(t *testing.T) {
			if err := CheckTable(bad.table); !errors.Is(err, bad.want) {
				t.Errorf("got %v, want %v", err, bad.want)
			}
		})
	}
}

// TestIE3Defaults: IEC 60034-30-1 IE3 4-pole 50 Hz nominal efficiencies
// (the table as reproduced in published summaries of the standard up to
// 7.5 kW [C]; from memory above), the smaller size between two rows.
func TestIE3Defaults(t *testing.T) {
	for _, c := range []struct {
		kw, want float64
	}{
		{0.75, 0.825}, {4, 0.886}, {7.5, 0.904}, // [C]
		{30, 0.936}, {55, 0.946}, {250, 0.960}, // from memory
		{9, 0.904}, // between 7.5 and 11 kW: the 7.5 kW row
	} {
		got, err := IE3Efficiency(Power(c.kw * KW))
		if err != nil || math.Abs(got-c.want) > 1e-12 {
			t.Errorf("%g kW: %v (%v), want %v", c.kw, got, err, c.want)
		}
	}
	if _, err := IE3Efficiency(Power(0.5 * KW)); err == nil {
		t.Error("0.5 kW: a default from outside the table")
	}
	// Synchronous speeds 3000/1500/1000 rpm on 50 Hz, 3600/1800/1200 on 60 Hz.
	for rpm, hz := range map[float64]int{2950: 50, 1480: 50, 970: 50, 3550: 60, 1780: 60, 1170: 60} {
		if got := SupplyHz(rpm); got != hz {
			t.Errorf("%g rpm: %d Hz, want %d", rpm, got, hz)
		}
	}
}
