// Package handover turns a plant and its annual plan into the workbook
// report: display units, curve tables behind the charts, the load points
// of every strategy and the economics inputs. It runs the plant models to
// tabulate curves but decides nothing; the numbers come from optimize.
package handover

import (
	"fmt"
	"math"
	"strings"
	"wattstage/internal/version"

	"wattstage/curves"
	"wattstage/plant"
	"wattstage/study"
	"wattstage/workbook"
)

// Build maps a study's result into the workbook report. It computes
// nothing the result does not hold: no solver call, no pricing; the
// numbers are the result's, converted to the plant's display units.
func Build(res *study.Result) (*workbook.Report, error) {
	p := res.Plant
	u := p.Units
	r := &workbook.Report{
		Plant:    p.Name,
		Subtitle: fmt.Sprintf("%s; %s; %d pump model(s), %d units", p.System.Describe(), pumpCount(p), len(p.Models), units(p)),
		Units: workbook.Units{System: u.String(), Flow: u.FlowUnit(), Head: u.HeadUnit(), MotorPower: u.PowerUnit(),
			Speed: "rpm", Currency: res.Currency()},
		Cautions:     res.Cautions,
		Assumptions:  assumptions(res),
		Baseline:     res.Baseline,
		Staging:      Staging(res),
		Version:      version.Short(),
		InputsSHA256: res.InputsSHA256,
		Trend:        trendRecord(res),
	}
	if lo := res.Strategy(study.KeyLowest); lo != nil && lo.Appraisal != nil {
		r.CashFlow = lo.Name
	}
	for _, w := range res.Warnings {
		r.Notes = append(r.Notes, w.Source+": "+w.Message)
	}
	if res.LoadBinWidth > 0 {
		r.Notes = append(r.Notes, fmt.Sprintf("Load points gather the trend's intervals into flow groups %s wide: hours, energy and cost are the sums over the group's intervals (so they add up to the annual totals); the units, speeds and efficiencies shown are those of the group's served interval nearest its centre flow.",
			u.FormatFlow(res.LoadBinWidth)))
	}
	inputs(r, p)
	strategies(r, res)
	checks(r, res)
	r.LoadPoints = loadPoints(res)
	r.Curves = curveTables(res)
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

func assumptions(res *study.Result) []string {
	p := res.Plant
	out := plainDefaults(p)
	out = append(out,
		"Pumped flow is the larger of the load flow and the plant minimum flow; the bypass carries the difference.",
		"The header head is at least the system's need at the load flow; above it, valves absorb the excess.",
		"Affinity laws scale the fitted rated-speed curves: H(Q,s) = s²·H₀(Q/s), η(Q,s) = η₀(Q/s), less any efficiency step-down at reduced speed listed above.")
	if rg := res.Range; rg != nil {
		var what []string
		for _, c := range rg.Cases {
			what = append(what, c.Sensitivity.Label)
		}
		out = append(out, "Savings range: the lowest-power staging and the baseline re-run together with "+strings.Join(what, "; ")+" (each on its own, across-the-line motors included).")
	}
	pd := res.Period
	out = append(out, fmt.Sprintf("Annual figures: the period's energy, cost and emissions × %.4f (%s h a year ÷ %s h covered); demand charges from the mean of the covered months' billed peaks × 12.", pd.Factor, study.Grouped(pd.AnnualHours), study.Grouped(pd.CoveredHours)),
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

func strategies(r *workbook.Report, res *study.Result) {
	for _, st := range res.Strategies {
		a := st.Annual
		r.Strategies = append(r.Strategies, workbook.Strategy{Name: st.Name, Description: st.Note, EnergyKWh: a.Energy,
			PeakKW: st.Energy.PeakKW, DrivesToBuy: st.DrivesAdded, HoursUnmet: st.Energy.HoursUnmet * res.Period.Factor,
			EnergyCost: a.EnergyCost, BilledDemand: a.BilledDemand})
	}
	if res.Recommendation != "" {
		r.Recommendation = res.Recommendation
	}
	if rg := res.Range; rg != nil {
		lo := res.Strategy(study.KeyLowest)
		r.SavingsRange = append(r.SavingsRange, workbook.Quantity{Label: "Savings, expected (as given)", Value: lo.Savings.Energy, Unit: "kWh/yr"})
		for _, c := range rg.Cases {
			r.SavingsRange = append(r.SavingsRange, workbook.Quantity{Label: "Savings, " + c.Sensitivity.Label, Value: c.SavedKWh, Unit: "kWh/yr"})
		}
		r.SavingsRange = append(r.SavingsRange,
			workbook.Quantity{Label: "Savings range, low end (" + rg.LowBy + ")", Value: rg.Low, Unit: "kWh/yr"},
			workbook.Quantity{Label: "Savings range, high end (" + rg.HighBy + ")", Value: rg.High, Unit: "kWh/yr"})
	}
}

func checks(r *workbook.Report, res *study.Result) {
	p := res.Plant
	for _, c := range res.PartLoad {
		name := "Part-load power (ASHRAE 90.1 §6.5.4.2), " + c.Label
		if c.DesignKW == 0 {
			r.Checks = append(r.Checks, workbook.Check{Name: name, Result: "not applicable", Detail: c.Note})
			continue
		}
		verdict := "pass"
		if !c.Pass {
			verdict = "fails"
		}
		r.Checks = append(r.Checks, workbook.Check{Name: name, Result: verdict,
			Detail: fmt.Sprintf("%.1f kW at 50 %% of design flow = %.1f %% of %.1f kW at design (limit 30 %%); %s", c.HalfKW, 100*c.Ratio, c.DesignKW, c.Note)})
	}
	if uo := res.UnitOut; uo != nil {
		u := p.Units
		verdict := "serves design flow"
		if !uo.ServesDesign {
			verdict = "short of design flow"
		}
		if uo.Standby {
			verdict += " (the standby unit takes the failed one's place)"
		}
		var loads []string
		for _, un := range uo.AtMax.Units {
			loads = append(loads, fmt.Sprintf("%.0f %%", 100*un.Load))
		}
		r.Checks = append(r.Checks, workbook.Check{Name: "One unit out (" + uo.Removed + ")", Result: verdict,
			Detail: fmt.Sprintf("the remaining units deliver at most %s (%.0f %% of design) at %s; motor loads %s",
				u.FormatFlow(uo.MaxFlow), 100*float64(uo.MaxFlow/p.DesignFlow), u.FormatHead(uo.AtMax.HeaderHead), strings.Join(loads, ", "))})
	}
	if c := res.NPSH; c != nil && !c.Made {
		r.Checks = append(r.Checks, workbook.Check{Name: "NPSH available against required", Result: "not made", Detail: c.Note + "; confirm the NPSH margin with the pump manufacturer"})
	} else if c != nil {
		u, f, verdict := p.Units, res.Period.Factor, "meets the margin"
		npsh := func(h curves.Head) string { return fmt.Sprintf("%.2f %s", u.HeadOut(h), u.HeadUnit()) } // as plan writes it
		detail := fmt.Sprintf("NPSHa ≥ %g × NPSHr (NPSHr scaled by speed²) at every point; %s available at design flow; suction: %s", c.Margin, npsh(c.DesignAvailable), c.Note)
		for _, s := range c.Strategies {
			if s.Key == study.KeyLowest && s.Short > 0 {
				verdict = fmt.Sprintf("short for %s unit-hours/yr", study.Grouped(s.Short*f))
			}
			if s.Key == study.KeyLowest || s.Short > 0 {
				detail += fmt.Sprintf("; %s: lowest NPSHa/NPSHr %.2f, %s unit-hours/yr below the margin", s.Name, s.LowestRatio, study.Grouped(s.Short*f))
			}
		}
		for _, sp := range c.Short {
			detail += fmt.Sprintf("; short at %s: %s at %.0f %% speed, NPSHa %s, NPSHr %s, %s h/yr", u.FormatFlow(sp.Flow), p.Models[sp.Model].Name,
				100*sp.Speed, npsh(sp.Available), npsh(sp.Required), study.Grouped(sp.Hours*f))
		}
		r.Checks = append(r.Checks, workbook.Check{Name: "NPSH available against required (lowest-power staging)", Result: verdict, Detail: detail})
	}
	if c := res.Calibration; c != nil {
		verdict := "within the hourly criteria"
		if !c.Calibrated() {
			verdict = "outside the hourly criteria"
		}
		r.Checks = append(r.Checks, workbook.Check{Name: "Predicted against logged power (ASHRAE Guideline 14, from memory), " + c.Strategy, Result: verdict,
			Detail: fmt.Sprintf("%d intervals: mean logged %.2f kW, mean error %+.2f kW, NMBE %+.1f %% (limit ±10 %%), CV(RMSE) %.1f %% (limit 30 %%)",
				c.N, c.MeanKW, c.MeanErr, 100*c.NMBE, 100*c.CVRMSE)})
	}
}

// loadPoints are the result's load points of every strategy, a year.
func loadPoints(res *study.Result) []workbook.LoadPoint {
	p := res.Plant
	u := p.Units
	f := res.Period.Factor
	var out []workbook.LoadPoint
	for _, st := range res.Strategies {
		rp := st.Run.Plant
		if rp == nil {
			rp = p
		}
		for i, lp := range st.LoadPoints {
			s := lp.State
			w := workbook.LoadPoint{Bin: pointLabel(res, lp, i), Strategy: st.Name, PlantFlow: u.FlowOut(lp.Flow),
				RequiredHead: u.HeadOut(s.RequiredHead), Head: u.HeadOut(s.HeaderHead), Hours: lp.Hours * f,
				UnitsRunning: s.Running(), KW: lp.KW, KWh: lp.KWh * f, Cost: lp.Cost * f, Binding: string(s.Limit)}
			var flags []string
			if lp.HoursUnmet > 0 {
				flags = append(flags, fmt.Sprintf("unmet %s h/yr: %s", study.Grouped(lp.HoursUnmet*f), s.Reason))
			}
			var names []string
			for j, un := range s.Units {
				m := rp.Models[un.Model]
				names = append(names, fmt.Sprintf("%s#%d", m.Name, j+1))
				de := 100 * un.DriveEff
				if !m.Drive.Variable() {
					de = math.NaN()
				}
				w.Units = append(w.Units, workbook.UnitPoint{Unit: m.Name, Speed: 100 * un.Speed, Flow: u.FlowOut(un.Flow),
					PumpEff: 100 * un.PumpEff, MotorEff: 100 * un.MotorEff, DriveEff: de, KW: float64(un.Electrical) / curves.KW})
				if !un.Preferred {
					flags = appendOnce(flags, "outside preferred region")
				}
			}
			if s.BypassFlow > 0 {
				flags = appendOnce(flags, "bypass open")
			}
			if s.HeaderHead > s.RequiredHead*(1+1e-6) {
				flags = appendOnce(flags, "above the control curve")
			}
			w.Running = strings.Join(names, "+")
			w.Flags = strings.Join(flags, "; ")
			out = append(out, w)
		}
	}
	return out
}

func appendOnce(list []string, s string) []string {
	for _, v := range list {
		if v == s {
			return list
		}
	}
	return append(list, s)
}

// pointLabel names a load point: its flow group, the interval's time, or
// the bin's number.
func pointLabel(res *study.Result, lp study.LoadPoint, i int) string {
	u := res.Plant.Units
	switch {
	case lp.Grouped && lp.High == 0:
		return "zero flow"
	case lp.Grouped:
		return fmt.Sprintf("%s–%s %s", study.Grouped(u.FlowOut(lp.Low)), study.Grouped(u.FlowOut(lp.High)), u.FlowUnit())
	case res.Period.Timed:
		return res.Steps[i].Time.Format("2006-01-02 15:04")
	}
	return fmt.Sprintf("bin %d", i+1)
}
