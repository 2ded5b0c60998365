package plant

import (
	"errors"
	"fmt"
	"io/fs"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"

	"wattstage/curves"
)

// NIST SP 811 Appendix B factors and standard gravity, written out here
// rather than taken from curves so that the loader is checked against the
// source, not against itself.
const (
	nistGallon = 3.785411784e-3 // m³ per US gallon, exact (NIST SP 811 App. B)
	nistFoot   = 0.3048         // m per foot, exact (NIST SP 811 App. B)
	nistHP     = 745.69987158   // W per horsepower of 550 ft·lbf/s (NIST SP 811 App. B)
	nistPSI    = 6894.757293    // Pa per lbf/in² (NIST SP 811 App. B)
	gn         = 9.80665        // m/s², standard gravity (CGPM 1901, NIST SP 811)
)

func near(got, want, relTol float64) bool {
	if want == 0 {
		return math.Abs(got) <= relTol
	}
	return math.Abs(got-want) <= relTol*math.Abs(want)
}

func mustLoad(t *testing.T, path string) *Plant {
	t.Helper()
	p, err := Load(path)
	if err != nil {
		t.Fatalf("Load(%s):\n%v", path, err)
	}
	return p
}

// TestExamples loads each example plant and checks that it is a clean,
// well-posed problem: small fit residuals, BEP inside the points, the
// design point reachable, nothing to warn about.
func TestExamples(t *testing.T) {
	files, _ := filepath.Glob("../examples/*.yaml")
	if len(files) < 3 {
		t.Fatalf("found %d example plants, want chilled-water, chilled-water-trend and condenser-water", len(files))
	}
	for _, f := range files {
		t.Run(filepath.Base(f), func(t *testing.T) {
			p := mustLoad(t, f)
			if len(p.Warnings) > 0 {
				for _, w := range p.Warnings {
					t.Errorf("an example should load without warnings: %s", w)
				}
			}
			capacity := curves.Flow(0)
			for i, m := range p.Models {
				pp := m.Pump
				// Invented curves, so the thresholds are ours: a datasheet
				// read to 1 ft / 1 % fits a quadratic to well under 1 %.
				if pp.HeadFit.RelRMS > 0.005 {
					t.Errorf("pumps[%d] head fit RMS %.2f %% of mean head, want < 0.5 %%", i, 100*pp.HeadFit.RelRMS)
				}
				if pp.EffFit.RelRMS > 0.03 {
					t.Errorf("pumps[%d] efficiency fit RMS %.2f %%, want < 3 %%", i, 100*pp.EffFit.RelRMS)
				}
				if pp.BEPFlow <= pp.FirstFlow || pp.BEPFlow >= pp.LastFlow {
					t.Errorf("pumps[%d] BEP %g outside the points %g–%g", i, pp.BEPFlow, pp.FirstFlow, pp.LastFlow)
				}
				if !(m.MinFlow < pp.BEPFlow && pp.BEPFlow < m.Runout) {
					t.Errorf("pumps[%d] min flow %g, BEP %g, runout %g out of order", i, m.MinFlow, pp.BEPFlow, m.Runout)
				}
				q, ok := pp.FlowAt(m.MaxSpeed, p.DesignHead)
				if !ok {
					t.Errorf("pumps[%d] cannot reach the design head", i)
				}
				capacity += q * curves.Flow(m.Count)
				// The unit's own design duty must not overload its motor.
				if qd, ok := pp.FlowAt(1, p.DesignHead); ok {
					if sh := pp.ShaftPower(qd, 1, p.Fluid.Density); sh > m.Motor.Rated {
						t.Errorf("pumps[%d] shaft %.0f W at design head exceeds motor %.0f W", i, sh, m.Motor.Rated)
					}
				}
			}
			if capacity < p.DesignFlow {
				t.Errorf("all units deliver %g m³/s at design head, short of design flow %g", capacity, p.DesignFlow)
			}
			if got := p.System.Required(p.DesignFlow); !near(float64(got), float64(p.DesignHead), 1e-12) {
				t.Errorf("system curve gives %g m at design flow, want the design head %g", got, p.DesignHead)
			}
			if len(p.Profile.Bins) == 0 && p.Profile.Trend == nil {
				t.Errorf("no profile")
			}
		})
	}
}

// TestChilledWaterExample checks the US example's numbers against hand
// conversions with the NIST factors.
func TestChilledWaterExample(t *testing.T) {
	p := mustLoad(t, "../examples/chilled-water.yaml")
	rho, _ := curves.WaterDensity((44 - 32) * 5.0 / 9) // 44 °F = 6.667 °C exactly by definition of °F
	checks := []struct {
		name      string
		got, want float64
	}{
		{"design flow 3000 gpm", float64(p.DesignFlow), 3000 * nistGallon / 60},                              // NIST SP 811
		{"design head 90 ft", float64(p.DesignHead), 90 * nistFoot},                                          // NIST SP 811
		{"plant minimum flow 600 gpm", float64(p.MinFlow), 600 * nistGallon / 60},                            // NIST SP 811
		{"motor 30 hp", float64(p.Models[0].Motor.Rated), 30 * nistHP},                                       // NIST SP 811
		{"control head 15 psi", float64(p.System.(curves.DPControl).ControlHead), 15 * nistPSI / (rho * gn)}, // NIST SP 811 psi, h = p/(ρ g)
		{"reset low head 8 psi", float64(p.System.(curves.DPControl).Reset.LowHead), 8 * nistPSI / (rho * gn)},
		{"reset low flow 40 %", float64(p.System.(curves.DPControl).Reset.LowFlow), 0.4 * 3000 * nistGallon / 60},
		{"bin 25 % of design", float64(p.Profile.Bins[0].Flow), 0.25 * 3000 * nistGallon / 60},
		{"bin hours add to a year", sumHours(p.Profile.Bins), 8760}, // hours in a non-leap year, common practice
		{"discount 5 %", p.Retrofit.DiscountRate, 0.05},
		// 10 CFR 431.25 Table 5 [V, docs/sources.md §4: 25 hp 4-pole 93.6 %];
		// curves' table gives 30 hp the same value (from memory there).
		{"motor efficiency default", p.Models[0].Motor.FullLoadEff, 0.936},
	}
	for _, c := range checks {
		if !near(c.got, c.want, 1e-12) {
			t.Errorf("%s: got %.12g, want %.12g", c.name, c.got, c.want)
		}
	}
	// 15 psi of water is about 34.6 ft (2.31 ft/psi, common practice).
	if ft := float64(p.System.(curves.DPControl).ControlHead) / nistFoot; math.Abs(ft-34.6) > 0.1 {
		t.Errorf("15 psi = %.2f ft of 44 °F water, want about 34.6 (2.31 ft/psi)", ft)
	}
	if len(p.Tariff.Periods) != 3 || p.Tariff.Periods[0].Weekends || !p.Tariff.Periods[0].Weekdays {
		t.Errorf("tariff periods %+v", p.Tariff.Periods)
	}
	if !p.HasRetrofit || p.Retrofit.DriveCost != 7800 {
		t.Errorf("retrofit %+v (given %v)", p.Retrofit, p.HasRetrofit)
	}
	// The bins example is the retrofit study: no current sequence; the
	// trend example is the plant on drives today, with its thresholds.
	if p.Sequence != nil {
		t.Errorf("the retrofit example has a current sequence %+v", *p.Sequence)
	}
	tr := mustLoad(t, "../examples/chilled-water-trend.yaml")
	if tr.Sequence == nil || tr.Sequence.StageUpSpeed != 0.95 || tr.Sequence.StageDownSpeed != 0.45 {
		t.Errorf("trend example sequence %+v, want stage up 95 %%, down 45 %%", tr.Sequence)
	}
}

func sumHours(bins []Bin) float64 {
	s := 0.0
	for _, b := range bins {
		s += b.Hours
	}
	return s
}

// TestTrendExample checks the trend profile mapping and that the trend
// plant is otherwise the bins plant.
func TestTrendExample(t *testing.T) {
	bins := mustLoad(t, "../examples/chilled-water.yaml")
	tr := mustLoad(t, "../examples/chilled-water-trend.yaml")
	spec := tr.Profile.Trend
	if spec == nil || tr.Profile.Bins != nil {
		t.Fatalf("profile = %+v, want a trend only", tr.Profile)
	}
	if spec.Path != "chilled-water-trend.csv" || spec.TimeColumn != "timestamp" || spec.FlowColumn != "plant_flow_gpm" ||
		spec.DPColumn != "loop_dp_psi" || spec.PowerColumn != "pump_kw" || spec.FlowUnit != "gpm" || spec.DPUnit != "psi" ||
		spec.TimeFormat != "2006-01-02 15:04" {
		t.Errorf("trend spec %+v", spec)
	}
	if spec.Density != tr.Fluid.Density {
		t.Errorf("trend density %g, want the fluid's %g", spec.Density, tr.Fluid.Density)
	}
	if tr.DesignFlow != bins.DesignFlow || tr.Models[0].Pump.BEPFlow != bins.Models[0].Pump.BEPFlow {
		t.Errorf("the trend plant should be the bins plant")
	}
}

// TestCondenserExample checks the SI example's conversions.
func TestCondenserExample(t *testing.T) {
	p := mustLoad(t, "../examples/condenser-water.yaml")
	if len(p.Models) != 2 || p.Models[0].Count != 2 || p.Models[1].Count != 1 {
		t.Fatalf("want two large and one small unit, got %d models", len(p.Models))
	}
	checks := []struct {
		name      string
		got, want float64
	}{
		{"design flow 1100 m³/h", float64(p.DesignFlow), 1100.0 / 3600},
		{"static head 5 m", float64(p.System.(curves.FixedCurve).Static), 5},
		{"runout 94 L/s", float64(p.Models[1].Runout), 0.094},
		{"motor 55 kW", float64(p.Models[0].Motor.Rated), 55e3},
		{"min flow 35 % of BEP", float64(p.Models[0].MinFlow), 0.35 * float64(p.Models[0].Pump.BEPFlow)},
		// branch loss 1.2 m at 550 m³/h: k = h / Q²
		{"branch k", p.Models[0].BranchK, 1.2 / math.Pow(550.0/3600, 2)},
		{"last bin 1100 m³/h", float64(p.Profile.Bins[7].Flow), 1100.0 / 3600},
	}
	for _, c := range checks {
		if !near(c.got, c.want, 1e-12) {
			t.Errorf("%s: got %.12g, want %.12g", c.name, c.got, c.want)
		}
	}
	// Kell (1975) at 29 °C lies between the docs/sources.md §2 check values at
	// 20 °C (998.204) and 30 °C (995.647).
	if d := p.Fluid.Density; d <= 995.647 || d >= 998.204 {
		t.Errorf("density at 29 °C %g, want between the Kell check values 995.647 and 998.204", d)
	}
	if _, ok := p.Models[1].Drive.(curves.IECDrive); !ok {
		t.Errorf("small unit's drive is %T, want the IEC table", p.Models[1].Drive)
	}
	if p.Sequence != nil {
		t.Errorf("no sequence given, got %+v", p.Sequence)
	}
}

// TestDefaults checks that every value filled in is filled in right and
// recorded in Plant.Defaults.
func TestDefaults(t *testing.T) {
	p := mustLoad(t, "../testdata/plants/minimal-us.yaml")
	m := p.Models[0]
	rho20 := 998.204 // Kell (1975) at 20 °C, docs/sources.md §2 check value [D]
	checks := []struct {
		name      string
		got, want float64
		tol       float64
	}{
		{"fluid: water at 20 °C", p.Fluid.Density, rho20, 1e-6},
		{"count", float64(m.Count), 1, 0},
		{"min speed 30 %", m.MinSpeed, DefaultMinSpeed, 0},
		{"max speed 100 %", m.MaxSpeed, 1, 0},
		{"min flow 30 % of BEP", float64(m.MinFlow), 0.3 * float64(m.Pump.BEPFlow), 1e-12},
		{"runout at the last point", float64(m.Runout), 800 * nistGallon / 60, 1e-12},
		{"service factor 1.15", m.Motor.ServiceFactor, 1.15, 0},
		// 10 CFR 431.25 Table 5, 25 hp 4-pole enclosed: 93.6 % [V, docs/sources.md §4]
		{"full-load efficiency 25 hp 4-pole", m.Motor.FullLoadEff, 0.936, 1e-12},
		{"plant minimum flow none", float64(p.MinFlow), 0, 0},
	}
	for _, c := range checks {
		if !near(c.got, c.want, c.tol) {
			t.Errorf("%s: got %.10g, want %.10g", c.name, c.got, c.want)
		}
	}
	if !m.Pump.SpeedCorrection {
		t.Errorf("Sârbu–Borza speed correction should default on")
	}
	if _, ok := m.Drive.(curves.DOEDrive); !ok {
		t.Errorf("drive %T, want the DOE default", m.Drive)
	}
	if m.Motor.Table != nil {
		t.Errorf("motor table should default to nil (DOE loss factor)")
	}
	if p.Name != "minimal-us" {
		t.Errorf("name %q, want the file name", p.Name)
	}
	want := []string{
		`name: "minimal-us" (from the file name)`,
		"fluid: water at 68 °F (density 998.2 kg/m³, Kell 1975)",
		"pumps[0].count: 1 installed unit",
		"pumps[0].drive: variable speed with the US DOE default motor-and-drive part-load loss (10 CFR 431 subpart Y, appendix A), floored at the motor's own part-load loss where the fit falls below it (light load)",
		"pumps[0].min_speed: 30 % of rated speed (common practice; confirm pump, motor-cooling and drive minimums with their manufacturers)",
		"pumps[0].max_speed: 100 % of rated speed",
		"pumps[0].head_fit: quadratic (least squares)",
		"pumps[0].speed_correction: on: Sârbu–Borza (1998) efficiency step-down below rated speed",
		"pumps[0].motor.full_load_efficiency: 93.6 % (NEMA Premium, 10 CFR 431.25 Table 5, enclosed 4-pole motor, 25 hp, the smaller table size when between two; poles from rated speed 1770 rpm)",
		"pumps[0].motor.service_factor: 1.15 (usual NEMA value for general-purpose motors, common practice)",
		"pumps[0].motor.part_load: US DOE default part-load loss factor (10 CFR 431 subpart Y, appendix A)",
		"pumps[0].min_flow: 161.6 gpm (30 % of the fitted BEP flow 538.7 gpm; common practice — use the manufacturer's minimum continuous stable flow)",
		"pumps[0].runout: 800 gpm (the last datasheet point)",
		"system.plant_min_flow: none (no bypass: the pumps follow the load down; give the chiller or boiler minimum flow if there is one)",
		"tariff.demand_charge: none",
		"tariff.emissions_factor: not given: emissions are not reported",
	}
	if !slices.Equal(p.Defaults, want) {
		t.Errorf("Defaults:\n%s\nwant:\n%s", strings.Join(p.Defaults, "\n"), strings.Join(want, "\n"))
	}
}

// TestUSMatchesSI loads one plant written in US units and the same plant
// converted to SI by hand with the NIST factors: every SI quantity must
// agree.
func TestUSMatchesSI(t *testing.T) {
	us := mustLoad(t, "../testdata/plants/minimal-us.yaml")
	si := mustLoad(t, "../testdata/plants/minimal-si.yaml")
	mu, ms := us.Models[0], si.Models[0]
	pairs := []struct {
		name   string
		us, si float64
	}{
		{"design flow", float64(us.DesignFlow), float64(si.DesignFlow)},
		{"design head", float64(us.DesignHead), float64(si.DesignHead)},
		{"density", us.Fluid.Density, si.Fluid.Density},
		{"BEP flow", float64(mu.Pump.BEPFlow), float64(ms.Pump.BEPFlow)},
		{"BEP head", float64(mu.Pump.BEPHead), float64(ms.Pump.BEPHead)},
		{"BEP efficiency", mu.Pump.BEPEff, ms.Pump.BEPEff},
		{"shutoff head", float64(mu.Pump.ShutoffHead()), float64(ms.Pump.ShutoffHead())},
		{"motor rating", float64(mu.Motor.Rated), float64(ms.Motor.Rated)},
		{"motor efficiency", mu.Motor.FullLoadEff, ms.Motor.FullLoadEff},
		{"min flow", float64(mu.MinFlow), float64(ms.MinFlow)},
		{"runout", float64(mu.Runout), float64(ms.Runout)},
		{"required head at 70 %", float64(us.System.Required(0.7 * us.DesignFlow)), float64(si.System.Required(0.7 * si.DesignFlow))},
		{"bin flow", float64(us.Profile.Bins[0].Flow), float64(si.Profile.Bins[0].Flow)},
	}
	for _, p := range pairs {
		// The BEP is the argmax of a smooth curve, found only to about
		// √ε relative: the two files' last-digit differences move it.
		tol := 1e-9
		if p.name == "BEP flow" || p.name == "min flow" {
			tol = 1e-7
		}
		if !near(p.us, p.si, tol) {
			t.Errorf("%s: US file %.12g, SI file %.12g", p.name, p.us, p.si)
		}
	}
}

// conversionBase is a small plant with placeholders for the conversion
// table below.
const conversionBase = `units: {UNITS}
fluid: {FLUID}
pumps:
  - name: P
    rated_speed: 1770
    curve:
      - {flow: 0, head: {H0}}
      - {flow: {Q1}, head: {H1}, efficiency: 70}
      - {flow: {Q2}, head: {H2}, efficiency: 80}
      - {flow: {Q3}, head: {H3}, efficiency: 72}
    motor: {rated_output: {P}, full_load_efficiency: 93}
    drive: variable
system:
  design_flow: {QD}
  design_head: {HD}
  dp_control: {control_head: {HC}}
profile:
  bins: [{flow: 50%, hours: 1000}]
tariff: {currency: USD, energy_price: 0.1}
`

func fill(tmpl string, kv map[string]string) string {
	for k, v := range kv {
		tmpl = strings.ReplaceAll(tmpl, "{"+k+"}", v)
	}
	return tmpl
}

// TestUnitConversions reads the same quantities written in each accepted
// unit and compares with the NIST factors.
func TestUnitConversions(t *testing.T) {
	usPlant := map[string]string{"UNITS": "US", "FLUID": "{temperature: 68}", "H0": "100", "Q1": "300", "H1": "92",
		"Q2": "600", "H2": "75", "Q3": "800", "H3": "58", "P": "20", "QD": "600", "HD": "75", "HC": "20"}
	siPlant := map[string]string{"UNITS": "SI", "FLUID": "{temperature: 20}", "H0": "30", "Q1": "70", "H1": "27.6",
		"Q2": "140", "H2": "22.5", "Q3": "185", "H3": "17.5", "P": "15", "QD": "140", "HD": "22.5", "HC": "6"}
	rho20 := func(p *Plant) float64 { return p.Fluid.Density }
	with := func(base map[string]string, k, v string) map[string]string {
		m := map[string]string{}
		for a, b := range base {
			m[a] = b
		}
		m[k] = v
		return m
	}
	cases := []struct {
		name string
		kv   map[string]string
		get  func(*Plant) float64
		want func(*Plant) float64
	}{
		{"US bare flow is gpm", usPlant, func(p *Plant) float64 { return float64(p.DesignFlow) },
			func(*Plant) float64 { return 600 * nistGallon / 60 }}, // NIST SP 811: gallon exact
		{"US gpm suffix", with(usPlant, "QD", "600 gpm"), func(p *Plant) float64 { return float64(p.DesignFlow) },
			func(*Plant) float64 { return 600 * nistGallon / 60 }},
		{"US bare head is ft", usPlant, func(p *Plant) float64 { return float64(p.DesignHead) },
			func(*Plant) float64 { return 75 * nistFoot }}, // NIST SP 811: foot exact
		{"US ft suffix", with(usPlant, "HD", "75 ft"), func(p *Plant) float64 { return float64(p.DesignHead) },
			func(*Plant) float64 { return 75 * nistFoot }},
		{"US psi head uses the fluid density", with(usPlant, "HC", "8.5 psi"),
			func(p *Plant) float64 { return float64(p.System.(curves.DPControl).ControlHead) },
			func(p *Plant) float64 { return 8.5 * nistPSI / (rho20(p) * gn) }}, // NIST SP 811 psi; h = p/(ρ g)
		{"US psi head in glycol", with(with(usPlant, "HC", "8.5 psi"), "FLUID", "{specific_gravity: 1.04}"),
			func(p *Plant) float64 { return float64(p.System.(curves.DPControl).ControlHead) },
			func(p *Plant) float64 { return 8.5 * nistPSI / (1.04 * 999.972 * gn) }}, // SG relative to water at 4 °C, Kell 999.972
		{"US hp", usPlant, func(p *Plant) float64 { return float64(p.Models[0].Motor.Rated) },
			func(*Plant) float64 { return 20 * nistHP }}, // NIST SP 811: 1 hp = 745.69987158 W
		{"US 68 °F is 20 °C", usPlant, func(p *Plant) float64 { return p.Fluid.Temperature },
			func(*Plant) float64 { return 20 }}, // NIST SP 811: t/°C = (t/°F − 32)/1.8
		{"US 68 °F water density", usPlant, rho20,
			func(*Plant) float64 { return 998.204 }}, // Kell (1975) at 20 °C, docs/sources.md §2 check value
		{"US 39.2 °F water density", with(usPlant, "FLUID", "{temperature: 39.2 °F}"), rho20,
			func(*Plant) float64 { return 999.972 }}, // Kell (1975) at 4 °C, docs/sources.md §2 check value
		{"SI bare flow is m³/h", siPlant, func(p *Plant) float64 { return float64(p.DesignFlow) },
			func(*Plant) float64 { return 140.0 / 3600 }}, // m³/h by definition of the hour
		{"SI L/s suffix", with(siPlant, "QD", "38.9 L/s"), func(p *Plant) float64 { return float64(p.DesignFlow) },
			func(*Plant) float64 { return 0.0389 }}, // SI: 1 L = 1e-3 m³
		{"SI m3/h suffix", with(siPlant, "QD", "140 m3/h"), func(p *Plant) float64 { return float64(p.DesignFlow) },
			func(*Plant) float64 { return 140.0 / 3600 }},
		{"SI kPa head", with(siPlant, "HC", "60 kPa"), func(p *Plant) float64 { return float64(p.System.(curves.DPControl).ControlHead) },
			func(p *Plant) float64 { return 60e3 / (rho20(p) * gn) }}, // h = p/(ρ g), g from CGPM
		{"SI kW", siPlant, func(p *Plant) float64 { return float64(p.Models[0].Motor.Rated) },
			func(*Plant) float64 { return 15e3 }},
		{"SI 20 °C water density", siPlant, rho20,
			func(*Plant) float64 { return 998.204 }}, // Kell (1975), docs/sources.md §2 check value
		{"SI 60 °C water density", with(siPlant, "FLUID", "{temperature: 60 °C}"), rho20,
			func(*Plant) float64 { return 983.199 }}, // Kell (1975), docs/sources.md §2 check value
		{"SI glycol density", with(siPlant, "FLUID", "{specific_gravity: 1.04, temperature: -5}"), rho20,
			func(*Plant) float64 { return 1.04 * 999.972 }},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			p, err := Parse("conv.yaml", []byte(fill(conversionBase, c.kv)), "")
			if err != nil {
				t.Fatal(err)
			}
			// Kell check values are given to 0.001 kg/m³ (docs/sources.md §2).
			tol := 1e-12
			if strings.Contains(c.name, "density") && !strings.Contains(c.name, "glycol") {
				tol = 0.0011 / 1000
			}
			if got, want := c.get(p), c.want(p); !near(got, want, tol) {
				t.Errorf("got %.12g, want %.12g", got, want)
			}
		})
	}
}

// TestValidFiles loads every plant under testdata/plants with its own
// checks.
func TestValidFiles(t *testing.T) {
	checks := map[string]func(t *testing.T, p *Plant){
		"minimal-us.yaml": func(t *testing.T, p *Plant) {},
		"minimal-si.yaml": func(t *testing.T, p *Plant) {
			if p.Units != curves.SI {
				t.Errorf("units %v", p.Units)
			}
		},
		"glycol-tables.yaml": func(t *testing.T, p *Plant) {
			if p.Fluid.Density != 1.04*999.972 || p.Fluid.SG != 1.04 {
				t.Errorf("fluid %+v, want SG 1.04", p.Fluid)
			}
			// 25 °F recorded as °C: (25 − 32)/1.8 (NIST SP 811)
			if !near(p.Fluid.Temperature, (25-32)/1.8, 1e-12) {
				t.Errorf("temperature %g °C", p.Fluid.Temperature)
			}
			a, b := p.Models[0], p.Models[1]
			if a.Pump.SpeedCorrection || !b.Pump.SpeedCorrection {
				t.Errorf("speed correction: A %v (set false), B %v (default)", a.Pump.SpeedCorrection, b.Pump.SpeedCorrection)
			}
			if _, ok := a.Drive.(curves.TableDrive); !ok || b.Variable() {
				t.Errorf("drives %T and %T, want a table drive and fixed speed", a.Drive, b.Drive)
			}
			if b.MinSpeed != 1 || b.MaxSpeed != 1 {
				t.Errorf("fixed unit speeds %g–%g, want 1–1", b.MinSpeed, b.MaxSpeed)
			}
			if a.MinSpeed != 0.4 || a.MaxSpeed != 1.05 || a.Motor.ServiceFactor != 1 || len(a.Motor.Table) != 4 {
				t.Errorf("model A limits %g–%g SF %g table %d", a.MinSpeed, a.MaxSpeed, a.Motor.ServiceFactor, len(a.Motor.Table))
			}
			if a.Motor.Table[0].Load != 0.25 || a.Motor.Table[1].Load != 0.5 || a.Motor.Table[1].Eff != 0.895 {
				t.Errorf("motor table %+v", a.Motor.Table)
			}
			if b.Motor.Rated != a.Motor.Rated || len(b.Motor.Table) != len(a.Motor.Table) || b.Motor.FullLoadEff != a.Motor.FullLoadEff {
				t.Errorf("the aliased motor should be the same: %+v vs %+v", a.Motor, b.Motor)
			}
			// 52 psi of SG 1.04 fluid is the shutoff head, as given.
			if h := float64(a.Pump.Points[0].Head); !near(h, 52*nistPSI/(1.04*999.972*gn), 1e-12) {
				t.Errorf("shutoff point %g m", h)
			}
			// branch loss 2.5 psi at 300 gpm
			k := 2.5 * nistPSI / (1.04 * 999.972 * gn) / math.Pow(300*nistGallon/60, 2)
			if !near(a.BranchK, k, 1e-12) {
				t.Errorf("branch k %g, want %g", a.BranchK, k)
			}
			if !near(float64(a.MinFlow), 0.25*float64(a.Pump.BEPFlow), 1e-12) || !near(float64(a.Runout), 1.15*float64(a.Pump.BEPFlow), 1e-12) {
				t.Errorf("min flow / runout as %% of BEP wrong: %g %g", a.MinFlow, a.Runout)
			}
			r := p.System.(curves.DPControl).Reset
			if !near(float64(r.LowFlow), 300*nistGallon/60, 1e-12) || !near(float64(r.HighFlow), 0.9*float64(p.DesignFlow), 1e-12) {
				t.Errorf("reset %+v", r)
			}
			if !near(float64(p.MinFlow), 0.25*float64(p.DesignFlow), 1e-12) {
				t.Errorf("plant min flow %g", p.MinFlow)
			}
			if s := p.Sequence; s.StageUpDelayMin != 1.5 || s.StageDownDelayMin != 15 {
				t.Errorf("delays %g, %g min; want 90 s = 1.5 and 0.25 h = 15", s.StageUpDelayMin, s.StageDownDelayMin)
			}
			if slices.ContainsFunc(p.Defaults, func(s string) bool { return strings.HasPrefix(s, "tariff.periods") }) {
				t.Errorf("days were given for every period; none should be defaulted")
			}
		},
		"mixed-si-trend.yaml": func(t *testing.T, p *Plant) {
			if p.Profile.Trend == nil {
				t.Fatal("no trend")
			}
			tr := p.Profile.Trend
			if tr.Interval.Minutes() != 15 || tr.TimeFormat != "unix" || tr.TimeZone != "Europe/Berlin" || tr.FlowUnit != "L/s" {
				t.Errorf("trend %+v", tr)
			}
			if !near(float64(tr.MaxFlow), 300.0/3600, 1e-12) {
				t.Errorf("max flow %g", tr.MaxFlow)
			}
			if !near(float64(p.DesignFlow), 0.030, 1e-12) {
				t.Errorf("design flow 30 L/s = %g m³/s", p.DesignFlow)
			}
			if !near(float64(p.System.(curves.FixedCurve).Static), 250e3/(p.Fluid.Density*gn), 1e-12) {
				t.Errorf("static head 250 kPa")
			}
			if p.Retrofit.Escalation != -0.01 || p.Retrofit.LifeYears != 12 {
				t.Errorf("retrofit %+v", p.Retrofit)
			}
			if p.Models[1].Variable() {
				t.Errorf("BP-J is fixed speed")
			}
		},
	}
	files, _ := filepath.Glob("../testdata/plants/*.yaml")
	for _, f := range files {
		name := filepath.Base(f)
		t.Run(name, func(t *testing.T) {
			check, ok := checks[name]
			if !ok {
				t.Fatalf("no checks for %s: add them to TestValidFiles", name)
			}
			check(t, mustLoad(t, f))
		})
	}
}

// TestDocFormat parses the example plant of the package documentation, so
// the doc cannot drift from the format.
func TestDocFormat(t *testing.T) {
	src, err := os.ReadFile("doc.go")
	if err != nil {
		t.Fatal(err)
	}
	text := string(src)
	start := strings.Index(text, "// # A plant file\n")
	end := strings.Index(text, "// Keys are fixed")
	if start < 0 || end < start {
		t.Fatal("doc.go has no plant file example")
	}
	var b strings.Builder
	for _, line := range strings.Split(text[start:end], "\n")[1:] {
		if l, ok := strings.CutPrefix(line, "//\t"); ok {
			b.WriteString(l + "\n")
		}
	}
	p, err := Parse("doc.yaml", []byte(b.String()), "")
	if err != nil {
		t.Fatalf("the documented plant file does not load:\n%v\n%s", err, b.String())
	}
	if len(p.Warnings) > 0 {
		t.Errorf("the documented plant warns: %v", p.Warnings)
	}
	// The error lines at the top of the doc are the three-mistake golden.
	golden, err := os.ReadFile(filepath.Join(invalidDir, "three-mistakes.golden"))
	if err != nil {
		t.Fatal(err)
	}
	for _, g := range strings.Split(strings.TrimSpace(string(golden)), "\n") {
		want := "//\t" + strings.Replace(g, "three-mistakes.yaml", "plant.yaml", 1) + "\n"
		if !strings.Contains(text, want) {
			t.Errorf("doc.go does not show the current error text %q", g)
		}
	}
}

func TestErrorFormat(t *testing.T) {
	cases := []struct {
		e    Error
		want string
	}{
		{Error{File: "p.yaml", Line: 3, Column: 7, Path: "pumps[0].count", Msg: "bad"}, "p.yaml:3:7: pumps[0].count: bad"},
		{Error{File: "p.yaml", Line: 3, Msg: "YAML syntax: x"}, "p.yaml:3: YAML syntax: x"},
		{Error{File: "p.yaml", Msg: "file is empty"}, "p.yaml: file is empty"},
	}
	for _, c := range cases {
		if got := c.e.Error(); got != c.want {
			t.Errorf("got %q, want %q", got, c.want)
		}
	}
	list := ErrorList{&cases[0].e, &cases[1].e}
	if got := list.Error(); got != cases[0].want+"\n"+cases[1].want {
		t.Errorf("list = %q", got)
	}
	if !errors.Is(list, ErrInvalid) || !errors.Is(&cases[2].e, ErrInvalid) || errors.Is(ErrorList{}, ErrInvalid) {
		t.Errorf("errors.Is(ErrInvalid) wrong")
	}
	var one *Error
	if !errors.As(error(list), &one) || one != &cases[0].e {
		t.Errorf("errors.As should find the first *Error")
	}
}

func TestLoadMissingFile(t *testing.T) {
	_, err := Load(filepath.Join(t.TempDir(), "absent.yaml"))
	if !errors.Is(err, ErrInvalid) || !errors.Is(err, fs.ErrNotExist) {
		t.Errorf("got %v; want an input error that is also fs.ErrNotExist", err)
	}
}

func TestNearest(t *testing.T) {
	keys := []string{"rated_speed", "rated_output", "service_factor", "tariff", "units"}
	cases := map[string]string{
		"rated_sped":     "rated_speed",
		"ratedspeed":     "rated_speed",
		"rated_ouptut":   "rated_output", // a transposition is one edit
		"servise_factor": "service_factor",
		"tarif":          "tariff",
		"unit":           "units",
		"colour":         "",
		"x":              "",
	}
	for in, want := range cases {
		if got := nearest(in, keys); got != want {
			t.Errorf("nearest(%q) = %q, want %q", in, got, want)
		}
	}
}

func TestFmtNum(t *testing.T) {
	cases := map[float64]string{0: "0", 1000: "1000", 991.26: "991.3", 90.95: "90.95", 1.15: "1.15", 0.0078: "0.0078", -2000: "-2000", 27185.4: "27185"}
	for in, want := range cases {
		if got := fmtNum(in); got != want {
			t.Errorf("fmtNum(%g) = %q, want %q", in, got, want)
		}
	}
}

func ExampleParse() {
	src := `
units: US
pumps:
  - name: HWP
    rated_speed: 1770
    curve:
      - {flow: 0, head: 80}
      - {flow: 200, head: 77, efficiency: 55}
      - {flow: 400, head: 70, efficiency: 74}
      - {flow: 600, head: 59, efficiency: 80}
      - {flow: 700, head: 52, efficiency: 78}
      - {flow: 800, head: 44, efficiecny: 72}
    motor: {rated_output: 25}
    drive: variable
system:
  design_flow: 600
  design_head: 58
  dp_control: {control_head: 9 psi}
profile:
  bins: [{flow: 50%, hours: 3000}]
tariff: {currency: USD, energy_price: 0.1}
`
	_, err := Parse("hw.yaml", []byte(src), "")
	fmt.Println(err)
	// Output:
	// hw.yaml:12:31: pumps[0].curve[5].efficiecny: unknown key "efficiecny" (did you mean "efficiency"?)
}

// BenchmarkLoad measures loading and fitting the chilled-water example.
func BenchmarkLoad(b *testing.B) {
	data, err := os.ReadFile("../examples/chilled-water.yaml")
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Parse("chilled-water.yaml", data, ""); err != nil {
			b.Fatal(err)
		}
	}
}
