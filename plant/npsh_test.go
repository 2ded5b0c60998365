package plant

import (
	"math"
	"os"
	"strings"
	"testing"

	"wattstage/curves"
)

// TestSuctionReadsEachBasis reads the suction section in each of its forms
// and checks the absolute pressure, static head and margin in SI.
func TestSuctionReadsEachBasis(t *testing.T) {
	si, err := os.ReadFile("../testdata/plants/minimal-si.yaml")
	if err != nil {
		t.Fatal(err)
	}
	us := warnPlant(nil)
	cases := []struct {
		name     string
		base     string
		suction  string
		pressure float64 // Pa
		tol      float64 // Pa
		static   curves.Head
		margin   float64
		basis    string
	}{
		// ISA table at 1000 m: 89875 Pa (ICAO Doc 7488, from memory).
		{"SI open tank at 1000 m", string(si), "  static_head: 2\n  altitude: 1000\n",
			89875, 2, 2, DefaultNPSHMargin, "open tank at 89.87 kPa absolute, the standard atmosphere at 1000 m"},
		// 150 kPa gauge above the sea-level standard atmosphere (101.325 kPa,
		// ISO 2533) = 251.325 kPa absolute.
		{"SI closed system, gauge", string(si), "  static_head: 12\n  gauge_pressure: 150\n  margin: 1.5\n",
			251325, 1e-6, 12, 1.5, "closed system at 150 kPa gauge + 101.3 kPa atmosphere at 0 m"},
		// 30 psi absolute × 6894.757293 Pa/psi (NIST SP 811) = 206842.72 Pa;
		// a 10 ft lift is −3.048 m (1 ft = 0.3048 m exactly, NIST SP 811).
		{"US closed system, absolute, lift", us, "  static_head: -10\n  absolute_pressure: 30 psi\n",
			30 * 6894.757293, 1e-6, -3.048, DefaultNPSHMargin, "level 10 ft below the impeller eye (suction lift)"},
		// 3280.84 ft = 1000.000 m: the same ISA pressure as above.
		{"US open tank at 3280.84 ft", us, "  static_head: 5\n  altitude: 3280.84\n",
			89875, 2, 5 * 0.3048, DefaultNPSHMargin, "open tank at 13.04 psi absolute"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			p, err := Parse("s.yaml", []byte(c.base+"suction:\n"+c.suction), "")
			if err != nil {
				t.Fatalf("Parse:\n%v", err)
			}
			s := p.Suction
			if s == nil {
				t.Fatal("no suction read")
			}
			if math.Abs(s.Pressure-c.pressure) > c.tol {
				t.Errorf("pressure %.3f Pa, want %.3f ± %g", s.Pressure, c.pressure, c.tol)
			}
			if math.Abs(float64(s.StaticHead-c.static)) > 1e-12 {
				t.Errorf("static head %.6f m, want %.6f", s.StaticHead, c.static)
			}
			if s.Margin != c.margin {
				t.Errorf("margin %g, want %g", s.Margin, c.margin)
			}
			if !strings.Contains(s.Basis, c.basis) {
				t.Errorf("basis %q lacks %q", s.Basis, c.basis)
			}
			pv, _ := curves.WaterVapourPressure(p.Fluid.Temperature)
			if s.VapourPressure != pv || s.Density != p.Fluid.Density {
				t.Errorf("vapour pressure %g Pa, density %g; want the fluid's %g Pa and %g", s.VapourPressure, s.Density, pv, p.Fluid.Density)
			}
		})
	}
}

// TestNPSHrPointsRead reads a model's NPSHr points in the file's units.
func TestNPSHrPointsRead(t *testing.T) {
	doc := strings.Replace(warnPlant(nil), "    motor:\n", "    npshr:\n      - {flow: 200, npshr: 8}\n      - {flow: 800, npshr: 20}\n    motor:\n", 1)
	p, err := Parse("n.yaml", []byte(doc), "")
	if err != nil {
		t.Fatalf("Parse:\n%v", err)
	}
	c := p.Models[0].NPSHr
	if c == nil || len(c.Points) != 2 {
		t.Fatalf("NPSHr %+v; want two points", c)
	}
	// 500 gpm is halfway: 14 ft = 4.2672 m (1 ft = 0.3048 m, NIST SP 811).
	if got := c.Required(500*curves.GPM, 1); math.Abs(float64(got)-14*0.3048) > 1e-12 {
		t.Errorf("NPSHr at 500 gpm %.6f m, want %.6f", got, 14*0.3048)
	}
}
