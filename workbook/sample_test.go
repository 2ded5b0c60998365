package workbook

import (
	"fmt"
	"math"
	"strings"
)

// sampleReport is an invented plant for the tests and the rendering check:
// a chilled-water secondary group of two large pumps and one small pump on
// drives, ten flow bins, four strategies. Its numbers come from a small
// affinity-law model below so that they hang together (kWh = kW × hours,
// totals match the annual figures); they are demo data, not a check.
func sampleReport() *Report {
	models := []sampleModel{
		// a0 ft, a1 ft/gpm, a2 ft/gpm²; e1 %/gpm, e2 %/gpm² (η = e1 Q + e2 Q²)
		{name: "Model A 6x5-11", units: "P1, P2", a: [3]float64{118, -0.0075, -2.5e-5}, e: [2]float64{0.205, -1.28125e-4}, bep: 800, runout: 1250, minFlow: 200, motorHP: 25, motorEff: 93.6},
		{name: "Model B 4x3-10", units: "P3", a: [3]float64{110, -0.01, -1.125e-4}, e: [2]float64{0.38, -4.75e-4}, bep: 400, runout: 700, minFlow: 100, motorHP: 15, motorEff: 92.4},
	}
	const (
		designFlow = 1800.0 // gpm
		designHead = 90.0   // ft
		ctlHead    = 30.0   // ft
	)
	sys := func(q float64) float64 { return ctlHead + (designHead-ctlHead)*(q/designFlow)*(q/designFlow) }
	bins := []struct {
		frac, hours float64
	}{{0.20, 420}, {0.30, 610}, {0.40, 780}, {0.50, 900}, {0.60, 860}, {0.70, 740}, {0.80, 560}, {0.90, 380}, {0.95, 190}, {1.00, 80}}

	r := &Report{
		Plant:    "Harbourview Medical Annex, CHW secondary",
		Subtitle: "Chilled-water secondary group: two large and one small pump, DP control at the far riser",
		Date:     "2025-03-14",
		Units:    Units{System: "US", Flow: "gpm", Head: "ft", Pressure: "psi", MotorPower: "hp", Speed: "rpm", Currency: "$"},
		Cautions: sampleCautions,
		Assumptions: []string{
			"Motor part-load efficiency from the DOE appendix A loss factor (default).",
			"Drive losses from the DOE appendix A motor-and-drive factor for P3 (default; no drive data given).",
			"Efficiency at reduced speed by the affinity laws without the Sârbu–Borza step-down.",
			"Load profile from a typical-year bin table supplied by the owner; 5,520 h/yr of operation.",
			"Specific gravity 1.00 (plain water at 44 °F).",
		},
		Notes: []string{
			"Bins at 20 % and 30 % of design flow run below the chiller minimum of 450 gpm; the plant bypass carries the difference.",
			"P3 runs left of its preferred operating region (70–120 % of BEP flow, ANSI/HI 9.6.3) in the 20 % bin.",
		},
		Recommendation: "Run the optimised staging on drives: P3 alone up to about 480 gpm, one large pump to about 1,000 gpm, two large pumps above, all at a common speed on DP control with reset.",
		Checks: []Check{
			{Name: "ASHRAE 90.1 §6.5.4.2 part-load power (30 % at 50 % flow)", Result: "pass", Detail: "Optimised staging draws 22.8 % of design power at 50 % of design flow; per the user's code edition, verify locally."},
			{Name: "One unit out", Result: "pass with margin", Detail: "With P1 out, P2 and P3 deliver 1,820 gpm at 90 ft; P2 motor at 96 % of rated output."},
		},
		System: []Quantity{
			{Label: "Control", Text: "differential pressure at the far riser, reset by valve position"},
			{Label: "Design flow", Value: designFlow, Unit: "gpm"},
			{Label: "Design head", Value: designHead, Unit: "ft"},
			{Label: "Control head", Value: ctlHead, Unit: "ft", Source: "DP setpoint 13 psi × 2.31 ft/psi"},
			{Label: "Plant minimum flow", Value: 450, Unit: "gpm", Source: "chiller data, to be confirmed", Default: true},
		},
		Fluid: []Quantity{
			{Label: "Fluid", Text: "water"},
			{Label: "Temperature", Value: 44, Unit: "°F"},
			{Label: "Specific gravity", Value: 1.0, Decimals: 3, Unit: "–", Default: true},
			{Label: "Density", Value: 999.9, Decimals: 1, Unit: "kg/m³", Source: "Kell (1975)"},
		},
		Tariff: Tariff{
			Description: "Flat energy price with a monthly demand charge",
			Items: []Quantity{
				{Label: "Energy price", Value: 0.1320, Decimals: 4, Unit: "$/kWh", Source: "utility bill, 2024"},
				{Label: "Demand charge", Value: 14.50, Decimals: 2, Unit: "$/kW·month", Source: "utility bill, 2024"},
				{Label: "Emissions factor", Value: 0.386, Decimals: 3, Unit: "kg CO₂e/kWh", Source: "grid average", Default: true},
			},
		},
		Economics: EconomicsInputs{
			EnergyPrice: 0.1320, DemandCharge: 14.50, DriveCost: 9800, OtherCost: 6500,
			LifeYears: 15, DiscountRate: 0.05, Escalation: 0.02, EmissionsFactor: 0.386,
		},
		Staging: Staging{
			Rows: []StagingRow{
				{From: 1, To: 1, Units: "P1 replaces P3", UpSpeed: 92, UpFlow: 480, UpDelay: 5, DownSpeed: 55, DownFlow: 420, DownDelay: 10, Note: "Small pump to one large pump; hold P3 until P1 proves flow."},
				{From: 1, To: 2, Units: "P2", UpSpeed: 90, UpFlow: 1000, UpDelay: 5, DownSpeed: 62, DownFlow: 880, DownDelay: 10, Note: "Second large pump; ramp both to a common speed."},
			},
			Settings: []Quantity{
				{Label: "Minimum speed", Value: 30, Unit: "%", Default: true},
				{Label: "DP setpoint at design", Value: 13, Unit: "psi"},
				{Label: "Lead rotation", Text: "weekly, at the lowest-load hour, between P1 and P2"},
				{Label: "Failure response", Text: "on a pump fault or loss of flow, start the next unit at once without delay"},
			},
			Sequence: []string{
				"Enable the group when any chiller is called. Start P3 and ramp to hold the DP setpoint at the far riser.",
				"When P3 speed stays above 92 % or plant flow above 480 gpm for 5 minutes, start P1, ramp it to the DP setpoint, then stop P3.",
				"When speed stays above 90 % or flow above 1,000 gpm for 5 minutes, start P2 and run P1 and P2 at a common speed.",
				"Stage down when speed stays below the stage-down value or flow below the stage-down flow for 10 minutes.",
				"Reset the DP setpoint down by 0.5 psi every 10 minutes until one control valve is 90 % open; never below 8 psi.",
			},
		},
	}
	for _, m := range models {
		r.Pumps = append(r.Pumps, m.pumpModel())
	}
	for _, u := range []struct {
		unit string
		m    int
	}{{"P1", 0}, {"P2", 0}, {"P3", 1}} {
		m := models[u.m]
		r.Motors = append(r.Motors, Motor{Unit: u.unit, Rated: m.motorHP, FullLoadEff: m.motorEff, ServiceFactor: 1.15,
			PartLoad: "DOE appendix A loss factor", Source: "10 CFR 431.25 Table 5", Default: u.unit == "P3"})
		r.Drives = append(r.Drives, Drive{Unit: u.unit, Kind: "VFD (proposed)", MinSpeed: 30, MaxSpeed: 100,
			LossModel: "DOE appendix A motor+drive factor", Default: true})
	}

	type strat struct {
		name, desc string
		drives     int
		run        func(q, h float64) []unitRun
	}
	a, bm := models[0], models[1]
	strategies := []strat{
		{"Current: two pumps at full speed", "P1 and P2 across the line, valves throttle", 0, func(q, h float64) []unitRun {
			return []unitRun{a.fixed("P1", q/2), a.fixed("P2", q/2)}
		}},
		{"Best count, fixed speed", "one or two large pumps across the line, valves throttle", 0, func(q, h float64) []unitRun {
			if q <= 0.9*a.runout {
				return []unitRun{a.fixed("P1", q)}
			}
			return []unitRun{a.fixed("P1", q/2), a.fixed("P2", q/2)}
		}},
		{"Common speed on drives", "P1 and P2 on drives at a common speed", 2, func(q, h float64) []unitRun {
			return []unitRun{a.atHead("P1", q/2, h), a.atHead("P2", q/2, h)}
		}},
		{"Optimised staging on drives", "best set of units at each load on drives", 3, func(q, h float64) []unitRun {
			var best []unitRun
			for _, set := range [][]unitRun{
				{bm.atHead("P3", q, h)},
				{a.atHead("P1", q, h)},
				{a.atHead("P1", q/2, h), a.atHead("P2", q/2, h)},
			} {
				if feasible(set) && (best == nil || groupKW(set) < groupKW(best)) {
					best = set
				}
			}
			return best
		}},
	}
	var powerSeries []Series
	for _, st := range strategies {
		var total, peak, cost float64
		var ps Series
		ps.Name = st.name
		for i, bin := range bins {
			q := math.Max(bin.frac*designFlow, 450) // plant minimum flow via bypass
			h := sys(q)
			runs := st.run(q, h)
			kw := groupKW(runs)
			lp := LoadPoint{
				Bin: fmt.Sprintf("%2d: %.0f %% of design", i+1, bin.frac*100), Strategy: st.name,
				PlantFlow: q, RequiredHead: h, Head: runs[0].head, Hours: bin.hours,
				UnitsRunning: len(runs), KW: kw, KWh: kw * bin.hours,
			}
			// Demo time-of-use weighting: the high bins fall in the dearer
			// afternoon hours.
			lp.Cost = lp.KWh * r.Economics.EnergyPrice * (0.9 + 0.16*bin.frac)
			var names []string
			for _, u := range runs {
				names = append(names, u.unit)
				lp.Units = append(lp.Units, UnitPoint{Unit: u.unit, Speed: u.speed * 100, Flow: u.flow,
					PumpEff: u.pumpEff, MotorEff: u.motorEff, DriveEff: u.driveEff, KW: u.kw})
			}
			lp.Running = strings.Join(names, "+")
			if bin.frac*designFlow < 450 {
				lp.Binding = "plant bypass"
			} else if runs[0].head > h+0.05 {
				lp.Binding = "fixed speed (valves throttle)"
			}
			if runs[0].speed < 0.3+1e-9 && runs[0].driveEff == runs[0].driveEff {
				lp.Binding = "minimum speed"
			}
			r.LoadPoints = append(r.LoadPoints, lp)
			total += lp.KWh
			cost += lp.Cost
			peak = math.Max(peak, kw)
			ps.X = append(ps.X, q)
			ps.Y = append(ps.Y, kw)
		}
		r.Strategies = append(r.Strategies, Strategy{Name: st.name, Description: st.desc,
			EnergyKWh: total, PeakKW: peak, EnergyCost: cost, DrivesToBuy: st.drives})
		powerSeries = append(powerSeries, ps)
	}
	saved := r.Strategies[0].EnergyKWh - r.Strategies[3].EnergyKWh
	r.SavingsRange = []Quantity{ // demo spread about the expected saving
		{Label: "Energy saved, low case (bypass kept at 450 gpm, no reset)", Value: math.Round(0.72 * saved), Unit: "kWh/yr"},
		{Label: "Energy saved, expected", Value: math.Round(saved), Unit: "kWh/yr"},
		{Label: "Energy saved, high case (reset to 22 ft control head)", Value: math.Round(1.09 * saved), Unit: "kWh/yr"},
	}
	r.Strategies[3].HoursUnmet = 0
	r.Strategies[1].HoursUnmet = 12 // demo: one bin edge where one fixed pump runs out

	for _, m := range models {
		c := Chart{Title: "Head: " + m.name, XLabel: "Flow (gpm)", YLabel: "Head (ft)"}
		for _, s := range []float64{1.0, 0.85, 0.70, 0.55} {
			se := Series{Name: fmt.Sprintf("%.0f %% speed", s*100)}
			for k := 0; k <= 12; k++ {
				q := m.runout * s * float64(k) / 12
				se.X = append(se.X, q)
				se.Y = append(se.Y, m.head(q, s))
			}
			c.Series = append(c.Series, se)
		}
		sysSe := Series{Name: "System curve (control curve)"}
		for k := 0; k <= 12; k++ {
			q := m.runout * float64(k) / 12
			sysSe.X = append(sysSe.X, q)
			sysSe.Y = append(sysSe.Y, sys(q))
		}
		c.Series = append(c.Series, sysSe)
		r.Curves.Head = append(r.Curves.Head, c)
	}
	eff := Chart{Title: "Pump efficiency at rated speed", XLabel: "Flow (gpm)", YLabel: "Pump efficiency (%)"}
	for _, m := range models {
		se := Series{Name: m.name}
		for k := 1; k <= 12; k++ {
			q := m.runout * float64(k) / 12
			se.X = append(se.X, q)
			se.Y = append(se.Y, m.eff(q, 1))
		}
		eff.Series = append(eff.Series, se)
	}
	r.Curves.Efficiency = []Chart{eff}
	r.Curves.GroupPower = Chart{Title: "Group input against plant flow", XLabel: "Plant flow (gpm)", YLabel: "Group electrical input (kW)", Series: powerSeries}
	return r
}

type sampleModel struct {
	name, units          string
	a                    [3]float64
	e                    [2]float64
	bep, runout, minFlow float64
	motorHP, motorEff    float64
}

// head at flow q and speed ratio s by the affinity laws: a0 s² + a1 s q + a2 q².
func (m sampleModel) head(q, s float64) float64 { return m.a[0]*s*s + m.a[1]*s*q + m.a[2]*q*q }

// eff at flow q and speed ratio s: η₀(q/s).
func (m sampleModel) eff(q, s float64) float64 {
	x := q / s
	return m.e[0]*x + m.e[1]*x*x
}

func (m sampleModel) pumpModel() PumpModel {
	p := PumpModel{
		Name: m.name, Units: m.units, RatedSpeed: 1780, BEPFlow: m.bep, BEPHead: m.head(m.bep, 1),
		BEPEff: m.eff(m.bep, 1), MinFlow: m.minFlow, MaxFlow: m.runout,
		Source: "datasheet curve, 1780 rpm, invented", HeadFit: m.a[:], EffFit: []float64{0, m.e[0], m.e[1]},
	}
	var sh, se float64
	for k := 1; k <= 6; k++ {
		q := m.runout * float64(k) / 6.5
		// invented datasheet scatter about the fit, a few tenths of a foot
		dh := 0.4 * math.Sin(float64(k)*1.7)
		de := 0.6 * math.Cos(float64(k)*2.3)
		pt := CurvePoint{Flow: q, HeadFit: m.head(q, 1), Head: m.head(q, 1) + dh, EffFit: m.eff(q, 1), Eff: m.eff(q, 1) + de}
		if k == 6 {
			pt.Eff = math.NaN() // the datasheet gives no efficiency at the last point
		} else {
			se += de * de
		}
		sh += dh * dh
		p.Points = append(p.Points, pt)
	}
	p.HeadRMS = math.Sqrt(sh / 6)
	p.EffRMS = math.Sqrt(se / 5)
	return p
}

type unitRun struct {
	unit                            string
	speed, flow, head               float64
	pumpEff, motorEff, driveEff, kw float64
	ok                              bool
}

// fixed is the unit across the line at flow q: it rides its curve.
func (m sampleModel) fixed(unit string, q float64) unitRun {
	u := unitRun{unit: unit, speed: 1, flow: q, head: m.head(q, 1), ok: q <= m.runout, driveEff: math.NaN()}
	u.finish(m)
	return u
}

// atHead is the unit on a drive at flow q and head h: the speed solves
// a0 s² + a1 q s + a2 q² = h, floored at 30 % (the valves take the excess).
func (m sampleModel) atHead(unit string, q, h float64) unitRun {
	A, B, C := m.a[0], m.a[1]*q, m.a[2]*q*q-h
	s := (-B + math.Sqrt(B*B-4*A*C)) / (2 * A)
	u := unitRun{unit: unit, flow: q, ok: s <= 1 && q <= m.runout*s}
	u.speed = math.Max(s, 0.3)
	u.head = m.head(q, u.speed)
	u.finish(m)
	load := u.kw / (m.motorHP * 0.7457 / (m.motorEff / 100))
	u.driveEff = 97 - 8*math.Pow(1-math.Min(load, 1), 2)
	u.kw /= u.driveEff / 100
	return u
}

func (u *unitRun) finish(m sampleModel) {
	u.pumpEff = m.eff(u.flow, u.speed)
	shaftHP := u.flow * u.head / 3960 / (u.pumpEff / 100) // water horsepower / η ([P] handbook form, SG 1)
	load := shaftHP / m.motorHP
	u.motorEff = m.motorEff - 6*math.Pow(1-math.Min(load, 1), 3) // invented part-load droop for the demo
	u.kw = shaftHP * 0.7457 / (u.motorEff / 100)
}

func feasible(set []unitRun) bool {
	for _, u := range set {
		if !u.ok {
			return false
		}
	}
	return true
}

func groupKW(set []unitRun) float64 {
	var kw float64
	for _, u := range set {
		kw += u.kw
	}
	return kw
}

// sampleCautions stand in for the caller's cautions (the study's, in the
// tool): planning estimates, manufacturers' limits, the licensed engineer.
var sampleCautions = []string{
	"Sample caution: these figures are planning estimates, not measured performance.",
	"Sample caution: confirm minimum flow, NPSH, motor cooling at low speed and resonance with the manufacturers.",
	"Sample caution: sequences and retrofits are the responsibility of a licensed engineer under local codes.",
}
