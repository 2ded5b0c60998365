// Package handover turns a plant and its annual plan into the workbook
// report: display units, curve tables behind the charts, the load points
// of every strategy and the economics inputs. It runs the plant models to
// tabulate curves but decides nothing; the numbers come from optimize.
package handover

import (
	"fmt"
	"math"
	"strings"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
	"wattstage/workbook"
)

// Input is what the workbook is made from.
type Input struct {
	Plant *plant.Plant
	Plan  *optimize.Plan
	// Strategies are the strategies of the plan (optimize.Strategies plus
	// extras, in the plan's order), rerun on a flow grid for the group
	// power chart and, for a trend, on its bins for the load points.
	Strategies []optimize.Keyed
	// LoadSteps are the steps shown on the load-points sheet: the plan's
	// steps for a bin profile, the trend's bins for a trend.
	LoadSteps []optimize.Step
	// LoadNote says what LoadSteps are, for the notes.
	LoadNote string
	Staging  workbook.Staging
	Cautions []string
}

// Build maps the input into a workbook report.
func Build(in Input) (*workbook.Report, error) {
	p, pl := in.Plant, in.Plan
	u := p.Units
	cur := p.Tariff.Currency
	if cur == "" {
		cur = "$"
	}
	r := &workbook.Report{
		Plant:    p.Name,
		Subtitle: fmt.Sprintf("%s; %s; %d pump model(s), %d units", p.System.Describe(), pumpCount(p), len(p.Models), units(p)),
		Units: workbook.Units{System: u.String(), Flow: u.FlowUnit(), Head: u.HeadUnit(), MotorPower: u.PowerUnit(),
			Speed: "rpm", Currency: cur},
		Cautions:    in.Cautions,
		Assumptions: assumptions(p),
		Baseline:    pl.Baseline,
		Staging:     in.Staging,
	}
	for _, w := range pl.Warnings {
		r.Notes = append(r.Notes, w)
	}
	if in.LoadNote != "" {
		r.Notes = append(r.Notes, in.LoadNote)
	}
	for _, o := range pl.Outcomes {
		if o.Bill != nil {
			for _, w := range o.Bill.Warnings {
				r.Notes = appendOnce(r.Notes, "Tariff: "+w)
			}
		}
	}
	inputs(r, p)
	strategies(r, pl)
	checks(r, p, pl)
	r.LoadPoints = loadPoints(p, in.Strategies, in.LoadSteps)
	r.Curves = curveTables(p, in.Strategies)
	r.Economics = workbook.EconomicsInputs{EnergyPrice: p.Tariff.EnergyPrice, DemandCharge: p.Tariff.DemandCharge,
		DriveCost: p.Retrofit.DriveCost, OtherCost: p.Retrofit.OtherCost, LifeYears: p.Retrofit.LifeYears,
		DiscountRate: p.Retrofit.DiscountRate, Escalation: p.Retrofit.Escalation, EmissionsFactor: p.Tariff.EmissionsFactor}
	if r.Economics.LifeYears < 1 {
		r.Economics.LifeYears = 1
	}
	return r, nil
}

func units(p *plant.Plant) int {
	n := 0
	for _, m := range p.Models {
		n += m.Count
	}
	return n
}

func pumpCount(p *plant.Plant) string {
	return fmt.Sprintf("design %s at %s", p.Units.FormatFlow(p.DesignFlow), p.Units.FormatHead(p.DesignHead))
}

func appendOnce(list []string, s string) []string {
	for _, v := range list {
		if v == s {
			return list
		}
	}
	return append(list, s)
}

func assumptions(p *plant.Plant) []string {
	out := append([]string(nil), p.Defaults...)
	out = append(out,
		"Pumped flow is the larger of the load flow and the plant minimum flow; the bypass carries the difference.",
		"The header head is at least the system's need at the load flow; above it, valves absorb the excess.",
		"Affinity laws scale the fitted rated-speed curves: H(Q,s) = s²·H₀(Q/s), η(Q,s) = η₀(Q/s), less any efficiency step-down at reduced speed listed above.",
		"Savings range: control head (or static head) and motor-plus-drive losses moved by ±25 %.",
		"Results are planning estimates; see the cautions.")
	return out
}

func inputs(r *workbook.Report, p *plant.Plant) {
	u := p.Units
	for _, m := range p.Models {
		pm := workbook.PumpModel{Name: m.Name, Units: fmt.Sprintf("%d identical", m.Count), RatedSpeed: m.RatedSpeed,
			BEPFlow: u.FlowOut(m.Pump.BEPFlow), BEPHead: u.HeadOut(m.Pump.BEPHead), BEPEff: 100 * m.Pump.BEPEff,
			MinFlow: u.FlowOut(m.MinFlow), MaxFlow: u.FlowOut(m.Runout), Source: "datasheet points in " + p.Source,
			HeadRMS: u.HeadOut(curves.Head(m.Pump.HeadFit.RMS)), EffRMS: 100 * m.Pump.EffFit.RMS}
		pm.HeadFit = displayCoeffs(m.Pump.HeadPoly(), float64(u.FlowIn(1)), float64(u.HeadIn(1)), false)
		pm.EffFit = displayCoeffs(m.Pump.EffPoly(), float64(u.FlowIn(1)), 0.01, true)
		for _, pt := range m.Pump.Points {
			pm.Points = append(pm.Points, workbook.CurvePoint{Flow: u.FlowOut(pt.Flow), Head: u.HeadOut(pt.Head),
				HeadFit: u.HeadOut(m.Pump.Head(pt.Flow, 1)), Eff: 100 * pt.Eff, EffFit: 100 * m.Pump.EffPoly().Eval(float64(pt.Flow))})
		}
		r.Pumps = append(r.Pumps, pm)
		part := "US DOE part-load loss factor (10 CFR 431 subpart Y, appendix A)"
		if m.Motor.Table != nil {
			part = "user table"
		}
		r.Motors = append(r.Motors, workbook.Motor{Unit: m.Name, Rated: u.RatingOut(m.Motor.Rated), FullLoadEff: 100 * m.Motor.FullLoadEff,
			ServiceFactor: m.Motor.SF(), PartLoad: part, Source: "plant file", Default: hasDefault(p, "motor.full_load_efficiency", m.Name)})
		d := workbook.Drive{Unit: m.Name, Kind: "across the line (fixed speed)", LossModel: "none"}
		if m.Drive.Variable() {
			d = workbook.Drive{Unit: m.Name, Kind: "variable-speed drive", MinSpeed: 100 * m.MinSpeed, MaxSpeed: 100 * m.MaxSpeed,
				LossModel: m.Drive.Describe(), Default: hasDefault(p, ".drive", m.Name)}
		}
		r.Drives = append(r.Drives, d)
	}
	q := func(label string, v float64, unit string, dec int) workbook.Quantity {
		return workbook.Quantity{Label: label, Value: v, Unit: unit, Decimals: dec}
	}
	r.System = append(r.System, workbook.Quantity{Label: "Model", Text: p.System.Describe()},
		q("Design flow", u.FlowOut(p.DesignFlow), u.FlowUnit(), 0), q("Design head", u.HeadOut(p.DesignHead), u.HeadUnit(), 1))
	switch s := p.System.(type) {
	case curves.DPControl:
		r.System = append(r.System, q("Control head at design", u.HeadOut(s.ControlHead), u.HeadUnit(), 1))
		if s.Reset != nil {
			r.System = append(r.System, q("Reset: control head at low flow", u.HeadOut(s.Reset.LowHead), u.HeadUnit(), 1),
				q("Reset: low flow", u.FlowOut(s.Reset.LowFlow), u.FlowUnit(), 0),
				q("Reset: full setpoint from", u.FlowOut(s.Reset.HighFlow), u.FlowUnit(), 0))
		}
	case curves.FixedCurve:
		r.System = append(r.System, q("Static head", u.HeadOut(s.Static), u.HeadUnit(), 1))
	}
	r.System = append(r.System, q("Plant minimum flow (bypass)", u.FlowOut(p.MinFlow), u.FlowUnit(), 0))
	fl := p.Fluid
	if !math.IsNaN(fl.Temperature) {
		r.Fluid = append(r.Fluid, q("Temperature", u.TempOut(fl.Temperature), u.TempUnit(), 1))
	}
	r.Fluid = append(r.Fluid, workbook.Quantity{Label: "Density", Value: fl.Density, Unit: "kg/m³", Decimals: 2, Source: "Kell (1975) or specific gravity"},
		q("Specific gravity", fl.SG, "", 4))
	tf := p.Tariff
	r.Tariff.Description = "flat energy price"
	if len(tf.Periods) > 0 {
		r.Tariff.Description = "time-of-use energy prices"
	}
	if tf.DemandCharge > 0 {
		r.Tariff.Description += " with a monthly demand charge"
	}
	r.Tariff.Items = append(r.Tariff.Items, q("Energy price (outside periods)", tf.EnergyPrice, r.Units.Currency+"/kWh", 4),
		q("Demand charge", tf.DemandCharge, r.Units.Currency+"/kW-month", 2), q("Emissions factor", tf.EmissionsFactor, "kg CO₂e/kWh", 3))
	for _, per := range tf.Periods {
		days := "every day"
		switch {
		case per.Weekdays && !per.Weekends:
			days = "Mon–Fri"
		case per.Weekends && !per.Weekdays:
			days = "Sat–Sun"
		}
		r.Tariff.Periods = append(r.Tariff.Periods, workbook.TariffPeriod{Name: per.Name, Price: per.Price,
			Hours: fmt.Sprintf("%s %02d:00–%02d:00", days, per.StartHour, per.EndHour)})
	}
}

func hasDefault(p *plant.Plant, key, model string) bool {
	for i, m := range p.Models {
		if m.Name != model {
			continue
		}
		prefix := fmt.Sprintf("pumps[%d]", i)
		for _, d := range p.Defaults {
			if strings.HasPrefix(d, prefix) && strings.Contains(d, key) {
				return true
			}
		}
	}
	return false
}

// displayCoeffs converts a fitted polynomial into coefficients for Q in
// display units; pct multiplies by 100 (efficiency in %) via yPer = 0.01.
func displayCoeffs(p curves.Poly, xPer, yPer float64, throughOrigin bool) []float64 {
	var out []float64
	if throughOrigin && p.Lowest == 1 {
		out = append(out, 0)
	}
	for k, c := range p.C {
		pow := float64(k + p.Lowest)
		out = append(out, c*math.Pow(xPer/p.Scale, pow)/yPer)
	}
	return out
}

func strategies(r *workbook.Report, pl *optimize.Plan) {
	for _, o := range pl.Outcomes {
		s := workbook.Strategy{Name: o.Run.Name, Description: o.Run.Note, EnergyKWh: o.Energy.KWh, PeakKW: o.Energy.PeakKW,
			DrivesToBuy: o.DrivesAdded, HoursUnmet: o.Energy.HoursUnmet}
		if o.Bill != nil {
			s.EnergyCost = o.Bill.EnergyCost
			for _, m := range o.Bill.Months {
				s.BilledDemand += m.PeakKW
			}
		}
		r.Strategies = append(r.Strategies, s)
	}
	if lo := pl.Outcome(optimize.KeyLowest); lo != nil && lo.Appraisal != nil {
		base := pl.Outcomes[pl.Baseline]
		a := lo.Appraisal
		// The Summary adds where the setpoints are; numbers grouped as its table shows them.
		r.Recommendation = fmt.Sprintf("Run the lowest-power staging: %s kWh/yr against %s kWh/yr for %s (%.0f %% less), saving about %s %s/yr; %d drive(s) to buy, simple payback %s.",
			grouped(lo.Energy.KWh), grouped(base.Energy.KWh), base.Run.Name, 100*a.EnergySaved/math.Max(base.Energy.KWh, 1e-9), grouped(a.AnnualSavings), r.Units.Currency,
			lo.DrivesAdded, paybackWords(a.SimplePayback))
		r.SavingsRange = append(r.SavingsRange, workbook.Quantity{Label: "Savings, expected (as given)", Value: a.EnergySaved, Unit: "kWh/yr"})
	}
	for _, rc := range pl.Range {
		r.SavingsRange = append(r.SavingsRange, workbook.Quantity{Label: fmt.Sprintf("Savings, control head × %.2f and losses × %.2f",
			rc.Sensitivity.ControlScale, rc.Sensitivity.LossScale), Value: rc.SavedKWh, Unit: "kWh/yr"})
	}
}

// grouped writes v rounded to a whole number with thousands separators,
// e.g. 122,665.
func grouped(v float64) string {
	digits := fmt.Sprintf("%.0f", math.Abs(v))
	var b strings.Builder
	if math.Round(v) < 0 {
		b.WriteByte('-')
	}
	for i, d := range digits {
		if i > 0 && (len(digits)-i)%3 == 0 {
			b.WriteByte(',')
		}
		b.WriteRune(d)
	}
	return b.String()
}

func paybackWords(y float64) string {
	if math.IsInf(y, 1) || math.IsNaN(y) {
		return "never"
	}
	return fmt.Sprintf("%.1f years", y)
}

func checks(r *workbook.Report, p *plant.Plant, pl *optimize.Plan) {
	for _, c := range pl.PartLoad {
		res := "pass"
		if !c.Pass {
			res = "fails"
		}
		if c.DesignKW == 0 {
			r.Checks = append(r.Checks, workbook.Check{Name: "Part-load power (ASHRAE 90.1 §6.5.4.2), " + c.Label, Result: "not applicable", Detail: c.Note})
			continue
		}
		r.Checks = append(r.Checks, workbook.Check{Name: "Part-load power (ASHRAE 90.1 §6.5.4.2), " + c.Label, Result: res,
			Detail: fmt.Sprintf("%.1f kW at 50 %% of design flow = %.1f %% of %.1f kW at design (limit 30 %%); %s", c.HalfKW, 100*c.Ratio, c.DesignKW, c.Note)})
	}
	if uo := pl.UnitOut; uo != nil {
		u := p.Units
		res := "serves design flow"
		if !uo.ServesDesign {
			res = "short of design flow"
		}
		var loads []string
		for _, un := range uo.AtMax.Units {
			loads = append(loads, fmt.Sprintf("%.0f %%", 100*un.Load))
		}
		r.Checks = append(r.Checks, workbook.Check{Name: "One unit out (" + uo.Removed + ")", Result: res,
			Detail: fmt.Sprintf("the remaining units deliver at most %s (%.0f %% of design) at %s; motor loads %s",
				u.FormatFlow(uo.MaxFlow), 100*float64(uo.MaxFlow/p.DesignFlow), u.FormatHead(uo.AtMax.HeaderHead), strings.Join(loads, ", "))})
	}
}

func loadPoints(p *plant.Plant, ks []optimize.Keyed, steps []optimize.Step) []workbook.LoadPoint {
	u := p.Units
	var out []workbook.LoadPoint
	price := p.Tariff.EnergyPrice
	for _, k := range ks {
		run := k.Strategy.Run(steps)
		rp := run.Plant
		if rp == nil {
			rp = p
		}
		for i, st := range steps {
			res := run.Points[i]
			lp := workbook.LoadPoint{Bin: binLabel(u, st, i), Strategy: run.Name, PlantFlow: u.FlowOut(st.Load),
				RequiredHead: u.HeadOut(res.RequiredHead), Head: u.HeadOut(res.HeaderHead), Hours: st.Hours,
				UnitsRunning: res.Running(), KW: float64(res.Power) / curves.KW, Binding: string(res.Limit)}
			if res.Status != optimize.Served {
				lp.Flags = "unmet: " + res.Reason
				lp.KW = 0
			}
			lp.KWh = lp.KW * st.Hours
			lp.Cost = lp.KWh * price
			var names []string
			var flags []string
			for j, un := range res.Units {
				m := rp.Models[un.Model]
				names = append(names, fmt.Sprintf("%s#%d", m.Name, j+1))
				de := 100 * un.DriveEff
				if !m.Drive.Variable() {
					de = math.NaN()
				}
				lp.Units = append(lp.Units, workbook.UnitPoint{Unit: m.Name, Speed: 100 * un.Speed, Flow: u.FlowOut(un.Flow),
					PumpEff: 100 * un.PumpEff, MotorEff: 100 * un.MotorEff, DriveEff: de, KW: float64(un.Electrical) / curves.KW})
				if !un.Preferred {
					flags = appendOnce(flags, "outside preferred region")
				}
			}
			if res.BypassFlow > 0 {
				flags = appendOnce(flags, "bypass open")
			}
			if res.HeaderHead > res.RequiredHead*(1+1e-6) {
				flags = appendOnce(flags, "above the control curve")
			}
			lp.Running = strings.Join(names, "+")
			if len(flags) > 0 {
				if lp.Flags != "" {
					lp.Flags += "; "
				}
				lp.Flags += strings.Join(flags, "; ")
			}
			out = append(out, lp)
		}
	}
	return out
}

func binLabel(u curves.UnitSystem, st optimize.Step, i int) string {
	if st.Timed() {
		return st.Time.Format("2006-01-02 15:04")
	}
	return fmt.Sprintf("bin %d", i+1)
}

// curveTables tabulates the charts: each model's head at several speeds
// with the control curve shared by 1…n running units, efficiency at those
// speeds, and each strategy's group power across plant flow.
func curveTables(p *plant.Plant, ks []optimize.Keyed) workbook.Curves {
	u := p.Units
	var c workbook.Curves
	for _, m := range p.Models {
		top := m.Runout
		if top <= 0 {
			top = m.Pump.LastFlow
		}
		speeds := speedSet(m)
		hc := workbook.Chart{Title: m.Name + ": head at several speeds, and the system curve shared by n units",
			XLabel: "Flow per unit (" + u.FlowUnit() + ")", YLabel: "Head (" + u.HeadUnit() + ")"}
		ec := workbook.Chart{Title: m.Name + ": pump efficiency", XLabel: "Flow per unit (" + u.FlowUnit() + ")", YLabel: "Efficiency (%)"}
		const n = 24
		for _, s := range speeds {
			hs := workbook.Series{Name: fmt.Sprintf("%.0f %% speed", 100*s)}
			es := workbook.Series{Name: fmt.Sprintf("%.0f %% speed", 100*s)}
			for k := 0; k <= n; k++ {
				q := curves.Flow(float64(top) * s * float64(k) / n)
				h := m.Pump.Head(q, s)
				if h <= 0 {
					continue
				}
				hs.X = append(hs.X, u.FlowOut(q))
				hs.Y = append(hs.Y, u.HeadOut(h))
				if k > 0 {
					es.X = append(es.X, u.FlowOut(q))
					es.Y = append(es.Y, 100*m.Pump.Eff(q, s))
				}
			}
			hc.Series = append(hc.Series, hs)
			ec.Series = append(ec.Series, es)
		}
		for units := 1; units <= unitsTotal(p); units++ {
			ss := workbook.Series{Name: fmt.Sprintf("system, %d running", units)}
			// Up to a tenth past the design flow shared by the running units:
			// beyond it the curve only stretches the head axis.
			span := top
			if p.DesignFlow > 0 {
				span = min(top, 1.1*p.DesignFlow/curves.Flow(units))
			}
			for k := 0; k <= n; k++ {
				q := curves.Flow(float64(span) * float64(k) / n)
				ss.X = append(ss.X, u.FlowOut(q))
				ss.Y = append(ss.Y, u.HeadOut(p.System.Required(q*curves.Flow(units))))
			}
			hc.Series = append(hc.Series, ss)
		}
		c.Head = append(c.Head, hc)
		c.Efficiency = append(c.Efficiency, ec)
	}
	gp := workbook.Chart{Title: "Group input power across plant flow", XLabel: "Plant flow (" + u.FlowUnit() + ")", YLabel: "Input power (kW)"}
	var grid []optimize.Step
	const n = 30
	for k := 1; k <= n; k++ {
		grid = append(grid, optimize.Step{Load: curves.Flow(float64(p.DesignFlow) * float64(k) / n), Hours: 1, MeasuredKW: math.NaN()})
	}
	for _, k := range ks {
		run := k.Strategy.Run(grid)
		s := workbook.Series{Name: run.Name}
		for i, st := range grid {
			s.X = append(s.X, u.FlowOut(st.Load))
			if run.Points[i].Status == optimize.Served {
				s.Y = append(s.Y, float64(run.Points[i].Power)/curves.KW)
			} else {
				s.Y = append(s.Y, math.NaN())
			}
		}
		gp.Series = append(gp.Series, s)
	}
	c.GroupPower = gp
	return c
}

func unitsTotal(p *plant.Plant) int {
	n := 0
	for _, m := range p.Models {
		n += m.Count
	}
	return n
}

// speedSet picks rated speed, the minimum speed and a few between.
func speedSet(m plant.Model) []float64 {
	if !m.Drive.Variable() {
		return []float64{1}
	}
	out := []float64{math.Min(1, m.MaxSpeed)}
	for _, s := range []float64{0.9, 0.8, 0.7, 0.6, 0.5} {
		if s > m.MinSpeed+0.05 && s < out[0] {
			out = append(out, s)
		}
	}
	return append(out, m.MinSpeed)
}
