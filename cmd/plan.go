package cmd

import (
	"fmt"
	"io"
	"math"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"wattstage/curves"
	"wattstage/econ"
	"wattstage/optimize"
	"wattstage/plant"
	"wattstage/profile"
)

// PlanOptions are the inputs of `wattstage plan`.
type PlanOptions struct {
	IO        *IO
	PlantPath string
	Output    string // workbook path; empty = none
	Force     bool
	JSON      bool
	Baseline  string
	BinWidth  string // trend: solve binned instead of point by point, bin width in the plant's flow unit
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
			if runF != nil {
				return runF(opts)
			}
			return planRun(opts)
		},
	}
	f := c.Flags()
	f.StringVarP(&opts.Output, "output", "o", "", "write the workbook to this .xlsx file")
	f.BoolVar(&opts.Force, "force", false, "replace an existing workbook")
	f.BoolVar(&opts.JSON, "json", false, "write the full result as JSON")
	f.StringVar(&opts.Baseline, "baseline", "", "strategy to count savings against: current, throttled, bypass, common, partial, derived (default: current when the plant file gives its sequence, else throttled)")
	f.StringVar(&opts.BinWidth, "bin-width", "", "with a trend: bin the flows by this width (plant flow unit) instead of solving every interval")
	return c
}

// planInput is a loaded plant with its steps.
type planInput struct {
	plant  *plant.Plant
	steps  []optimize.Step
	trend  *profile.Trend
	binned *profile.Binned
}

func loadPlanInput(path, binWidth string) (*planInput, error) {
	p, err := loadPlant(path)
	if err != nil {
		return nil, err
	}
	in := &planInput{plant: p}
	if p.Profile.Trend == nil {
		if binWidth != "" {
			return nil, badInputf("--bin-width: the plant's profile is already binned")
		}
		in.steps = optimize.StepsFromBins(p.Profile.Bins)
		return in, nil
	}
	spec := *p.Profile.Trend
	if !filepath.IsAbs(spec.Path) {
		spec.Path = filepath.Join(filepath.Dir(p.Source), spec.Path)
	}
	tr, err := profile.ReadTrendFile(spec, spec.Path)
	if err != nil {
		return nil, badInput(err)
	}
	in.trend = tr
	if binWidth == "" {
		in.steps = optimize.StepsFromTrend(tr.Points)
		return in, nil
	}
	w, err := parseFlow(binWidth, p)
	if err != nil || w <= 0 {
		return nil, badInputf("--bin-width %q: not a positive flow in %s", binWidth, p.Units.FlowUnit())
	}
	b, err := tr.Bin(w)
	if err != nil {
		return nil, badInput(err)
	}
	in.binned = b
	in.steps = optimize.StepsFromBinned(b)
	return in, nil
}

func planRun(opts *PlanOptions) error {
	if err := checkOutputPath(opts.Output, opts.PlantPath, opts.Force); err != nil {
		return err
	}
	in, err := loadPlanInput(opts.PlantPath, opts.BinWidth)
	if err != nil {
		return err
	}
	po := optimize.PlanOptions{Baseline: opts.Baseline, Extra: derivedStrategy(in.plant)}
	if opts.IO.Terminal {
		po.Progress = func(label string, i, n int) {
			fmt.Fprintf(opts.IO.Err, "\r[%d/%d] %-40s", i+1, n, label)
			if i == n-1 {
				fmt.Fprint(opts.IO.Err, "\r"+strings.Repeat(" ", 50)+"\r")
			}
		}
	}
	if in.trend != nil && in.binned == nil && in.plant.DesignFlow > 0 {
		// Also solve the trend binned at 5 % of design flow, to show the
		// binning error against the point-by-point total.
		if b, err := in.trend.Bin(in.plant.DesignFlow / 20); err == nil {
			in.binned = b
			po.Binned = optimize.StepsFromBinned(b)
		}
	}
	pl, err := optimize.NewPlan(in.plant, in.steps, po)
	if err != nil {
		if strings.Contains(err.Error(), "baseline") {
			return badInput(err)
		}
		return err
	}
	if opts.JSON {
		if err := writeJSON(opts.IO.Out, planJSON(in, pl)); err != nil {
			return err
		}
	} else {
		writePlan(opts.IO.Out, in, pl)
	}
	if opts.Output != "" {
		if err := writeWorkbook(opts.Output, opts.PlantPath, opts.Force, in, pl); err != nil {
			return err
		}
		fmt.Fprintf(opts.IO.Err, "wrote %s\n", opts.Output)
	}
	return nil
}

func writePlan(out io.Writer, in *planInput, pl *optimize.Plan) {
	p := in.plant
	u := p.Units
	cur := p.Tariff.Currency
	fmt.Fprintf(out, "Plant: %s\n", p.Name)
	writeProfileLine(out, in)
	base := pl.Outcomes[pl.Baseline]
	heading(out, fmt.Sprintf("Strategies over the profile (baseline: %s)", base.Run.Name))
	t := newTable(out)
	t.row("strategy", "energy (kWh/yr)", "peak (kW)", "cost ("+cur+"/yr)", "emissions (t CO₂e/yr)", "unmet (h)", "stage changes")
	for _, o := range pl.Outcomes {
		changes := "—"
		if len(in.steps) > 0 && in.steps[0].Timed() {
			changes = fmt.Sprint(o.Energy.Changes)
		}
		t.row(o.Run.Name, num(o.Energy.KWh, 0), num(o.Energy.PeakKW, 1), num(o.Bill.Total, 0), num(o.Bill.Emissions/1000, 1),
			num(o.Energy.HoursUnmet, 0), changes)
	}
	t.flush()
	heading(out, "Against the baseline")
	t.row("strategy", "saved (kWh/yr)", "saved (%)", "saved ("+cur+"/yr)", "drives added", "investment ("+cur+")",
		"simple payback", "NPV ("+cur+")", "SIR")
	for i, o := range pl.Outcomes {
		if i == pl.Baseline || o.Appraisal == nil {
			continue
		}
		a := o.Appraisal
		savedPct := "—"
		if base.Energy.KWh > 0 {
			savedPct = fmt.Sprintf("%.1f", 100*a.EnergySaved/base.Energy.KWh)
		}
		sir := "—"
		if !math.IsInf(a.SIR, 0) && !math.IsNaN(a.SIR) {
			sir = num(a.SIR, 2)
		}
		t.row(o.Run.Name, num(a.EnergySaved, 0), savedPct, num(a.AnnualSavings, 0), fmt.Sprint(o.DrivesAdded),
			num(a.Investment, 0), econ.PaybackText(a.SimplePayback), num(a.NPV, 0), sir)
	}
	t.flush()
	r := p.Retrofit
	fmt.Fprintf(out, "Economics: drives %.0f %s each, other costs %.0f %s, %d years at %.1f %% discount, energy escalating %.1f %%/yr\n",
		r.DriveCost, cur, r.OtherCost, cur, r.LifeYears, 100*r.DiscountRate, 100*r.Escalation)

	if lo := pl.Outcome(optimize.KeyLowest); lo != nil && lo.Appraisal != nil && len(pl.Range) > 0 {
		heading(out, "Savings range of the lowest-power staging against the baseline")
		t := newTable(out)
		t.row("case", "control head", "motor+drive losses", "saved (kWh/yr)", "saved ("+cur+"/yr)")
		rows := append([]optimize.RangeCase(nil), pl.Range...)
		t.row("expected", "as given", "as given", num(lo.Appraisal.EnergySaved, 0), num(lo.Appraisal.AnnualSavings, 0))
		for _, rc := range rows {
			t.row(rc.Sensitivity.Label, fmt.Sprintf("× %.2f", rc.Sensitivity.ControlScale), fmt.Sprintf("× %.2f", rc.Sensitivity.LossScale),
				num(rc.SavedKWh, 0), num(rc.SavedCost, 0))
		}
		t.flush()
		lo, hi := lowHigh(pl, lo.Appraisal.EnergySaved)
		fmt.Fprintf(out, "Savings range: %.0f to %.0f kWh/yr (expected %.0f)\n", lo, hi, pl.Outcome(optimize.KeyLowest).Appraisal.EnergySaved)
	}

	heading(out, "Checks")
	for _, c := range pl.PartLoad {
		verdict := "meets"
		if !c.Pass {
			verdict = "does NOT meet"
		}
		if c.DesignKW == 0 {
			fmt.Fprintf(out, "- Part load, %s: %s\n", c.Label, c.Note)
			continue
		}
		fmt.Fprintf(out, "- Part load, %s: %.1f kW at 50 %% of design flow = %.1f %% of the %.1f kW at design; %s the 30 %% limit (%s)\n",
			c.Label, c.HalfKW, 100*c.Ratio, c.DesignKW, verdict, c.Note)
	}
	if uo := pl.UnitOut; uo != nil {
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
	if in.trend != nil {
		writeTrendChecks(out, in, pl)
	}
	var notes []string
	notes = append(notes, pl.Warnings...)
	for _, o := range pl.Outcomes {
		if o.Bill != nil {
			for _, w := range o.Bill.Warnings {
				notes = appendOnce(notes, "tariff: "+w)
			}
		}
		for _, l := range o.Energy.UnmetReasons() {
			notes = append(notes, fmt.Sprintf("%s: %.0f h unmet (%s)", o.Run.Name, o.Energy.UnmetBy[l], l))
		}
	}
	if len(notes) > 0 {
		heading(out, "Notes")
		for _, n := range notes {
			fmt.Fprintln(out, "- "+n)
		}
	}
	writeCautions(out)
}

// lowHigh returns the smallest and largest energy savings over the
// expected case and the sensitivity cases.
func lowHigh(pl *optimize.Plan, expected float64) (float64, float64) {
	lo, hi := expected, expected
	for _, rc := range pl.Range {
		lo, hi = math.Min(lo, rc.SavedKWh), math.Max(hi, rc.SavedKWh)
	}
	return lo, hi
}

func appendOnce(list []string, s string) []string {
	for _, v := range list {
		if v == s {
			return list
		}
	}
	return append(list, s)
}

func writeProfileLine(out io.Writer, in *planInput) {
	hours := 0.0
	for _, s := range in.steps {
		hours += s.Hours
	}
	switch {
	case in.binned != nil && len(in.binned.Bins) == len(in.steps):
		fmt.Fprintf(out, "Profile: trend %s binned into %d bins of %s, %.0f h (binning error estimate %.2f %% on a cube law)\n",
			in.trend.Name, len(in.binned.Bins), in.plant.Units.FormatFlow(in.binned.Width), hours, 100*in.binned.CubeError)
	case in.trend != nil:
		fmt.Fprintf(out, "Profile: trend %s, %d intervals of %s, %.0f h, coverage %.1f %% of the span\n",
			in.trend.Name, len(in.trend.Points), in.trend.Interval, hours, 100*in.trend.Coverage())
		fmt.Fprintf(out, "Trend rows: %s\n", strings.TrimSpace(in.trend.Report.Summary()))
	default:
		fmt.Fprintf(out, "Profile: %d bins, %.0f h/yr\n", len(in.steps), hours)
	}
}

func writeTrendChecks(out io.Writer, in *planInput, pl *optimize.Plan) {
	if pl.BinnedKWh > 0 {
		lo := pl.Outcomes[0].Energy.KWh
		fmt.Fprintf(out, "- Binning: every interval solved gives %.0f kWh/yr for the lowest-power staging; %d bins of %s give %.0f kWh/yr (%+.2f %%; the cube-law estimate of the binning error is %.2f %%)\n",
			lo, len(in.binned.Bins), in.plant.Units.FormatFlow(in.binned.Width), pl.BinnedKWh, 100*(pl.BinnedKWh/lo-1), 100*in.binned.CubeError)
	}
	if !in.trend.HasPower() {
		return
	}
	key := optimize.KeyLowest
	if pl.Outcome(optimize.KeyCurrent) != nil {
		key = optimize.KeyCurrent
	}
	o := pl.Outcome(key)
	c := optimize.Calibrate(o.Run, in.steps)
	if c.N < 2 {
		return
	}
	fmt.Fprintf(out, "- Predicted vs measured power (%s, %d intervals): mean measured %.2f kW, mean error %+.2f kW, NMBE %+.1f %%, CV(RMSE) %.1f %%, largest error %.2f kW\n",
		o.Run.Name, c.N, c.MeanKW, c.MeanErr, 100*c.NMBE, 100*c.CVRMSE, c.MaxAbs)
	verdict := "within"
	if math.Abs(c.NMBE) > 0.10 || c.CVRMSE > 0.30 {
		verdict = "outside"
	}
	fmt.Fprintf(out, "  %s the ASHRAE Guideline 14 hourly calibration criteria (from memory: NMBE within ±10 %%, CV(RMSE) at most 30 %%); calibrate the control head, curves or motor/drive data before relying on savings\n", verdict)
}

func fmtFlow(u curves.UnitSystem, q curves.Flow) string { return u.FormatFlow(q) }

func nanOr(v float64) any {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return nil
	}
	return v
}
