package handover_test

import (
	"bytes"
	"fmt"
	"math"
	"reflect"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
	"wattstage/study"
	"wattstage/workbook"
)

// TestStrategiesMatchResult: one workbook strategy per study strategy, in
// the study's order, carrying its annual figures unchanged, and the
// baseline the study chose (fixed speed, throttled, when none is named).
func TestStrategiesMatchResult(t *testing.T) {
	for _, name := range exampleFiles {
		t.Run(name, func(t *testing.T) {
			ex := loadExample(t, name)
			r, res := ex.report, ex.result
			if len(r.Strategies) != len(res.Strategies) {
				t.Fatalf("%d strategies for %d in the study", len(r.Strategies), len(res.Strategies))
			}
			for i, st := range res.Strategies {
				s := r.Strategies[i]
				for _, c := range []struct {
					what      string
					got, want float64
				}{
					{"energy (kWh/yr)", s.EnergyKWh, st.Annual.Energy},
					{"peak (kW)", s.PeakKW, st.Energy.PeakKW},
					{"drives to buy", float64(s.DrivesToBuy), float64(st.DrivesAdded)},
					{"hours unmet (h/yr)", s.HoursUnmet, st.Energy.HoursUnmet * res.Period.Factor},
					{"energy cost", s.EnergyCost, st.Annual.EnergyCost},
					{"billed demand (kW·month/yr)", s.BilledDemand, st.Annual.BilledDemand},
				} {
					if c.got != c.want { // copied, not recomputed: exact
						t.Errorf("%s: %s = %v, the study says %v", st.Name, c.what, c.got, c.want)
					}
				}
				if s.Name != st.Name {
					t.Errorf("strategy %d named %q, the study's %q", i, s.Name, st.Name)
				}
			}
			if want := study.DefaultBaseline(ex.plant); r.Baseline != res.Baseline || res.BaselineStrategy().Key != want {
				t.Errorf("baseline %d, study %d (%s); want %s (study.DefaultBaseline)", r.Baseline, res.Baseline, res.BaselineStrategy().Key, want)
			}
			if want := 3 + len(res.Range.Cases); len(r.SavingsRange) != want {
				t.Errorf("%d savings-range rows, want expected + %d cases + low and high ends", len(r.SavingsRange), len(res.Range.Cases))
			}
			lo, base := res.Strategy(study.KeyLowest), res.BaselineStrategy()
			for _, want := range []string{thousands(lo.Annual.Energy) + " kWh/yr", thousands(base.Annual.Energy) + " kWh/yr for " + base.Name} {
				if !strings.Contains(r.Recommendation, want) {
					t.Errorf("recommendation %q lacks %q", r.Recommendation, want)
				}
			}
			if r.Recommendation != res.Recommendation {
				t.Errorf("recommendation %q, the study's %q", r.Recommendation, res.Recommendation)
			}
		})
	}
}

// TestEconomicsAgreeWithResult: the appraisal the Economics sheet computes
// by formula (workbook.ComputeEconomics, which the LibreOffice test holds
// the spreadsheet to) gives each strategy the annual bill and, against the
// baseline, the savings, investment and NPV that package econ computed in
// the study — two separate implementations of the same appraisal.
func TestEconomicsAgreeWithResult(t *testing.T) {
	for _, name := range exampleFiles {
		t.Run(name, func(t *testing.T) {
			ex := loadExample(t, name)
			e, err := workbook.ComputeEconomics(ex.report)
			if err != nil {
				t.Fatal(err)
			}
			for i, st := range ex.result.Strategies {
				se := e.Strategies[i]
				a := st.Annual
				cases := []struct {
					what      string
					got, want float64
				}{
					{"energy cost", se.EnergyCost, a.EnergyCost},
					{"demand cost", se.DemandCost, a.DemandCost},
					{"total cost", se.TotalCost, a.Total},
					{"emissions (t/yr)", se.Emissions, a.Emissions / 1000},
				}
				if ap := st.Appraisal; ap != nil {
					cases = append(cases, []struct {
						what      string
						got, want float64
					}{
						{"energy saved", se.EnergySaved, ap.EnergySaved},
						{"cost saved", se.CostSaved, ap.AnnualSavings},
						{"investment", se.Investment, ap.Investment},
						{"NPV", se.NPV, ap.NPV},
						{"PV factor", e.PVFactor, ap.UPV},
					}...)
					if ap.PaysBack != se.HasSaving || ap.PaysBack && !near(se.Payback, ap.SimplePayback, 1e-9) {
						t.Errorf("%s: payback %v (saving %v), study %v (pays back %v)", st.Name, se.Payback, se.HasSaving, ap.SimplePayback, ap.PaysBack)
					}
				}
				for _, c := range cases {
					if !near(c.got, c.want, 1e-9) {
						t.Errorf("%s: %s %v in the workbook, %v in the study", st.Name, c.what, c.got, c.want)
					}
				}
			}
		})
	}
}

// TestLoadPoints: the load points are every strategy's load points, a
// year, in the study's order; each one adds up (kWh = kW × served hours,
// the units carry at least the plant flow); and over a strategy they add up
// to its annual energy, energy cost and a year of hours — for a trend too,
// since its points gather the intervals' own results.
func TestLoadPoints(t *testing.T) {
	for _, name := range exampleFiles {
		t.Run(name, func(t *testing.T) {
			ex := loadExample(t, name)
			r, res := ex.report, ex.result
			f := res.Period.Factor
			k := 0
			for i, st := range res.Strategies {
				var hours, kwh, cost float64
				for _, want := range st.LoadPoints {
					if k >= len(r.LoadPoints) {
						t.Fatalf("%d load points, fewer than the study's", len(r.LoadPoints))
					}
					lp := r.LoadPoints[k]
					k++
					where := fmt.Sprintf("%s, %s", st.Name, lp.Bin)
					if lp.Strategy != r.Strategies[i].Name || lp.Hours != want.Hours*f || lp.KWh != want.KWh*f || lp.Cost != want.Cost*f {
						t.Errorf("%s: %q, %v h, %v kWh, %v; the study's %v h, %v kWh, %v × %v", where, lp.Strategy, lp.Hours, lp.KWh, lp.Cost,
							want.Hours, want.KWh, want.Cost, f)
					}
					checkPoint(t, where, ex.plant.Units, lp, want, st.Drives)
					hours += lp.Hours
					kwh += lp.KWh
					cost += lp.Cost
				}
				if !near(kwh, r.Strategies[i].EnergyKWh, 1e-9) {
					t.Errorf("%s: load points add up to %.3f kWh/yr, the strategy %.3f", st.Name, kwh, r.Strategies[i].EnergyKWh)
				}
				if !near(cost, st.Annual.EnergyCost, 1e-9) {
					t.Errorf("%s: load points cost %.3f a year, the tariff's annual energy cost %.3f", st.Name, cost, st.Annual.EnergyCost)
				}
				if !near(hours, curves.HoursPY, 1e-9) {
					t.Errorf("%s: load points cover %.3f h/yr, want 8,760", st.Name, hours)
				}
			}
			if k != len(r.LoadPoints) {
				t.Errorf("%d load points, the study has %d", len(r.LoadPoints), k)
			}
		})
	}
}

// checkPoint checks one load point's own arithmetic; drives is how many of
// the strategy's units have a drive.
func checkPoint(t *testing.T, where string, u curves.UnitSystem, lp workbook.LoadPoint, sp study.LoadPoint, drives int) {
	t.Helper()
	served := lp.Hours * (1 - sp.HoursUnmet/sp.Hours)
	if !near(lp.KWh, lp.KW*served, 1e-12) {
		t.Errorf("%s: %v kWh ≠ %v kW × %v served h", where, lp.KWh, lp.KW, served)
	}
	if sp.State.Status != optimize.Served {
		return
	}
	if lp.UnitsRunning != len(lp.Units) || lp.UnitsRunning < 1 || strings.Count(lp.Running, "+")+1 != lp.UnitsRunning {
		t.Errorf("%s: %d running, %d unit rows, running %q", where, lp.UnitsRunning, len(lp.Units), lp.Running)
	}
	var kw, flow float64
	for _, un := range lp.Units {
		kw += un.KW
		flow += un.Flow
		for _, e := range []float64{un.PumpEff, un.MotorEff} {
			if !(e > 0 && e <= 100) {
				t.Errorf("%s: %s efficiency %v %%, want in (0, 100]", where, un.Unit, e)
			}
		}
		switch {
		case math.IsNaN(un.DriveEff):
			if un.Speed != 100 {
				t.Errorf("%s: %s has no drive but runs at %v %%", where, un.Unit, un.Speed)
			}
		case drives == 0:
			t.Errorf("%s: %s shows a drive efficiency %v %% in a strategy without drives", where, un.Unit, un.DriveEff)
		case !(un.DriveEff > 0 && un.DriveEff <= 100) || !(un.Speed > 0 && un.Speed <= 100+1e-9):
			t.Errorf("%s: %s on a drive at %v %% speed, drive efficiency %v %%", where, un.Unit, un.Speed, un.DriveEff)
		}
	}
	// The units shown are the point's state: the bin's own, or a typical
	// interval of a flow group, whose input they add up to.
	if want := float64(sp.State.Power) / curves.KW; !near(kw, want, 1e-9) {
		t.Errorf("%s: units draw %v kW in all, the state %v kW", where, kw, want)
	}
	if !sp.Grouped && !near(kw, lp.KW, 1e-9) {
		t.Errorf("%s: units draw %v kW in all, the bin %v kW", where, kw, lp.KW)
	}
	if want := u.FlowOut(sp.State.LoadFlow); flow < want*(1-1e-9) {
		t.Errorf("%s: units pump %v, less than the load flow %v", where, flow, want)
	}
	if lp.Head < lp.RequiredHead*(1-1e-9) {
		t.Errorf("%s: header head %v below the required %v", where, lp.Head, lp.RequiredHead)
	}
}

// TestCharts: an operating-points and an efficiency chart per pump model,
// a group power series per strategy, equal-length X and Y in every series;
// the rated speed head curve is the fitted polynomial shown on the Inputs
// sheet, and the curves at lower speed follow the affinity laws; as many
// system curves as the model has units installed; every operating point
// of the lowest-power staging is drawn and lies on its unit's curve at its
// speed; the preferred-region, minimum-flow and runout edges follow the
// affinity laws from their rated-speed flows (ANSI/HI 9.6.3 preferred
// region 70–120 % of BEP flow, as quoted in the trade press [V]).
func TestCharts(t *testing.T) {
	for _, name := range exampleFiles {
		t.Run(name, func(t *testing.T) {
			ex := loadExample(t, name)
			r, p := ex.report, ex.plant
			u := p.Units
			c := r.Curves
			if len(c.Head) != len(p.Models) || len(c.Efficiency) != len(p.Models) {
				t.Fatalf("%d head and %d efficiency charts for %d pump models", len(c.Head), len(c.Efficiency), len(p.Models))
			}
			all := append(append([]workbook.Chart{}, c.Head...), c.Efficiency...)
			for _, ch := range append(all, c.GroupPower) {
				if len(ch.Series) == 0 || ch.XLabel == "" || ch.YLabel == "" {
					t.Errorf("chart %q: %d series, axes %q and %q", ch.Title, len(ch.Series), ch.XLabel, ch.YLabel)
				}
				for _, s := range ch.Series {
					if len(s.X) != len(s.Y) || len(s.X) < 2 && s.Style != workbook.StylePoints || len(s.X) == 0 {
						t.Errorf("chart %q, series %q: %d x and %d y values", ch.Title, s.Name, len(s.X), len(s.Y))
					}
				}
			}
			if len(c.GroupPower.Series) != len(r.Strategies) {
				t.Errorf("group power has %d series for %d strategies", len(c.GroupPower.Series), len(r.Strategies))
			}
			for i, s := range c.GroupPower.Series {
				if i < len(r.Strategies) && s.Name != r.Strategies[i].Name {
					t.Errorf("group power series %d is %q, strategy %q", i, s.Name, r.Strategies[i].Name)
				}
			}
			lowest := ex.result.Strategy(study.KeyLowest)
			for i, m := range p.Models {
				hc := c.Head[i]
				if !strings.HasPrefix(hc.Title, m.Name+":") || !strings.HasPrefix(c.Efficiency[i].Title, m.Name+":") {
					t.Errorf("charts of %s titled %q and %q", m.Name, hc.Title, c.Efficiency[i].Title)
				}
				systems := 0
				design := u.FlowOut(p.DesignFlow)
				for _, s := range hc.Series {
					var n float64
					if _, err := fmt.Sscanf(s.Name, "system, %g running", &n); err == nil {
						// The system curve shared by n units spans the design flow
						// (where the units can reach it) and a tenth past it.
						systems++
						last := n * s.X[len(s.X)-1]
						if last > 1.1*design*(1+1e-9) || n*u.FlowOut(top(m)) >= design && last < design {
							t.Errorf("%s, %s: ends at %v %s of plant flow, want the design %v to 1.1 × design", m.Name, s.Name, last, u.FlowUnit(), design)
						}
						continue
					}
					switch s.Name {
					case "lowest-power staging, each load step":
						checkOperatingPoints(t, ex, i, s, lowest)
					case "best efficiency point (rated speed)":
						if !near(s.X[0], u.FlowOut(m.Pump.BEPFlow), 1e-12) || !near(s.Y[0], u.HeadOut(m.Pump.BEPHead), 1e-12) {
							t.Errorf("%s: BEP drawn at (%v, %v)", m.Name, s.X[0], s.Y[0])
						}
					case "preferred region, 70 % of BEP flow":
						checkEdge(t, hc.Title, s, r.Pumps[i].HeadFit, 0.7*r.Pumps[i].BEPFlow)
					case "preferred region, 120 % of BEP flow":
						checkEdge(t, hc.Title, s, r.Pumps[i].HeadFit, 1.2*r.Pumps[i].BEPFlow)
					case "minimum flow":
						checkEdge(t, hc.Title, s, r.Pumps[i].HeadFit, r.Pumps[i].MinFlow)
					case "runout":
						checkEdge(t, hc.Title, s, r.Pumps[i].HeadFit, r.Pumps[i].MaxFlow)
					default:
						checkAffinity(t, hc.Title, s, r.Pumps[i].HeadFit)
					}
				}
				if systems != m.Count {
					t.Errorf("%s: %d system curves, want one per running count 1…%d (its installed units)", m.Name, systems, m.Count)
				}
			}
		})
	}
}

// top is the largest flow per unit a model's charts show: its runout, or
// the last datasheet flow.
func top(m plant.Model) curves.Flow {
	if m.Runout > 0 {
		return m.Runout
	}
	return m.Pump.LastFlow
}

// thousands writes v rounded to a whole number with a comma between
// groups of three digits, e.g. 122,665.
func thousands(v float64) string {
	n := int64(math.Round(v))
	if n < 0 {
		return "-" + thousands(float64(-n))
	}
	if n < 1000 {
		return strconv.FormatInt(n, 10)
	}
	return thousands(float64(n/1000)) + fmt.Sprintf(",%03d", n%1000)
}

// checkAffinity checks a head series named "NN % speed" against the fitted
// rated-speed polynomial H₀ by the affinity laws, H(Q, s) = s²·H₀(Q/s)
// (docs/sources.md §3, every pump handbook [P]).
func checkAffinity(t *testing.T, chart string, s workbook.Series, fit []float64) {
	t.Helper()
	name := strings.TrimPrefix(s.Name, "head at ")
	name = strings.TrimSuffix(strings.TrimSuffix(name, " (maximum)"), " (minimum)")
	pct, ok := strings.CutSuffix(name, " % speed")
	v, err := strconv.ParseFloat(pct, 64)
	if !ok || err != nil {
		t.Errorf("%s: series %q is neither a speed nor a system curve", chart, s.Name)
		return
	}
	sp := v / 100
	for k, q := range s.X {
		h0 := 0.0
		for pow, a := range fit {
			h0 += a * math.Pow(q/sp, float64(pow))
		}
		if want := sp * sp * h0; !near(s.Y[k], want, 1e-9) {
			t.Errorf("%s, %s at %v: head %v, affinity law on the fitted curve %v", chart, s.Name, q, s.Y[k], want)
			return
		}
	}
}

// checkEdge checks a limit drawn across speeds: each point (q, h) is the
// rated-speed flow ref scaled to speed s = q/ref (affinity: flow ∝ s) at
// the head of the fitted curve at that speed (h = s²·H₀(q/s)).
func checkEdge(t *testing.T, chart string, s workbook.Series, fit []float64, ref float64) {
	t.Helper()
	for k, q := range s.X {
		sp := q / ref
		h0 := 0.0
		for pow, a := range fit {
			h0 += a * math.Pow(q/sp, float64(pow))
		}
		if want := sp * sp * h0; !near(s.Y[k], want, 1e-9) {
			t.Errorf("%s, %s at %v: head %v, the fitted curve at %.3f × rated speed gives %v", chart, s.Name, q, s.Y[k], sp, want)
			return
		}
	}
}

// checkOperatingPoints: every running unit of model i at every load point
// of the lowest-power staging is on the chart, and its head is the pump
// curve's at its flow and speed less nothing (the unit's own head).
func checkOperatingPoints(t *testing.T, ex *example, i int, s workbook.Series, lowest *study.Strategy) {
	t.Helper()
	u := ex.plant.Units
	m := ex.plant.Models[i]
	drawn := map[[2]float64]bool{}
	for k := range s.X {
		drawn[[2]float64{s.X[k], s.Y[k]}] = true
	}
	for _, lp := range lowest.LoadPoints {
		for _, un := range lp.State.Units {
			if un.Model != i {
				continue
			}
			if !drawn[[2]float64{u.FlowOut(un.Flow), u.HeadOut(un.Head)}] {
				t.Errorf("%s: the unit at %v %s, %v %s is not drawn", m.Name, u.FlowOut(un.Flow), u.FlowUnit(), u.HeadOut(un.Head), u.HeadUnit())
			}
			// 1e-6 relative: the solver's own tolerance on the head balance.
			if want := m.Pump.Head(un.Flow, un.Speed); !near(float64(un.Head), float64(want), 1e-6) {
				t.Errorf("%s: operating point head %v m off its curve (%v m at %.3f speed)", m.Name, un.Head, want, un.Speed)
			}
		}
	}
}

// TestEconomicsInputs: the live inputs are the plant file's tariff and
// retrofit terms, and the currency its label.
func TestEconomicsInputs(t *testing.T) {
	for _, name := range exampleFiles {
		t.Run(name, func(t *testing.T) {
			ex := loadExample(t, name)
			p, e := ex.plant, ex.report.Economics
			want := workbook.EconomicsInputs{EnergyPrice: p.Tariff.EnergyPrice, DemandCharge: p.Tariff.DemandCharge,
				DriveCost: p.Retrofit.DriveCost, OtherCost: p.Retrofit.OtherCost, LifeYears: p.Retrofit.LifeYears,
				DiscountRate: p.Retrofit.DiscountRate, Escalation: p.Retrofit.Escalation, EmissionsFactor: p.Tariff.EmissionsFactor}
			if e != want {
				t.Errorf("economics inputs\n got %+v\nwant %+v (the plant's tariff and retrofit)", e, want)
			}
			if ex.report.Units.Currency != p.Tariff.Currency {
				t.Errorf("currency %q, tariff %q", ex.report.Units.Currency, p.Tariff.Currency)
			}
		})
	}
}

// TestInputsAsGiven checks the Inputs figures against the numbers written
// in the example files, converted by published constants: the datasheet
// points come back as typed, pressures become head through the fluid's
// density, a runout in L/s shows in m³/h.
func TestInputsAsGiven(t *testing.T) {
	const (
		psi = 6894.757293 // Pa, NIST SP 811 [V] (docs/sources.md §1)
		ft  = 0.3048      // m, exact, NIST SP 811 [V]
		g   = 9.80665     // m/s², standard gravity [V]
	)
	// kell is water density in kg/m³ at t °C, Kell (1975) (docs/sources.md §2 [C]).
	kell := func(t float64) float64 {
		return (999.83952 + 16.945176*t - 7.9870401e-3*t*t - 46.170461e-6*t*t*t + 105.56302e-9*t*t*t*t - 280.54253e-12*t*t*t*t*t) /
			(1 + 16.879850e-3*t)
	}
	quantity := func(t *testing.T, qs []workbook.Quantity, label string) workbook.Quantity {
		t.Helper()
		for _, q := range qs {
			if q.Label == label {
				return q
			}
		}
		t.Fatalf("no quantity %q", label)
		return workbook.Quantity{}
	}
	chwPoints := [][2]float64{{0, 118}, {400, 112}, {700, 103}, {1000, 91}, {1200, 80}, {1400, 67}} // gpm, ft: examples/chilled-water*.yaml
	for _, c := range []struct {
		file      string
		flow      string
		head      string
		tempC     float64      // fluid temperature in °C
		points    [][2]float64 // first model's datasheet points, file units
		check     func(t *testing.T, r *workbook.Report, rho float64)
		currency  string
		economics workbook.EconomicsInputs // as written in the file
	}{
		{
			file: "chilled-water.yaml", flow: "gpm", head: "ft", tempC: (44 - 32) / 1.8, points: chwPoints, currency: "USD",
			economics: workbook.EconomicsInputs{EnergyPrice: 0.092, DemandCharge: 13.75, DriveCost: 7800, OtherCost: 6500, LifeYears: 15,
				DiscountRate: 0.05, Escalation: 0.025, EmissionsFactor: 0.39},
			check: func(t *testing.T, r *workbook.Report, rho float64) {
				// control_head: 15 psi, reset low_head: 8 psi, as head in ft.
				for label, p := range map[string]float64{"Control head at design": 15, "Reset: control head at low flow": 8} {
					if got, want := quantity(t, r.System, label).Value, p*psi/(rho*g)/ft; !near(got, want, 1e-6) {
						t.Errorf("%s: %v ft, want %v psi = %v ft at %v kg/m³", label, got, p, want, rho)
					}
				}
				if got := quantity(t, r.System, "Plant minimum flow (bypass)").Value; !near(got, 600, 1e-9) {
					t.Errorf("plant minimum flow %v gpm, the file says 600", got)
				}
			},
		},
		{
			file: "condenser-water.yaml", flow: "m³/h", head: "m", tempC: 29, currency: "EUR",
			points: [][2]float64{{0, 34.0}, {200, 32.4}, {350, 30.2}, {550, 25.8}, {650, 23.0}, {750, 19.8}},
			// life_years and escalation are not in the file: the loader's defaults.
			economics: workbook.EconomicsInputs{EnergyPrice: 0.14, DemandCharge: 9.5, DriveCost: 11500, OtherCost: 8000, LifeYears: 15,
				DiscountRate: 0.04, Escalation: 0, EmissionsFactor: 0.23},
			check: func(t *testing.T, r *workbook.Report, rho float64) {
				// runout: 94 L/s; 1 L/s = 3.6 m³/h exactly.
				if got := r.Pumps[1].MaxFlow; !near(got, 94*3.6, 1e-9) {
					t.Errorf("CWP-S runout %v m³/h, want 94 L/s = 338.4 m³/h", got)
				}
				if got := quantity(t, r.System, "Static head").Value; !near(got, 5, 1e-9) {
					t.Errorf("static head %v m, the file says 5", got)
				}
				// A static-plus-friction curve, H = Hs + (Hd − Hs)(Q/Qd)² with
				// friction as Q² (common practice [P]), through 5 m at no flow
				// and the design 26 m at 1100 m³/h.
				for _, s := range r.Curves.Head[0].Series {
					var n float64
					if _, err := fmt.Sscanf(s.Name, "system, %g running", &n); err != nil {
						continue
					}
					for k, q := range s.X {
						if want := 5 + 21*math.Pow(n*q/1100, 2); !near(s.Y[k], want, 1e-9) {
							t.Errorf("%s at %v m³/h per unit: %v m, want %v", s.Name, q, s.Y[k], want)
							break
						}
					}
				}
			},
		},
		{
			file: "chilled-water-trend.yaml", flow: "gpm", head: "ft", tempC: (44 - 32) / 1.8, points: chwPoints, currency: "USD",
			economics: workbook.EconomicsInputs{EnergyPrice: 0.092, DemandCharge: 13.75, DriveCost: 7800, OtherCost: 6500, LifeYears: 15,
				DiscountRate: 0.05, Escalation: 0.025, EmissionsFactor: 0.39},
			check: func(t *testing.T, r *workbook.Report, rho float64) {
				if !strings.Contains(strings.Join(r.Notes, "\n"), "flow groups 150.0 gpm wide") {
					t.Errorf("notes do not say the load points gather intervals into flow groups: %q", r.Notes)
				}
			},
		},
	} {
		t.Run(c.file, func(t *testing.T) {
			r := loadExample(t, c.file).report
			if r.Units.Flow != c.flow || r.Units.Head != c.head || r.Units.Currency != c.currency {
				t.Errorf("units %q, %q, %q; want %q, %q, %q", r.Units.Flow, r.Units.Head, r.Units.Currency, c.flow, c.head, c.currency)
			}
			if r.Economics != c.economics {
				t.Errorf("economics inputs\n got %+v\nwant %+v (as the file writes them)", r.Economics, c.economics)
			}
			pts := r.Pumps[0].Points
			if len(pts) != len(c.points) {
				t.Fatalf("%d datasheet points, the file has %d", len(pts), len(c.points))
			}
			for i, want := range c.points {
				if !near(pts[i].Flow, want[0], 1e-9) || !near(pts[i].Head, want[1], 1e-9) {
					t.Errorf("datasheet point %d: %v %s at %v %s, the file says %v at %v", i, pts[i].Head, c.head, pts[i].Flow, c.flow, want[1], want[0])
				}
			}
			rho := quantity(t, r.Fluid, "Density").Value
			if want := kell(c.tempC); !near(rho, want, 1e-9) {
				t.Errorf("density %v kg/m³, Kell (1975) at %.2f °C gives %v", rho, c.tempC, want)
			}
			c.check(t, r, rho)
		})
	}
}

// TestCautions: the workbook's Summary shows the study's one copy of the
// cautions, word for word.
func TestCautions(t *testing.T) {
	ex := loadExample(t, "chilled-water.yaml")
	if !reflect.DeepEqual(ex.report.Cautions, study.Cautions) {
		t.Errorf("report cautions %q, the study's %q", ex.report.Cautions, study.Cautions)
	}
	shown := summaryText(t, ex.report)
	for _, c := range study.Cautions {
		if !strings.Contains(shown, c) {
			t.Errorf("the Summary lacks the caution %q", c)
		}
	}
}

// summaryText writes the workbook for r and returns the Summary sheet's
// cells as one text, a line per row.
func summaryText(t *testing.T, r *workbook.Report) string {
	t.Helper()
	data, err := workbook.Bytes(r)
	if err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenReader(bytes.NewReader(data))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := f.GetRows("Summary")
	if err != nil {
		t.Fatal(err)
	}
	var b strings.Builder
	for _, row := range rows {
		b.WriteString(strings.Join(row, "\t") + "\n")
	}
	return b.String()
}
