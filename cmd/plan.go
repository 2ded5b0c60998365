package cmd

import (
	"errors"
	"fmt"
	"io"
	"math"
	"strings"
	"time"

	"github.com/spf13/cobra"

	"wattstage/curves"
	"wattstage/econ"
	"wattstage/study"
)

// PlanOptions are the inputs of `wattstage plan`.
type PlanOptions struct {
	IO        *IO
	PlantPath string
	Output    string // workbook path; empty = none
	OutputSet bool   // -o was given (an empty -o is an error, not "none")
	Force     bool
	JSON      bool
	Baseline  string
	BinWidth  string // trend: solve binned instead of point by point, bin width in the plant's flow unit
	Detail    bool   // with JSON: every step of every strategy, as JSON Lines after the document
}

// NewCmdPlan builds `wattstage plan`.
func NewCmdPlan(streams *IO, runF func(*PlanOptions) error) *cobra.Command {
	opts := &PlanOptions{IO: streams}
	c := &cobra.Command{
		Use:   "plan PLANT.yaml [-o WORKBOOK.xlsx]",
		Short: "A year of operation: every strategy's energy, cost, savings and payback",
		Long: `Run the plant's load profile (bins, or every interval of a trend log) through
each way of running the plant — the lowest-power staging, one common speed,
the plant's current sequence, derived setpoints, a partial drive retrofit,
fixed speed with throttling, constant flow with bypass — and print annual
energy, peak demand, cost, savings against the baseline, payback and NPV, the
savings range, the part-load and one-unit-out checks and the cautions.
With -o the same goes into an Excel workbook to hand over.`,
		Example: `  wattstage plan examples/chilled-water.yaml
  wattstage plan examples/chilled-water.yaml -o chilled-water.xlsx
  wattstage plan examples/chilled-water-trend.yaml --baseline throttled
  wattstage plan examples/condenser-water.yaml --json`,
		Args: cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			opts.PlantPath = args[0]
			opts.OutputSet = c.Flags().Changed("output")
			if _, err := parseFlowArg("bin-width", opts.BinWidth); opts.BinWidth != "" && err != nil {
				return err
			}
			if runF != nil {
				return runF(opts)
			}
			return planRun(opts)
		},
	}
	f := c.Flags()
	f.StringVarP(&opts.Output, "output", "o", "", "write the workbook to this .xlsx file")
	f.BoolVar(&opts.Force, "force", false, "replace an existing workbook")
	f.BoolVar(&opts.JSON, "json", false, "write the result as JSON (docs/plan-json.md)")
	f.BoolVar(&opts.Detail, "detail", false, "with --json: add every step of every strategy, as JSON Lines after the document")
	f.StringVar(&opts.Baseline, "baseline", "", "strategy to count savings against: current, throttled, bypass, common, partial, derived (default: current when the plant file gives its sequence, else throttled)")
	f.StringVar(&opts.BinWidth, "bin-width", "", "with a trend: bin the flows by this width instead of solving every interval: a flow (150, 150gpm, 10L/s) or % of design flow (5%), from 0.1 % to 50 % of design flow")
	return c
}

// Range of --bin-width, as fractions of design flow: narrower bins than
// 0.1 % are finer than any flow meter; wider than 50 % leave two bins.
const (
	minBinWidth = 0.001
	maxBinWidth = 0.5
)

// planStudy loads the plant, reads its profile and runs the study.
func planStudy(path, binWidth, baseline string, detail bool, pr *progressLine) (*study.Result, error) {
	p, err := loadPlant(path)
	if err != nil {
		return nil, err
	}
	var w curves.Flow
	if binWidth != "" {
		if w, err = flowRange("bin-width", binWidth, p.Units, p.DesignFlow, minBinWidth, maxBinWidth, "the design flow"); err != nil {
			return nil, err
		}
	}
	in, err := study.Prepare(p, w)
	if errors.Is(err, study.ErrBinWidth) {
		return nil, badInputf("--bin-width %s: %v", binWidth, err)
	}
	if err != nil {
		return nil, badInput(err)
	}
	opt := study.Options{Baseline: baseline, KeepStates: detail}
	if pr != nil {
		opt.Progress, opt.Advance = pr.step, pr.advance
	}
	res, err := study.Run(in, opt)
	if errors.Is(err, study.ErrBaseline) {
		return nil, badInput(err)
	}
	return res, err
}

func planRun(opts *PlanOptions) error {
	if err := checkOutputPath(opts.IO.Err, opts.Output, opts.OutputSet, opts.PlantPath, opts.Force); err != nil {
		return err
	}
	var pr *progressLine
	if opts.IO.Terminal {
		pr = newProgressLine(opts.IO.Err, time.Now)
	}
	res, err := planStudy(opts.PlantPath, opts.BinWidth, opts.Baseline, opts.JSON && opts.Detail, pr)
	pr.clear()
	if err != nil {
		return err
	}
	if opts.JSON {
		if err := res.WriteJSON(opts.IO.Out, opts.Detail); err != nil {
			return err
		}
	} else {
		writePlan(opts.IO.Out, res)
	}
	if opts.Output != "" {
		if err := writeWorkbook(opts.Output, opts.PlantPath, opts.Force, res); err != nil {
			return err
		}
		fmt.Fprintf(opts.IO.Err, "wrote %s\n", opts.Output)
	}
	return nil
}

func writePlan(out io.Writer, r *study.Result) {
	p := r.Plant
	cur := r.Currency()
	pd := r.Period
	fmt.Fprintf(out, "Plant: %s\n", p.Name)
	writeProfileLine(out, &study.Input{Plant: r.Plant, Trend: r.Trend, Binned: r.Binned, Steps: r.Steps})
	showPeriod := math.Abs(pd.Factor-1) > 1e-9
	base := r.BaselineStrategy()
	heading(out, fmt.Sprintf("Strategies, a year (baseline: %s)", base.Name))
	t := newTable(out)
	head := []string{"strategy"}
	if showPeriod {
		head = append(head, "in period (kWh)")
	}
	head = append(head, "energy (kWh/yr)", "peak (kW)", "cost ("+cur+"/yr)", "emissions (t CO₂e/yr)", "unmet (h)", "stage changes")
	t.row(head...)
	for _, s := range r.Strategies {
		changes := "—"
		if pd.Timed {
			changes = study.Grouped(float64(s.Energy.Changes))
		}
		row := []string{s.Name}
		if showPeriod {
			row = append(row, study.Grouped(s.Energy.KWh))
		}
		row = append(row, study.Grouped(s.Annual.Energy), num(s.Energy.PeakKW, 1), study.Grouped(s.Annual.Total),
			num(s.Annual.Emissions/1000, 1), num(s.Energy.HoursUnmet, 0), changes)
		t.row(row...)
	}
	t.flush()
	writeSavings(out, r)
	writeRange(out, r)
	writePressure(out, r)
	writeRegions(out, r)
	writeChecks(out, r)
	if len(r.Warnings) > 0 {
		heading(out, "Warnings and notes")
		for _, w := range r.Warnings {
			fmt.Fprintf(out, "- %s: %s\n", w.Source, w.Message)
		}
	}
	writeCautions(out)
}

// writeSavings writes each strategy against the baseline, with the
// appraisal where the plant file has a retrofit section.
func writeSavings(out io.Writer, r *study.Result) {
	cur := r.Currency()
	base := r.BaselineStrategy()
	heading(out, "Against the baseline, a year")
	t := newTable(out)
	head := []string{"strategy", "saved (kWh/yr)", "saved (%)", "saved (" + cur + "/yr)", "drives added"}
	if r.Appraised {
		head = append(head, "investment ("+cur+")", "simple payback", "NPV ("+cur+")", "SIR")
	}
	t.row(head...)
	for i, s := range r.Strategies {
		if i == r.Baseline {
			continue
		}
		sv := s.Savings
		row := []string{s.Name, study.Grouped(sv.Energy), fmt.Sprintf("%.1f", 100*sv.Share(base)), study.Grouped(sv.Cost), fmt.Sprint(s.DrivesAdded)}
		if a := s.Appraisal; a != nil {
			sir := "—"
			if !math.IsInf(a.SIR, 0) && !math.IsNaN(a.SIR) && a.Investment > 0 {
				sir = num(a.SIR, 2)
			}
			row = append(row, study.Grouped(a.Investment), econ.PaybackText(a.SimplePayback), study.Grouped(a.NPV), sir)
		}
		t.row(row...)
	}
	t.flush()
	if !r.Appraised {
		fmt.Fprintln(out, "No investment appraisal: the plant file has no retrofit section.")
		return
	}
	rt := r.Plant.Retrofit
	fmt.Fprintf(out, "Economics: drives %s %s each, other costs %s %s (programming and commissioning, with any change), %d years at %.1f %% discount, energy escalating %.1f %%/yr\n",
		study.Grouped(rt.DriveCost), cur, study.Grouped(rt.OtherCost), cur, rt.LifeYears, 100*rt.DiscountRate, 100*rt.Escalation)
}

// writeRange writes the savings range of the lowest-power staging.
func writeRange(out io.Writer, r *study.Result) {
	g := r.Range
	if g == nil {
		return
	}
	cur := r.Currency()
	lo := r.Strategy(study.KeyLowest)
	heading(out, "Savings range of the lowest-power staging against the baseline")
	t := newTable(out)
	t.row("case", "control head", "motor+drive losses", "saved (kWh/yr)", "saved ("+cur+"/yr)")
	t.row("expected", "as given", "as given", study.Grouped(lo.Savings.Energy), study.Grouped(lo.Savings.Cost))
	for _, c := range g.Cases {
		t.row(c.Sensitivity.Label, fmt.Sprintf("× %.2f", c.Sensitivity.ControlScale), fmt.Sprintf("× %.2f", c.Sensitivity.LossScale),
			study.Grouped(c.SavedKWh), study.Grouped(c.SavedCost))
	}
	t.flush()
	fmt.Fprintf(out, "Savings range: %s to %s kWh/yr (expected %s); low end: %s, high end: %s\n",
		study.Grouped(g.Low), study.Grouped(g.High), study.Grouped(lo.Savings.Energy), g.LowBy, g.HighBy)
}

func writeChecks(out io.Writer, r *study.Result) {
	p := r.Plant
	u := p.Units
	heading(out, "Checks")
	for _, c := range r.PartLoad {
		if c.DesignKW == 0 {
			fmt.Fprintf(out, "- Part load, %s: %s\n", c.Label, c.Note)
			continue
		}
		verdict := "meets"
		if !c.Pass {
			verdict = "does NOT meet"
		}
		fmt.Fprintf(out, "- Part load, %s: %.1f kW at 50 %% of design flow = %.1f %% of the %.1f kW at design; %s the 30 %% limit (%s)\n",
			c.Label, c.HalfKW, 100*c.Ratio, c.DesignKW, verdict, c.Note)
	}
	if uo := r.UnitOut; uo != nil && uo.Standby {
		fmt.Fprintf(out, "- One unit out (%s): the standby unit takes its place, so the duty pumps still deliver up to %s (%.0f %% of design) at %s\n",
			uo.Removed, u.FormatFlow(uo.MaxFlow), 100*float64(uo.MaxFlow/p.DesignFlow), u.FormatHead(uo.AtMax.HeaderHead))
	} else if uo != nil {
		if uo.ServesDesign {
			fmt.Fprintf(out, "- One unit out (%s): the rest serve design flow %s", uo.Removed, u.FormatFlow(p.DesignFlow))
		} else {
			fmt.Fprintf(out, "- One unit out (%s): the rest cannot serve design flow (%s)", uo.Removed, uo.Design.Reason)
		}
		fmt.Fprintf(out, "; they deliver at most %s (%.0f %% of design) at %s", u.FormatFlow(uo.MaxFlow),
			100*float64(uo.MaxFlow/p.DesignFlow), u.FormatHead(uo.AtMax.HeaderHead))
		if len(uo.AtMax.Units) > 0 {
			var loads []string
			for _, un := range uo.AtMax.Units {
				loads = append(loads, fmt.Sprintf("%.0f %%", 100*un.Load))
			}
			fmt.Fprintf(out, ", motor loads %s", strings.Join(loads, ", "))
		}
		fmt.Fprintln(out)
	}
	writeNPSHCheck(out, r)
	if b := r.Binning; b != nil {
		fmt.Fprintf(out, "- Binning: every interval solved gives %s kWh/yr for the lowest-power staging; %d bins of %s give %s kWh/yr (%+.2f %%; the cube-law estimate of the binning error is %.2f %%)\n",
			study.Grouped(b.EveryKWh), b.Bins, u.FormatFlow(b.Width), study.Grouped(b.BinnedKWh), 100*(b.BinnedKWh/b.EveryKWh-1), 100*b.CubeError)
	}
	if c := r.Calibration; c != nil {
		verdict := "within"
		if !c.Calibrated() {
			verdict = "outside"
		}
		fmt.Fprintf(out, "- Predicted vs logged power (%s, %d intervals): mean logged %.2f kW, mean error (predicted − logged) %+.2f kW, NMBE %+.1f %%, CV(RMSE) %.1f %%, largest error %.2f kW;\n",
			c.Strategy, c.N, c.MeanKW, c.MeanErr, 100*c.NMBE, 100*c.CVRMSE, c.MaxAbs)
		fmt.Fprintf(out, "  %s the ASHRAE Guideline 14 hourly calibration criteria (from memory: NMBE within ±10 %%, CV(RMSE) at most 30 %%)\n", verdict)
	}
}

func writeProfileLine(out io.Writer, r *study.Input) {
	pd := study.PeriodOf(r.Steps, r.Plant.Profile.AnnualHours)
	switch {
	case r.Binned != nil:
		fmt.Fprintf(out, "Profile: trend %s binned into %d bins of %s, %s h (binning error estimate %.2f %% on a cube law)\n",
			r.Trend.Name, len(r.Binned.Bins), r.Plant.Units.FormatFlow(r.Binned.Width), study.Grouped(pd.CoveredHours), 100*r.Binned.CubeError)
	case r.Trend != nil:
		fmt.Fprintf(out, "Profile: trend %s, %s intervals of %s, %s h from %s to %s, coverage %.1f %% of the span\n",
			r.Trend.Name, study.Grouped(float64(len(r.Trend.Points))), r.Trend.Interval, study.Grouped(pd.CoveredHours),
			pd.Start.Format("2006-01-02 15:04"), pd.End.Format("2006-01-02 15:04"), 100*pd.Coverage())
		fmt.Fprintf(out, "Trend rows: %s\n", strings.TrimSpace(r.Trend.Report.Summary()))
	default:
		fmt.Fprintf(out, "Profile: %s, %s h a year\n", plural(len(r.Steps), "bin", "bins"), study.Grouped(pd.CoveredHours))
	}
	if math.Abs(pd.Factor-1) > 1e-9 {
		fmt.Fprintf(out, "A year: the period's energy, cost and emissions × %.4f (%s h a year ÷ %s h covered); demand charges from the mean of the covered months\n",
			pd.Factor, study.Grouped(pd.AnnualHours), study.Grouped(pd.CoveredHours))
	}
}

// plural writes n with the singular or plural noun.
func plural(n int, one, many string) string {
	if n == 1 {
		return "1 " + one
	}
	return fmt.Sprintf("%d %s", n, many)
}

// writePressure writes what the setpoint reset is worth and how the logged
// DP compares with the modelled setpoint.
func writePressure(out io.Writer, r *study.Result) {
	lo, nr := r.Strategy(study.KeyLowest), r.Strategy(study.KeyNoReset)
	dp := r.DP
	if nr == nil && dp == nil {
		return
	}
	heading(out, "Differential-pressure setpoint")
	cur := r.Currency()
	if nr != nil {
		fmt.Fprintf(out, "- Setpoint reset: the lowest-power staging draws %s kWh/yr with the file's reset and %s kWh/yr at a fixed setpoint: the reset saves %s kWh/yr (%s %s/yr)\n",
			study.Grouped(lo.Annual.Energy), study.Grouped(nr.Annual.Energy), study.Grouped(nr.Annual.Energy-lo.Annual.Energy),
			study.Grouped(nr.Annual.Total-lo.Annual.Total), cur)
	}
	if dp != nil {
		p := r.Plant
		u, rho := p.Units, p.Fluid.Density
		pu := u.PressureUnit()
		fmt.Fprintf(out, "- Logged DP (%s intervals, %s h): mean %.1f %s against the modelled setpoint's %.1f %s at the same loads (%+.1f %s); above it by more than 5 %% for %.0f %% of those hours; largest difference %.1f %s\n",
			study.Grouped(float64(dp.N)), study.Grouped(dp.Hours), u.PressureOut(dp.MeanLogged, rho), pu, u.PressureOut(dp.MeanModel, rho), pu,
			u.PressureOut(dp.MeanDiff, rho), pu, 100*dp.AboveShare, u.PressureOut(dp.MaxAbs, rho), pu)
		fmt.Fprintf(out, "  at the logged DP the lowest-power staging draws %s kWh/yr, at the modelled setpoint %s kWh/yr (%+s kWh/yr)\n",
			study.Grouped(dp.EnergyAtLogged), study.Grouped(dp.EnergyAtSetpoints), study.Grouped(dp.EnergyAtLogged-dp.EnergyAtSetpoints))
	}
}

// writeRegions writes where each strategy runs its units, unit-hours a year.
func writeRegions(out io.Writer, r *study.Result) {
	heading(out, "Where the units run, unit-hours a year")
	t := newTable(out)
	t.row("strategy", "running (unit-h/yr)", "outside 70–120 % of BEP flow (unit-h/yr)", "share (%)", "above rated speed (unit-h/yr)", "into service factor (unit-h/yr)")
	f := r.Period.Factor
	for _, s := range r.Strategies {
		g := s.Regions
		share := "—"
		if g.UnitHours > 0 {
			share = fmt.Sprintf("%.0f", 100*g.OutsidePreferred/g.UnitHours)
		}
		t.row(s.Name, study.Grouped(g.UnitHours*f), study.Grouped(g.OutsidePreferred*f), share, study.Grouped(g.Overspeed*f), study.Grouped(g.Overload*f))
	}
	t.flush()
	fmt.Fprintln(out, "The preferred operating region is 70–120 % of BEP flow at the unit's speed (ANSI/HI 9.6.3); no unit is planned below its minimum continuous stable flow or past runout (the allowable region), so none runs outside it.")
	if lo, pr := r.Strategy(study.KeyLowest), r.Strategy(study.KeyPreferred); lo != nil && pr != nil && lo.Annual.Energy > 0 {
		fmt.Fprintf(out, "Keeping every unit inside the preferred region costs %s kWh/yr (%+.1f %%) against the lowest-power staging",
			study.Grouped(pr.Annual.Energy-lo.Annual.Energy), 100*(pr.Annual.Energy/lo.Annual.Energy-1))
		if pr.Energy.HoursUnmet > lo.Energy.HoursUnmet {
			fmt.Fprintf(out, ", and leaves %s h unmet", study.Grouped((pr.Energy.HoursUnmet-lo.Energy.HoursUnmet)*f))
		}
		fmt.Fprintln(out, ".")
	}
}
