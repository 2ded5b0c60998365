package cmd

import (
	"fmt"
	"io"
	"math"
	"slices"
	"time"

	"github.com/spf13/cobra"

	"wattstage/optimize"
	"wattstage/plant"
	"wattstage/study"
)

// SetpointsOptions are the inputs of `wattstage setpoints`.
type SetpointsOptions struct {
	IO        *IO
	PlantPath string
	Deadband  float64
	UpDelay   time.Duration
	DownDelay time.Duration
	Signal    string // "" = chosen for the plant
	Format    string // text, csv or json
	JSON      bool
}

// NewCmdSetpoints builds `wattstage setpoints`.
func NewCmdSetpoints(streams *IO, runF func(*SetpointsOptions) error) *cobra.Command {
	opts := &SetpointsOptions{IO: streams}
	c := &cobra.Command{
		Use:   "setpoints PLANT.yaml",
		Short: "Staging setpoints a controls contractor can program",
		Long: `Derive, from the lowest-power staging, a sequence the automation system can
run: for each change of running units the plant flow at which it saves power
(the crossover), written as plant flow, flow per unit, percent of design flow
and the common speed just before and just after the change; stage-down values
below stage-up by a deadband that prevents hunting; delays; the limit that sets
each value; the order units come on and go off; and the failure response.

The sequence is then run over the plant's load profile and its energy compared
with the unconstrained optimum and with the plant's current thresholds.`,
		Example: `  wattstage setpoints examples/chilled-water.yaml
  wattstage setpoints examples/chilled-water-trend.yaml --signal speed
  wattstage setpoints examples/chilled-water.yaml --format csv
  wattstage setpoints examples/condenser-water.yaml --deadband 0.15 --down-delay 15m --json`,
		Args: cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			opts.PlantPath = args[0]
			if opts.Signal != "" {
				if _, err := optimize.ParseBasis(opts.Signal); err != nil {
					return usageError{fmt.Errorf("--signal %q: give flow, speed or flow-and-speed", opts.Signal)}
				}
			}
			if opts.JSON {
				opts.Format = "json"
			}
			if opts.Format != "text" && opts.Format != "csv" && opts.Format != "json" {
				return usageError{fmt.Errorf("--format %q: give text, csv or json", opts.Format)}
			}
			for _, d := range []struct {
				flag string
				v    time.Duration
			}{{"up-delay", opts.UpDelay}, {"down-delay", opts.DownDelay}} {
				if c.Flags().Changed(d.flag) {
					if err := checkDuration(d.flag, d.v, time.Second, time.Hour); err != nil {
						return err
					}
				}
			}
			if runF != nil {
				return runF(opts)
			}
			return setpointsRun(opts)
		},
	}
	f := c.Flags()
	f.Var(&fractionValue{dst: &opts.Deadband, lo: 0.01, hi: 0.45}, "deadband", "stage-down flow below stage-up, as a fraction (0.15) or percentage (15%) of the stage-up flow, 1 % to 45 % (default 10 %)")
	f.DurationVar(&opts.UpDelay, "up-delay", 0, "how long a stage-up condition must hold, 1s to 1h (default 5m)")
	f.DurationVar(&opts.DownDelay, "down-delay", 0, "how long a stage-down condition must hold, 1s to 1h (default 10m)")
	f.StringVar(&opts.Signal, "signal", "", "the one signal the sequence stages on: flow, speed or flow-and-speed (default: the most robust for the plant, with the reason)")
	f.StringVar(&opts.Format, "format", "text", "text; csv (the staging table, stages, DP schedule and points list, one table per first-column name); or json")
	f.BoolVar(&opts.JSON, "json", false, "the same as --format json")
	return c
}

func setpointsRun(opts *SetpointsOptions) error {
	pl, err := loadPlant(opts.PlantPath)
	if err != nil {
		return err
	}
	in, err := study.Prepare(pl, 0)
	if err != nil {
		return badInput(err)
	}
	sp, err := optimize.DeriveSetpoints(in.Plant, optimize.SetpointOptions{Deadband: opts.Deadband,
		UpDelay: opts.UpDelay, DownDelay: opts.DownDelay, Signal: opts.Signal})
	if err != nil {
		return err
	}
	if opts.Format == "csv" {
		return sp.WriteCSV(opts.IO.Out)
	}
	price := optimize.PriceSequence(sp, in.Steps, sp.Signal)
	factor := study.PeriodOf(in.Steps, in.Plant.Profile.AnnualHours).Factor
	if opts.Format == "json" {
		doc := sp.SubmittalJSON()
		doc["energy"] = priceJSON(price, factor)
		doc["sequence_of_operation"] = sp.SequenceOfOperation()
		doc["cautions"] = study.Cautions
		return writeJSON(opts.IO.Out, doc)
	}
	out := opts.IO.Out
	p := in.Plant
	fmt.Fprintf(out, "Plant: %s\n", p.Name)
	fmt.Fprintf(out, "Staging signal: %s (%s)\n", sp.Signal, sp.SignalWhy)
	heading(out, "Staging setpoints (adjustable starting values)")
	writeSetpointTables(out, sp)
	fmt.Fprintf(out, "Flows are rounded to %s %s: the stages draw within %.1f %% of each other across each near-equal band.\n",
		sp.FlowText(sp.Resolution()), p.Units.FlowUnit(), 100*optimize.NearEqualTolerance)
	if len(sp.Defaults) > 0 {
		fmt.Fprintln(out)
		for _, d := range sp.Defaults {
			fmt.Fprintln(out, "default: "+d)
		}
	}
	writeDPSchedule(out, sp)
	writeOrder(out, p, sp)
	writePoints(out, sp)
	heading(out, "Energy of the sequence over the profile, a year")
	writeProfileLine(out, in)
	t := newTable(out)
	t.row("way of staging", "energy (kWh/yr)", "vs optimum (%)", "stage changes")
	changes := func(n int) string {
		if len(in.Steps) > 0 && in.Steps[0].Timed() {
			return study.Grouped(float64(n))
		}
		return "—"
	}
	t.row("lowest power at every step", study.Grouped(factor*price.Optimum.KWh), "0.00", changes(price.OptimumChanges))
	t.row("derived sequence ("+sp.Signal.String()+" signal)", study.Grouped(factor*price.Sequence.KWh), fmt.Sprintf("%+.2f", price.ExtraPct), changes(price.Sequence.Changes))
	if price.HasCurrent {
		t.row("current sequence", study.Grouped(factor*price.Current.KWh), fmt.Sprintf("%+.2f", price.CurrentExtraPct), changes(price.Current.Changes))
	}
	t.flush()
	if len(in.Steps) > 0 && in.Steps[0].Timed() {
		fmt.Fprintf(out, "Derived sequence: %.2f stage changes per day on average, at most %d in one hour\n",
			price.Cycling.PerDay, price.Cycling.MaxPerHour)
		for _, m := range price.Cycling.Models {
			if math.IsNaN(m.Allowed) {
				fmt.Fprintf(out, "  %s: %d starts in the period, at most %d in one hour (no NEMA MG 10 value for this motor)\n", m.Name, m.Starts, m.MaxPerHour)
				continue
			}
			fmt.Fprintf(out, "  %s: %d starts in the period, at most %d in one hour, against %.1f starts per hour for its motor size (NEMA MG 10, values from memory)\n",
				m.Name, m.Starts, m.MaxPerHour, m.Allowed)
		}
	}
	for _, w := range append(sp.Warnings, price.Warnings...) {
		fmt.Fprintln(out, "Note: "+w)
	}
	heading(out, "Sequence of operation")
	fmt.Fprint(out, sp.SequenceOfOperation())
	writeCautions(out)
	return nil
}

// writeDPSchedule writes the differential-pressure setpoint against load.
func writeDPSchedule(out io.Writer, sp *optimize.Setpoints) {
	rows, _, proposed := sp.DPSchedule()
	if rows == nil {
		return
	}
	p := sp.Plant
	u := p.Units
	title := "Differential-pressure setpoint against load"
	if proposed {
		title += " (proposed reset: the plant file gives none)"
	}
	heading(out, title)
	t := newTable(out)
	t.row("plant flow ("+u.FlowUnit()+")", "setpoint ("+u.PressureUnit()+")", "setpoint ("+u.HeadUnit()+")", "head at the pumps ("+u.HeadUnit()+")")
	for _, r := range rows {
		t.row(study.Grouped(u.FlowOut(r.Flow)), num(u.PressureOut(r.Setpoint, p.Fluid.Density), 1), num(u.HeadOut(r.Setpoint), 1), num(u.HeadOut(r.PumpHead), 1))
	}
	t.flush()
}

// writePoints writes the points list the sequence needs.
func writePoints(out io.Writer, sp *optimize.Setpoints) {
	heading(out, "Points the sequence reads and writes")
	t := newTable(out)
	t.row("point", "type", "unit", "what it is")
	for _, pt := range sp.PointsList() {
		unit := pt.Unit
		if unit == "" {
			unit = "—"
		}
		t.row(pt.Name, pt.Kind, unit, pt.Description)
	}
	t.flush()
}

func priceJSON(pr optimize.SequencePrice, factor float64) map[string]any {
	m := map[string]any{"signal": pr.Basis.String(), "optimum_kwh_per_yr": factor * pr.Optimum.KWh, "sequence_kwh_per_yr": factor * pr.Sequence.KWh,
		"sequence_extra_pct": pr.ExtraPct, "optimum_changes": pr.OptimumChanges, "sequence_changes": pr.Sequence.Changes,
		"changes_per_day": pr.Cycling.PerDay, "max_changes_in_an_hour": pr.Cycling.MaxPerHour, "warnings": pr.Warnings}
	if pr.HasCurrent {
		m["current_kwh_per_yr"] = factor * pr.Current.KWh
		m["current_extra_pct"] = pr.CurrentExtraPct
	}
	return m
}

// writeOrder shows, for each change, the combinations with the new count of
// units at the change's flow and their input: why that unit comes on (or
// goes off) rather than another.
func writeOrder(out io.Writer, p *plant.Plant, sp *optimize.Setpoints) {
	mixed := len(p.Models) > 1
	if !mixed {
		return
	}
	heading(out, "Which unit comes on and goes off (input at the change, best first)")
	u := p.Units
	for _, t := range sp.Transitions {
		fmt.Fprintf(out, "%d → %d at %s:", t.From, t.To, u.FormatFlow(t.Up.Flow))
		writeOptions(out, p, t.UpOptions, t.UpOthers, t.Upper)
		fmt.Fprintf(out, "%d → %d at %s:", t.To, t.From, u.FormatFlow(t.Down.Flow))
		writeOptions(out, p, t.DownOptions, t.DownOthers, t.Lower)
	}
}

// writeOptions writes the combinations a change weighed, marking the one
// the sequence runs after it (target) as chosen and giving the others'
// input relative to it: at a crossover two combinations draw the same, and
// which of them is listed first is rounding, not the sequence.
func writeOptions(out io.Writer, p *plant.Plant, opts []optimize.Option, others int, target []int) {
	ref := math.NaN()
	for _, o := range opts {
		if o.Served && slices.Equal(o.Counts, target) {
			ref = float64(o.Power)
		}
	}
	if math.IsNaN(ref) {
		// The sequence's combination is not listed: compare with the best.
		for _, o := range opts {
			if o.Served {
				ref = float64(o.Power)
				break
			}
		}
	}
	for k, o := range opts {
		if k > 0 {
			fmt.Fprint(out, ";")
		}
		switch {
		case !o.Served:
			fmt.Fprintf(out, " %s cannot serve it", optimize.DescribeCounts(p, o.Counts))
		case slices.Equal(o.Counts, target):
			fmt.Fprintf(out, " %s %.2f kW (chosen)", optimize.DescribeCounts(p, o.Counts), float64(o.Power)/1000)
		default:
			d := 100 * (float64(o.Power)/ref - 1)
			sign := "+"
			if math.Round(10*d) < 0 {
				sign = "−"
			}
			fmt.Fprintf(out, " %s %.2f kW (%s%.1f %%)", optimize.DescribeCounts(p, o.Counts), float64(o.Power)/1000, sign, math.Abs(d))
		}
	}
	if others > 0 {
		fmt.Fprintf(out, "; %s other combinations draw more or cannot serve it", optimize.Thousands(float64(others), 0))
	}
	fmt.Fprintln(out)
}
