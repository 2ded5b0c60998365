package cmd

import (
	"fmt"
	"io"
	"math"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"

	"wattstage/curves"
	"wattstage/plant"
	"wattstage/profile"
)

// CheckOptions are the inputs of `wattstage check`.
type CheckOptions struct {
	IO        *IO
	PlantPath string
}

// NewCmdCheck builds `wattstage check`. runF replaces the run function in
// tests of flag parsing.
func NewCmdCheck(streams *IO, runF func(*CheckOptions) error) *cobra.Command {
	opts := &CheckOptions{IO: streams}
	c := &cobra.Command{
		Use:   "check PLANT.yaml",
		Short: "Validate a plant file and show what was understood",
		Long: `Validate a plant file and print what wattstage understood from it: the pump
models with their fitted head and efficiency curves (coefficients and fit
residuals), the best efficiency point of each model, motors, drives, the
system curve, the load profile, the tariff, every default filled in, and
every warning (what is usable but questionable) with the file, line and
field it is about. A trend-log profile is read, so its warnings show too.`,
		Example: `  wattstage check examples/chilled-water.yaml
  wattstage check examples/condenser-water.yaml`,
		Args: cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			opts.PlantPath = args[0]
			if runF != nil {
				return runF(opts)
			}
			return checkRun(opts)
		},
	}
	return c
}

func checkRun(opts *CheckOptions) error {
	p, err := loadPlant(opts.PlantPath)
	if err != nil {
		return err
	}
	var tr *profile.Trend
	if p.Profile.Trend != nil {
		if tr, err = readPlantTrend(p); err != nil {
			return err
		}
	}
	writePlant(opts.IO.Out, p)
	writeWarnings(opts.IO.Out, p, tr)
	return nil
}

// readPlantTrend reads the trend log of a plant whose profile is one, as
// plan does: a relative path is taken from the plant file's folder.
func readPlantTrend(p *plant.Plant) (*profile.Trend, error) {
	spec := *p.Profile.Trend
	if !filepath.IsAbs(spec.Path) {
		spec.Path = filepath.Join(filepath.Dir(p.Source), spec.Path)
	}
	tr, err := profile.ReadTrendFile(spec, spec.Path)
	if err != nil {
		return nil, badInput(err)
	}
	if err := tr.Plausible(p.TrendExpect()); err != nil {
		return nil, badInput(err)
	}
	return tr, nil
}

// writeWarnings lists the plant's warnings, then the trend reader's (tr
// may be nil), each as origin: message.
func writeWarnings(out io.Writer, p *plant.Plant, tr *profile.Trend) {
	var lines []string
	for _, w := range p.Warnings {
		lines = append(lines, w.String())
	}
	if tr != nil {
		for _, w := range tr.Warnings {
			lines = append(lines, w.String())
		}
	}
	if len(lines) == 0 {
		return
	}
	heading(out, "Warnings")
	for _, l := range lines {
		fmt.Fprintln(out, "- "+l)
	}
}

// writePlant prints the plant as understood.
func writePlant(out io.Writer, p *plant.Plant) {
	u := p.Units
	fmt.Fprintf(out, "Plant: %s  (%s, units %s)\n", p.Name, p.Source, u)
	fl := p.Fluid
	if math.IsNaN(fl.Temperature) {
		fmt.Fprintf(out, "Fluid: specific gravity %.3f, density %.1f kg/m³\n", fl.SG, fl.Density)
	} else {
		fmt.Fprintf(out, "Fluid: water at %.1f %s, density %.2f kg/m³ (Kell 1975), specific gravity %.4f\n",
			u.TempOut(fl.Temperature), u.TempUnit(), fl.Density, fl.SG)
	}
	fmt.Fprintf(out, "System: %s; design %s at %s", p.System.Describe(), u.FormatFlow(p.DesignFlow), u.FormatHead(p.DesignHead))
	switch s := p.System.(type) {
	case curves.DPControl:
		fmt.Fprintf(out, "; control head %s", u.FormatHead(s.ControlHead))
		if s.Reset != nil {
			fmt.Fprintf(out, ", reset to %s at %s and below, full setpoint from %s",
				u.FormatHead(s.Reset.LowHead), u.FormatFlow(s.Reset.LowFlow), u.FormatFlow(s.Reset.HighFlow))
		}
	case curves.FixedCurve:
		fmt.Fprintf(out, "; static head %s", u.FormatHead(s.Static))
	}
	fmt.Fprintln(out)
	if p.MinFlow > 0 {
		fmt.Fprintf(out, "Plant minimum flow (bypass): %s\n", u.FormatFlow(p.MinFlow))
	}

	heading(out, "Pump models")
	t := newTable(out)
	t.row("model", "units", "rated speed (rpm)", "speed range (%)", "BEP flow ("+u.FlowUnit()+")", "BEP head ("+u.HeadUnit()+")",
		"BEP eff (%)", "shutoff ("+u.HeadUnit()+")", "min flow ("+u.FlowUnit()+")", "runout ("+u.FlowUnit()+")")
	for _, m := range p.Models {
		t.row(m.Name, fmt.Sprint(m.Count), num(m.RatedSpeed, 0), fmt.Sprintf("%.0f–%.0f", 100*m.MinSpeed, 100*m.MaxSpeed),
			flowOut(u, m.Pump.BEPFlow), headOut(u, m.Pump.BEPHead), pct(m.Pump.BEPEff), headOut(u, m.Pump.ShutoffHead()),
			flowOut(u, m.MinFlow), flowOut(u, m.Runout))
	}
	t.flush()

	heading(out, "Fitted curves (rated speed; Q in "+u.FlowUnit()+")")
	for _, m := range p.Models {
		hp, ep := m.Pump.HeadPoly(), m.Pump.EffPoly()
		hc := displayCoeffs(hp, float64(u.FlowIn(1)), float64(u.HeadIn(1)))
		ec := displayCoeffs(ep, float64(u.FlowIn(1)), 0.01)
		fmt.Fprintf(out, "%s\n  head  H(Q) = %s %s   fit residual RMS %.2f %s, max %.2f %s\n", m.Name,
			polyString(hc, 0), u.HeadUnit(),
			u.HeadOut(curves.Head(m.Pump.HeadFit.RMS)), u.HeadUnit(), u.HeadOut(curves.Head(m.Pump.HeadFit.MaxAbs)), u.HeadUnit())
		fmt.Fprintf(out, "  eff   η(Q) = %s %%   fit residual RMS %.2f points, max %.2f points\n",
			polyString(ec, ep.Lowest), 100*m.Pump.EffFit.RMS, 100*m.Pump.EffFit.MaxAbs)
		t := newTable(out)
		t.row("  point", "flow ("+u.FlowUnit()+")", "head ("+u.HeadUnit()+")", "fitted head", "eff (%)", "fitted eff (%)")
		for i, pt := range m.Pump.Points {
			t.row(fmt.Sprintf("  %d", i+1), flowOut(u, pt.Flow), headOut(u, pt.Head),
				headOut(u, m.Pump.Head(pt.Flow, 1)), pct(pt.Eff), pct(m.Pump.Eff(pt.Flow, 1)))
		}
		t.flush()
	}

	heading(out, "Motors and drives")
	t = newTable(out)
	t.row("model", "motor ("+u.PowerUnit()+")", "full-load eff (%)", "service factor", "part load", "drive")
	for _, m := range p.Models {
		part := "DOE loss factor"
		if m.Motor.Table != nil {
			part = "user table"
		}
		t.row(m.Name, num(u.RatingOut(m.Motor.Rated), 1), pct(m.Motor.FullLoadEff), num(m.Motor.SF(), 2), part, m.Drive.Describe())
	}
	t.flush()

	writeSuction(out, p)

	heading(out, "Load profile")
	switch {
	case p.Profile.Trend != nil:
		fmt.Fprintf(out, "Trend log %s (flow column %q in %s)\n", p.Profile.Trend.Path, p.Profile.Trend.FlowColumn, p.Profile.Trend.FlowUnit)
	default:
		hours := 0.0
		for _, b := range p.Profile.Bins {
			hours += b.Hours
		}
		fmt.Fprintf(out, "%d bins, %.0f h/yr\n", len(p.Profile.Bins), hours)
	}
	heading(out, "Tariff")
	tf := p.Tariff
	fmt.Fprintf(out, "Energy %.4f %s/kWh", tf.EnergyPrice, tf.Currency)
	if len(tf.Periods) > 0 {
		fmt.Fprintf(out, " outside %d time-of-use periods", len(tf.Periods))
	}
	if tf.DemandCharge > 0 {
		fmt.Fprintf(out, "; demand %.2f %s/kW-month", tf.DemandCharge, tf.Currency)
	}
	if tf.EmissionsFactor > 0 {
		fmt.Fprintf(out, "; emissions %.3f kg CO₂e/kWh", tf.EmissionsFactor)
	}
	fmt.Fprintln(out)

	if len(p.Defaults) > 0 {
		heading(out, "Defaults filled in")
		for _, d := range p.Defaults {
			fmt.Fprintln(out, "- "+d)
		}
	}
}

// displayCoeffs converts a fitted polynomial in SI into coefficients for x
// in display units (xPer SI per display unit) and y in display units (yPer
// SI per display unit), lowest power first, starting at p.Lowest.
func displayCoeffs(p curves.Poly, xPer, yPer float64) []float64 {
	out := make([]float64, len(p.C))
	for k, c := range p.C {
		pow := float64(k + p.Lowest)
		out[k] = c * math.Pow(xPer/p.Scale, pow) / yPer
	}
	return out
}

func polyString(c []float64, lowest int) string {
	var b strings.Builder
	for k, v := range c {
		pow := k + lowest
		if k > 0 {
			if v < 0 {
				b.WriteString(" − ")
				v = -v
			} else {
				b.WriteString(" + ")
			}
		}
		b.WriteString(fmt.Sprintf("%.5g", v))
		switch pow {
		case 0:
		case 1:
			b.WriteString("·Q")
		default:
			b.WriteString(fmt.Sprintf("·Q%s", superscript(pow)))
		}
	}
	return b.String()
}

func superscript(n int) string {
	return map[int]string{2: "²", 3: "³", 4: "⁴"}[n]
}
