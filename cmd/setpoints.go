package cmd

import (
	"fmt"
	"io"
	"math"
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
	Basis     string
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
  wattstage setpoints examples/chilled-water-trend.yaml --basis speed
  wattstage setpoints examples/condenser-water.yaml --deadband 0.15 --down-delay 15m --json`,
		Args: cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			opts.PlantPath = args[0]
			if opts.Basis != "flow" && opts.Basis != "speed" {
				return usageError{fmt.Errorf("--basis must be flow or speed")}
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
	f.StringVar(&opts.Basis, "basis", "flow", "signal the sequence stages on when it is run over the profile: flow or speed")
	f.BoolVar(&opts.JSON, "json", false, "write the setpoints and their energy price as JSON")
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
		UpDelay: opts.UpDelay, DownDelay: opts.DownDelay})
	if err != nil {
		return err
	}
	basis := optimize.FlowBasis
	if opts.Basis == "speed" {
		basis = optimize.SpeedBasis
	}
	price := optimize.PriceSequence(sp, in.Steps, basis)
	if opts.JSON {
		return writeJSON(opts.IO.Out, map[string]any{"setpoints": sp, "price": priceJSON(price),
			"sequence_of_operation": sp.SequenceOfOperation(), "cautions": study.Cautions})
	}
	out := opts.IO.Out
	p := in.Plant
	fmt.Fprintf(out, "Plant: %s\n", p.Name)
	heading(out, "Staging setpoints (adjustable starting values)")
	writeSetpointTables(out, sp)
	if len(sp.Defaults) > 0 {
		fmt.Fprintln(out)
		for _, d := range sp.Defaults {
			fmt.Fprintln(out, "default: "+d)
		}
	}
	writeOrder(out, p, sp)
	heading(out, "Energy price of the sequence over the profile")
	writeProfileLine(out, in)
	t := newTable(out)
	t.row("way of staging", "energy (kWh/yr)", "vs optimum (%)", "stage changes")
	changes := func(n int) string {
		if len(in.Steps) > 0 && in.Steps[0].Timed() {
			return fmt.Sprint(n)
		}
		return "—"
	}
	t.row("lowest power at every step", num(price.Optimum.KWh, 0), "0.00", changes(price.OptimumChanges))
	t.row("derived sequence ("+basis.String()+" signal)", num(price.Sequence.KWh, 0), fmt.Sprintf("%+.2f", price.ExtraPct), changes(price.Sequence.Changes))
	if price.HasCurrent {
		t.row("current thresholds", num(price.Current.KWh, 0), fmt.Sprintf("%+.2f", price.CurrentExtraPct), changes(price.Current.Changes))
	}
	t.flush()
	if len(in.Steps) > 0 && in.Steps[0].Timed() {
		fmt.Fprintf(out, "Derived sequence: %.2f stage changes per day on average, at most %d in one hour\n",
			price.Cycling.PerDay, price.Cycling.MaxPerHour)
		for _, m := range price.Cycling.Models {
			if math.IsNaN(m.Allowed) {
				fmt.Fprintf(out, "  %s: %d starts a year, at most %d in one hour (no NEMA MG 10 value for this motor)\n", m.Name, m.Starts, m.MaxPerHour)
				continue
			}
			fmt.Fprintf(out, "  %s: %d starts a year, at most %d in one hour, against %.1f starts per hour for its motor size (NEMA MG 10, values from memory)\n",
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

func priceJSON(pr optimize.SequencePrice) map[string]any {
	m := map[string]any{"basis": pr.Basis.String(), "optimum_kwh": pr.Optimum.KWh, "sequence_kwh": pr.Sequence.KWh,
		"sequence_extra_pct": pr.ExtraPct, "optimum_changes": pr.OptimumChanges, "sequence_changes": pr.Sequence.Changes,
		"changes_per_day": pr.Cycling.PerDay, "max_changes_in_an_hour": pr.Cycling.MaxPerHour, "warnings": pr.Warnings}
	if pr.HasCurrent {
		m["current_kwh"] = pr.Current.KWh
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
		writeOptions(out, p, t.UpOptions)
		fmt.Fprintf(out, "%d → %d at %s:", t.To, t.From, u.FormatFlow(t.Down.Flow))
		writeOptions(out, p, t.DownOptions)
	}
}

func writeOptions(out io.Writer, p *plant.Plant, opts []optimize.Option) {
	var best float64
	for _, o := range opts {
		if o.Served {
			best = float64(o.Power)
			break
		}
	}
	for k, o := range opts {
		if k > 0 {
			fmt.Fprint(out, ";")
		}
		switch {
		case !o.Served:
			fmt.Fprintf(out, " %s cannot serve it", optimize.DescribeCounts(p, o.Counts))
		case float64(o.Power) == best:
			fmt.Fprintf(out, " %s %.2f kW (chosen)", optimize.DescribeCounts(p, o.Counts), float64(o.Power)/1000)
		default:
			fmt.Fprintf(out, " %s %.2f kW (+%.1f %%)", optimize.DescribeCounts(p, o.Counts), float64(o.Power)/1000, 100*(float64(o.Power)/best-1))
		}
	}
	fmt.Fprintln(out)
}
