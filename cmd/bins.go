package cmd

import (
	"fmt"
	"strings"

	"github.com/spf13/cobra"

	"wattstage/curves"
	"wattstage/plant"
	"wattstage/profile"
)

// BinsOptions are the inputs of `wattstage bins`.
type BinsOptions struct {
	IO          *IO
	TrendPath   string
	PlantPath   string // optional: take the column mapping and units from this plant file
	FlowColumn  string
	TimeColumn  string
	PowerColumn string // header of the measured pump power in kW; optional
	FlowUnit    string
	TimeZone    string
	Width       string // bin width in the trend's flow unit
	JSON        bool
	AsProfile   bool // write the bins as a plant file's profile: block
}

// NewCmdBins builds `wattstage bins`.
func NewCmdBins(streams *IO, runF func(*BinsOptions) error) *cobra.Command {
	opts := &BinsOptions{IO: streams}
	c := &cobra.Command{
		Use:   "bins TREND.csv",
		Short: "Read a trend log and print its flow histogram",
		Long: `Read a trend log (CSV: a timestamp and the plant flow, optionally differential
pressure and measured pump power), report every row that was left out and why, the
coverage of the span, and print the flows binned as a histogram of hours.

Columns are found by their headers: the first column is the time and the only
header containing "flow" is the flow, with its unit read from the header
(e.g. "plant_flow_gpm"); name them with the flags, or take the mapping from a
plant file with --plant.`,
		Example: `  wattstage bins examples/chilled-water-trend.csv
  wattstage bins examples/chilled-water-trend.csv --width 200
  wattstage bins examples/chilled-water-trend.csv --as-profile --time-zone America/Chicago
  wattstage bins log.csv --flow-column "CHW Flow" --flow-unit L/s --time-zone Europe/Berlin`,
		Args: cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			opts.TrendPath = args[0]
			if runF != nil {
				return runF(opts)
			}
			return binsRun(opts)
		},
	}
	f := c.Flags()
	f.StringVar(&opts.PlantPath, "plant", "", "take the column mapping and units from this plant file's trend")
	f.StringVar(&opts.FlowColumn, "flow-column", "", "header of the flow column")
	f.StringVar(&opts.TimeColumn, "time-column", "", "header of the timestamp column")
	f.StringVar(&opts.PowerColumn, "power-column", "", "header of the measured total pump power in kW (optional: adds mean power per bin)")
	f.StringVar(&opts.FlowUnit, "flow-unit", "", "flow unit: gpm, m3/h or L/s (default: read from the header)")
	f.StringVar(&opts.TimeZone, "time-zone", "", "IANA zone of stamps without an offset (default: UTC wall clock)")
	f.StringVar(&opts.Width, "width", "", "bin width: a flow in the trend's unit (200), with a unit (200gpm, 12L/s) or, with --plant, % of design flow (5%); at most 1000 bins and at least one up to the highest flow (default: about 20 bins)")
	f.BoolVar(&opts.JSON, "json", false, "write the bins as JSON")
	f.BoolVar(&opts.AsProfile, "as-profile", false, "write the bins as a profile: block to paste into a plant file (in the --plant file's units, else the trend's)")
	return c
}

func binsRun(opts *BinsOptions) error {
	var spec profile.TrendSpec
	var design curves.Flow // the plant's design flow, for --width in %; 0 without --plant
	var pl *plant.Plant    // the --plant file; nil without
	if opts.PlantPath != "" {
		p, err := loadPlant(opts.PlantPath)
		if err != nil {
			return err
		}
		switch {
		case p.Profile.Trend != nil:
			spec = *p.Profile.Trend
		case !opts.AsProfile:
			return badInputf("--plant %s: the plant file has no trend profile", opts.PlantPath)
		}
		design, pl = p.DesignFlow, p
	}
	spec.Path = opts.TrendPath
	for _, kv := range []struct {
		dst *string
		v   string
	}{
		{&spec.FlowColumn, opts.FlowColumn}, {&spec.TimeColumn, opts.TimeColumn}, {&spec.PowerColumn, opts.PowerColumn},
		{&spec.FlowUnit, opts.FlowUnit}, {&spec.TimeZone, opts.TimeZone},
	} {
		if kv.v != "" {
			*kv.dst = kv.v
		}
	}
	tr, err := profile.ReadTrendFile(spec, opts.TrendPath)
	if err != nil {
		return badInput(err)
	}
	unit, per := flowUnitOf(tr.Spec.FlowUnit)
	width := niceWidth(tr, per)
	if opts.Width != "" {
		if width, err = binWidthArg(opts.Width, tr, unit, per, design); err != nil {
			return err
		}
	}
	b, err := tr.Bin(width)
	if err != nil {
		return badInput(err)
	}
	if opts.AsProfile {
		return writeProfileBlock(opts.IO.Out, tr, b, pl)
	}
	if opts.JSON {
		return writeJSON(opts.IO.Out, map[string]any{"trend": tr.Name, "flow_unit": unit, "interval": tr.Interval.String(),
			"coverage": tr.Coverage(), "report": tr.Report, "width": float64(b.Width) / per, "bins": binsJSON(b, per),
			"cube_error": b.CubeError, "warnings": trendWarningsJSON(tr.Warnings)})
	}
	out := opts.IO.Out
	fmt.Fprintf(out, "Trend: %s, %d points at %s intervals, %s to %s\n", tr.Name, len(tr.Points), tr.Interval,
		tr.Start.Format("2006-01-02 15:04"), tr.End.Format("2006-01-02 15:04"))
	fmt.Fprintf(out, "Coverage: %.0f h of a %.0f h span (%.1f %%)\n", tr.Hours, tr.Span, 100*tr.Coverage())
	fmt.Fprintf(out, "Rows: %s\n", strings.TrimSpace(tr.Report.Summary()))
	for _, w := range tr.Warnings {
		if strings.Contains(w.Message, tr.Report.Summary()) {
			continue // the Rows line above says it
		}
		fmt.Fprintln(out, "Note: "+w.String())
	}
	heading(out, fmt.Sprintf("Flow histogram (bins of %.4g %s)", float64(b.Width)/per, unit))
	t := newTable(out)
	t.row("flow ("+unit+")", "mean flow ("+unit+")", "hours (h)", "share (%)", "points", "mean power (kW)", "")
	maxH := 0.0
	for _, fb := range b.Bins {
		maxH = max(maxH, fb.Hours)
	}
	for _, fb := range b.Bins {
		kw := "—"
		if fb.PowerHours > 0 {
			kw = fmt.Sprintf("%.2f", float64(fb.Power)/1000)
		}
		bar := strings.Repeat("█", int(0.5+30*fb.Hours/maxH))
		t.row(fmt.Sprintf("%.0f–%.0f", float64(fb.Low)/per, float64(fb.High)/per), fmt.Sprintf("%.1f", float64(fb.MeanFlow)/per),
			fmt.Sprintf("%.0f", fb.Hours), fmt.Sprintf("%.1f", 100*fb.Hours/b.Hours), fmt.Sprint(fb.Count), kw, bar+strings.Repeat(" ", 30-len([]rune(bar))))
	}
	t.flush()
	fmt.Fprintf(out, "Binning error estimate: %.2f %% of annual energy on a cube law (evaluating each bin at its centre)\n", 100*b.CubeError)
	return nil
}

// maxBinsOfWidth bounds --width from below: at most this many bins up to
// the trend's highest flow.
const maxBinsOfWidth = 1000

// binWidthArg reads --width: a flow in the trend's unit, a flow with a unit
// suffix, or (with --plant) a percentage of design flow; from the highest
// flow / maxBinsOfWidth to the highest flow.
func binWidthArg(s string, tr *profile.Trend, unit string, per float64, design curves.Flow) (curves.Flow, error) {
	f, err := parseFlowArg("width", s)
	if err != nil {
		return 0, err
	}
	var w curves.Flow
	switch f.Unit {
	case "":
		w = curves.Flow(f.Value * per)
	case "%":
		if design == 0 {
			return 0, usageError{fmt.Errorf("--width %s: a percentage needs the design flow: give --plant, or a flow in %s", s, unit)}
		}
		w = f.SI(curves.SI, design)
	default:
		w = f.SI(curves.SI, 0)
	}
	hi := 0.0
	for _, p := range tr.Points {
		hi = max(hi, float64(p.Flow))
	}
	if hi > 0 && (float64(w) < hi/maxBinsOfWidth || float64(w) > hi) {
		return 0, usageError{fmt.Errorf("--width %s: give a width from %.4g to %.4g %s (at most %d bins, at least one, up to the trend's highest flow %.4g %s)",
			s, hi/maxBinsOfWidth/per, hi/per, unit, maxBinsOfWidth, hi/per, unit)}
	}
	return w, nil
}

// flowUnitOf returns the display name and SI factor of a trend flow unit.
func flowUnitOf(u string) (string, float64) {
	switch strings.ToLower(u) {
	case "gpm":
		return "gpm", curves.GPM
	case "l/s":
		return "L/s", curves.LPerS
	}
	return "m³/h", curves.M3PerH
}

// niceWidth picks a round bin width giving about 20 bins up to the largest flow.
func niceWidth(tr *profile.Trend, per float64) curves.Flow {
	hi := 0.0
	for _, p := range tr.Points {
		hi = max(hi, float64(p.Flow)/per)
	}
	if hi <= 0 {
		return curves.Flow(per)
	}
	raw := hi / 20
	steps := []float64{1, 2, 2.5, 5, 10}
	mag := 1.0
	for mag*10 <= raw {
		mag *= 10
	}
	for mag > raw {
		mag /= 10
	}
	w := mag
	for _, s := range steps {
		if s*mag >= raw {
			w = s * mag
			break
		}
	}
	return curves.Flow(w * per)
}

func binsJSON(b *profile.Binned, per float64) []map[string]float64 {
	var out []map[string]float64
	for _, fb := range b.Bins {
		out = append(out, map[string]float64{"low": float64(fb.Low) / per, "high": float64(fb.High) / per,
			"mean_flow": float64(fb.MeanFlow) / per, "hours": fb.Hours, "points": float64(fb.Count),
			"mean_power_kw": float64(fb.Power) / 1000, "power_hours": fb.PowerHours})
	}
	return out
}
