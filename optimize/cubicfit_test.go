package optimize_test

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
)

// sCurvePlant is an invented SI plant file: two pumps whose datasheet
// points lie on the S-shaped curve H = 36 − 9x² + 3x³ m, x = Q/(400 m³/h)
// (its cubic fit has a positive x³ term), fitted as fit says. Minimum
// speed 50 %: the reference's speed search needs H₀(X)/X² to fall up to
// runout × 1/0.5, and 36/x² − 9 + 3x turns up at x = 24^(1/3) ≈ 2.9.
func sCurvePlant(t *testing.T, fit string) *plant.Plant {
	t.Helper()
	var pts strings.Builder
	for _, q := range []float64{0, 100, 200, 300, 400, 460, 520} {
		x := q / 400
		fmt.Fprintf(&pts, "      - {flow: %g, head: %.4f", q, 36-9*x*x+3*x*x*x)
		if q > 0 {
			fmt.Fprintf(&pts, ", efficiency: %.2f", 80*x*(2-x))
		}
		pts.WriteString("}\n")
	}
	src := `name: S-curve plant (invented)
units: SI
fluid: {temperature: 7}
pumps:
  - name: P
    count: 2
    rated_speed: 1480
    head_fit: ` + fit + `
    curve:
` + pts.String() + `    min_speed: 50%
    motor: {rated_output: 55, full_load_efficiency: 95.0}
    drive: variable
system:
  design_flow: 800
  design_head: 30
  dp_control: {control_head: 12}
profile:
  bins: [{flow: 50%, hours: 8760}]
tariff: {currency: EUR, energy_price: 0.14}
`
	p, err := plant.Parse("s-curve.yaml", []byte(src), ".")
	if err != nil {
		t.Fatalf("%s fit: %v", fit, err)
	}
	return p
}

// TestCubicFitWithPositiveTermServed: a plant file that passes the
// loader's checks with head_fit cubic and a positive x³ term was "unable
// to make the required head" at every load, where the quadratic fit of the
// same points serves 300 m³/h on one unit at about 70 % speed. The cubic
// plant must serve every load the brute-force reference serves, within
// the suite's 0.05 %, and agree with the quadratic fit to within the two
// fits' own difference (1 %: the quadratic misses these points by up to
// 0.2 m).
func TestCubicFitWithPositiveTermServed(t *testing.T) {
	cubic, quad := sCurvePlant(t, "cubic"), sCurvePlant(t, "quadratic")
	if c := cubic.Models[0].Pump.HeadPoly().C; len(c) != 4 || c[3] <= 0 {
		t.Fatalf("cubic fit %v: want a positive x³ term", c)
	}
	if err := refCheckModel(&cubic.Models[0]); err != nil {
		t.Fatal(err)
	}
	sc, sq := optimize.New(cubic, optimize.Options{}), optimize.New(quad, optimize.Options{})
	for _, m3h := range []float64{100, 300, 500, 700, 750} { // m³/h, up to near design flow
		q := curves.Flow(m3h * curves.M3PerH)
		rc, rq := sc.Solve(q), sq.Solve(q)
		ref := refSolve(cubic, q, false)
		if rc.Status != optimize.Served || !ref.Feasible {
			t.Errorf("%g m³/h: cubic fit %v (%s), reference feasible %v", m3h, rc.Status, rc.Reason, ref.Feasible)
			continue
		}
		if d := float64(rc.Power)/float64(ref.Power) - 1; math.Abs(d) > suiteTol {
			t.Errorf("%g m³/h: %.6g kW, reference %.6g kW (%+.4f %%)", m3h, float64(rc.Power)/1e3, float64(ref.Power)/1e3, 100*d)
		}
		if rq.Status != optimize.Served || math.Abs(float64(rc.Power)/float64(rq.Power)-1) > 0.01 {
			t.Errorf("%g m³/h: cubic fit %.6g kW, quadratic fit %v %.6g kW", m3h, float64(rc.Power)/1e3, rq.Status, float64(rq.Power)/1e3)
		}
		t.Logf("%g m³/h: cubic %d running at %.1f %%, %.4f kW (reference %.4f kW); quadratic %.4f kW",
			m3h, rc.Running(), 100*rc.Units[0].Speed, float64(rc.Power)/1e3, float64(ref.Power)/1e3, float64(rq.Power)/1e3)
	}
}
