package cmd

import (
	"fmt"
	"io"
	"math"
	"slices"
	"strings"

	"github.com/spf13/cobra"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
)

// PointOptions are the inputs of `wattstage point`.
type PointOptions struct {
	IO          *IO
	PlantPath   string
	Flow        string // a flow in the plant's units, or "NN%" of design flow
	Units       int    // fixed number of equal-speed running units; 0 = optimise
	CommonSpeed bool
	JSON        bool
}

// NewCmdPoint builds `wattstage point`.
func NewCmdPoint(streams *IO, runF func(*PointOptions) error) *cobra.Command {
	opts := &PointOptions{IO: streams}
	c := &cobra.Command{
		Use:   "point PLANT.yaml --flow Q",
		Short: "What the plant draws at one flow, and the best way to run it",
		Long: `For one flow through the load, print the head the system needs and the
lowest-power way to serve it: which units run, at what speed, with pump, motor
and drive efficiency, shaft and electrical power per unit, wire-to-water
efficiency and the limit each unit sits on. A table of the best state for each
possible number of running units shows why that count wins.

With --units N the answer is instead N running units at one common speed.`,
		Example: `  wattstage point examples/chilled-water.yaml --flow 1800
  wattstage point examples/chilled-water.yaml --flow 114L/s
  wattstage point examples/chilled-water.yaml --flow 60% --units 3
  wattstage point examples/condenser-water.yaml --flow 450 --json`,
		Args: cobra.ExactArgs(1),
		RunE: func(c *cobra.Command, args []string) error {
			opts.PlantPath = args[0]
			if opts.Flow == "" {
				return usageError{fmt.Errorf("--flow is required")}
			}
			if _, err := parseFlowArg("flow", opts.Flow); err != nil {
				return err
			}
			if c.Flags().Changed("units") && opts.Units < 1 {
				return usageError{fmt.Errorf("--units %d: give the number of running units, 1 or more (leave the flag out to optimise)", opts.Units)}
			}
			if runF != nil {
				return runF(opts)
			}
			return pointRun(opts)
		},
	}
	c.Flags().StringVar(&opts.Flow, "flow", "", "flow through the load: in the plant's flow unit (1800), with a unit (1800gpm, 410m3/h, 114L/s) or in % of design flow (60%); above 0 and at most 500 % of design flow")
	c.Flags().IntVar(&opts.Units, "units", 0, "run exactly this many units (1 to the units installed) at one common speed instead of optimising")
	c.Flags().BoolVar(&opts.CommonSpeed, "common-speed", false, "give every running variable-speed unit the same speed")
	c.Flags().BoolVar(&opts.JSON, "json", false, "write the result as JSON")
	return c
}

// maxPointFlow is the largest --flow, as a fraction of design flow: well
// past any plant's capacity, so a larger value is a typing mistake.
const maxPointFlow = 5

func pointRun(opts *PointOptions) error {
	p, err := loadPlant(opts.PlantPath)
	if err != nil {
		return err
	}
	q, err := flowRange("flow", opts.Flow, p.Units, p.DesignFlow, 0, maxPointFlow, "the design flow")
	if err != nil {
		return err
	}
	installed := 0
	for _, m := range p.Models {
		installed += m.Count
	}
	if opts.Units < 0 || opts.Units > installed {
		return badInputf("--units %d: give 1 to %d, the units the plant has installed", opts.Units, installed)
	}
	var best, common optimize.Result
	var byCount []optimize.Result
	if opts.Units > 0 {
		s := optimize.New(p, optimize.Options{CommonSpeed: true})
		best = s.SolveWith(q, optimize.Constraint{Total: opts.Units})
	} else {
		s := optimize.New(p, optimize.Options{CommonSpeed: opts.CommonSpeed})
		best = s.Solve(q)
		byCount = s.ByCount(q)
		if !opts.CommonSpeed && best.Status == optimize.Served {
			// The same units at one common speed, to show what unequal speeds save.
			common = optimize.New(p, optimize.Options{CommonSpeed: true}).SolveWith(q, optimize.Constraint{Counts: best.Counts})
		}
	}
	if opts.JSON {
		return writeJSON(opts.IO.Out, pointJSON(p, best, byCount))
	}
	writePoint(opts.IO.Out, p, best, byCount, opts.Units > 0)
	writeNPSHPoint(opts.IO.Out, p, best)
	writeCommonComparison(opts.IO.Out, p, best, common)
	writeCautions(opts.IO.Out)
	return nil
}

func writePoint(out io.Writer, p *plant.Plant, r optimize.Result, byCount []optimize.Result, fixed bool) {
	u := p.Units
	fmt.Fprintf(out, "Plant: %s\n", p.Name)
	fmt.Fprintf(out, "Load flow %s (%.0f %% of design); the system needs %s\n",
		u.FormatFlow(r.LoadFlow), 100*float64(r.LoadFlow/p.DesignFlow), u.FormatHead(r.RequiredHead))
	if r.BypassFlow > 0 {
		fmt.Fprintf(out, "Pumped flow %s including %s through the minimum-flow bypass\n", u.FormatFlow(r.PumpedFlow), u.FormatFlow(r.BypassFlow))
	}
	title := "Lowest-power state"
	if fixed {
		title = fmt.Sprintf("%d units at one common speed", r.Running())
	}
	heading(out, title)
	if r.Status != optimize.Served {
		fmt.Fprintf(out, "Cannot serve this load: %s\n", r.Reason)
	} else {
		writeUnits(out, p, r)
	}
	if len(byCount) > 0 {
		heading(out, "Best state for each number of running units")
		t := newTable(out)
		t.row("running", "combination", "speeds (%)", "header head ("+u.HeadUnit()+")", "power (kW)", "vs best (%)", "status")
		for n, c := range byCount {
			if c.Status != optimize.Served {
				t.row(fmt.Sprint(n+1), "—", "—", "—", "—", "—", shortReason(c))
				continue
			}
			mark := ""
			if slices.Equal(c.Counts, r.Counts) {
				mark = " ← best"
			}
			t.row(fmt.Sprint(n+1), optimize.DescribeCounts(p, c.Counts), speedList(c), headOut(u, c.HeaderHead), kw(c.Power),
				fmt.Sprintf("%+.1f", 100*(float64(c.Power/r.Power)-1)), "served"+mark)
		}
		t.flush()
	}
	if len(r.Warnings) > 0 {
		heading(out, "Notes")
		for _, w := range r.Warnings {
			fmt.Fprintln(out, "- "+w)
		}
	}
}

// writeCommonComparison says what running the same units at one common
// speed would draw, so the value of unequal speeds is visible.
func writeCommonComparison(out io.Writer, p *plant.Plant, best, common optimize.Result) {
	if best.Status != optimize.Served || common.Counts == nil {
		return
	}
	heading(out, "Unequal against equal speeds")
	if common.Status != optimize.Served {
		fmt.Fprintf(out, "The same units cannot serve this flow at one common speed (%s); unequal speeds are needed.\n", common.Reason)
		return
	}
	d := float64(common.Power - best.Power)
	rel := d / float64(best.Power)
	switch {
	case rel > 1e-4:
		fmt.Fprintf(out, "The same units at one common speed (%s %%) would draw %s kW, %.2f kW (%.2f %%) more: unequal speeds pay here.\n",
			speedList(common), kw(common.Power), d/1000, 100*rel)
	default:
		fmt.Fprintf(out, "The same units at one common speed (%s %%) draw %s kW, within %.3f %% of the best: no unequal split of speeds saves anything worth having at this flow.\n",
			speedList(common), kw(common.Power), 100*math.Abs(rel))
	}
}

func writeUnits(out io.Writer, p *plant.Plant, r optimize.Result) {
	u := p.Units
	t := newTable(out)
	t.row("unit", "model", "speed (%)", "flow ("+u.FlowUnit()+")", "head ("+u.HeadUnit()+")", "pump eff (%)", "motor eff (%)",
		"drive eff (%)", "motor load (%)", "shaft (kW)", "input (kW)", "limit", "region")
	for i, un := range r.Units {
		region := "preferred"
		if !un.Preferred {
			region = "outside preferred"
		}
		lim := string(un.Limit)
		if lim == "" {
			lim = "—"
		}
		t.row(fmt.Sprint(i+1), p.Models[un.Model].Name, pct(un.Speed), flowOut(u, un.Flow), headOut(u, un.Head), pct(un.PumpEff),
			pct(un.MotorEff), pct(un.DriveEff), pct(un.Load), kw(un.Shaft), kw(un.Electrical), lim, region)
	}
	t.flush()
	fmt.Fprintf(out, "Total input %s kW; hydraulic %s kW at the header; wire-to-water %.1f %% (useful flow × required head over input)\n",
		kw(r.Power), kw(r.Hydraulic), 100*r.WireToWater(p.Fluid.Density))
	if r.Limit != optimize.LimitNone {
		fmt.Fprintf(out, "Binding limit: %s\n", r.Limit)
	}
}

func shortReason(r optimize.Result) string {
	if r.Limit == optimize.LimitCapacity {
		return "too little capacity"
	}
	if r.Limit == optimize.LimitGap {
		return "breaks a unit limit"
	}
	return string(r.Limit)
}

func speedList(r optimize.Result) string {
	seen := []string{}
	for _, un := range r.Units {
		s := fmt.Sprintf("%.0f", 100*un.Speed)
		if len(seen) == 0 || seen[len(seen)-1] != s {
			seen = append(seen, s)
		}
	}
	return strings.Join(seen, "/")
}

// pointReport is the JSON form of a point.
type pointReport struct {
	Plant        string            `json:"plant"`
	Units        map[string]string `json:"units"`
	LoadFlow     float64           `json:"load_flow"`
	PumpedFlow   float64           `json:"pumped_flow"`
	RequiredHead float64           `json:"required_head"`
	HeaderHead   float64           `json:"header_head"`
	Status       string            `json:"status"`
	Reason       string            `json:"reason,omitempty"`
	Limit        string            `json:"limit,omitempty"`
	Shortfall    float64           `json:"shortfall,omitempty"`
	PowerKW      float64           `json:"power_kw"`
	WireToWater  float64           `json:"wire_to_water"`
	Running      []unitReport      `json:"running"`
	Warnings     []string          `json:"warnings,omitempty"`
	ByCount      []countReport     `json:"by_count,omitempty"`
}

type unitReport struct {
	Model     string  `json:"model"`
	Speed     float64 `json:"speed_fraction"`
	Flow      float64 `json:"flow"`
	Head      float64 `json:"head"`
	PumpEff   float64 `json:"pump_eff"`
	MotorEff  float64 `json:"motor_eff"`
	DriveEff  float64 `json:"drive_eff"`
	MotorLoad float64 `json:"motor_load"`
	ShaftKW   float64 `json:"shaft_kw"`
	InputKW   float64 `json:"input_kw"`
	Limit     string  `json:"limit,omitempty"`
	Preferred bool    `json:"preferred_region"`
}

type countReport struct {
	Running int     `json:"running"`
	Status  string  `json:"status"`
	Counts  []int   `json:"counts"`
	PowerKW float64 `json:"power_kw,omitempty"`
	Reason  string  `json:"reason,omitempty"`
}

func pointJSON(p *plant.Plant, r optimize.Result, byCount []optimize.Result) pointReport {
	u := p.Units
	rep := pointReport{Plant: p.Name,
		Units:    map[string]string{"flow": u.FlowUnit(), "head": u.HeadUnit(), "power": "kW"},
		LoadFlow: u.FlowOut(r.LoadFlow), PumpedFlow: u.FlowOut(r.PumpedFlow),
		RequiredHead: u.HeadOut(r.RequiredHead), HeaderHead: u.HeadOut(r.HeaderHead),
		Status: r.Status.String(), Reason: r.Reason, Limit: string(r.Limit), Shortfall: u.FlowOut(r.Shortfall),
		PowerKW: float64(r.Power) / curves.KW, WireToWater: r.WireToWater(p.Fluid.Density), Warnings: r.Warnings}
	for _, un := range r.Units {
		rep.Running = append(rep.Running, unitReport{Model: p.Models[un.Model].Name, Speed: un.Speed,
			Flow: u.FlowOut(un.Flow), Head: u.HeadOut(un.Head), PumpEff: un.PumpEff, MotorEff: un.MotorEff,
			DriveEff: un.DriveEff, MotorLoad: un.Load, ShaftKW: float64(un.Shaft) / curves.KW,
			InputKW: float64(un.Electrical) / curves.KW, Limit: string(un.Limit), Preferred: un.Preferred})
	}
	for n, c := range byCount {
		rep.ByCount = append(rep.ByCount, countReport{Running: n + 1, Status: c.Status.String(), Counts: c.Counts,
			PowerKW: float64(c.Power) / curves.KW, Reason: c.Reason})
	}
	return rep
}
