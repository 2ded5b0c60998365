package cmd

import (
	"fmt"
	"io"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
	"wattstage/study"
)

// npshOut writes an NPSH in display units with two decimals: margins are
// small differences of a few metres or feet.
func npshOut(u curves.UnitSystem, h curves.Head) string { return fmt.Sprintf("%.2f", u.HeadOut(h)) }

// writeNPSHCheck writes the plan's NPSH check: the basis, each strategy's
// unit-hours short of the margin, and the lowest-power staging's short
// points.
func writeNPSHCheck(out io.Writer, r *study.Result) {
	c := r.NPSH
	if c == nil {
		return
	}
	if !c.Made {
		fmt.Fprintf(out, "- NPSH: not made: %s; confirm the NPSH margin with the pump manufacturer\n", c.Note)
		return
	}
	u, f := r.Plant.Units, r.Period.Factor
	fmt.Fprintf(out, "- NPSH: %s %s available at design flow; the check asks NPSHa ≥ %s × NPSHr at every point (NPSHr scaled by speed²)\n",
		npshOut(u, c.DesignAvailable), u.HeadUnit(), fmtMargin(c.Margin))
	fmt.Fprintf(out, "  suction: %s\n", c.Note)
	for _, s := range c.Strategies {
		if s.Key != study.KeyLowest && s.Short == 0 {
			continue
		}
		ratio := "—"
		if s.UnitHours > 0 {
			ratio = fmt.Sprintf("%.2f", s.LowestRatio)
		}
		if s.Short == 0 {
			fmt.Fprintf(out, "  %s: every point meets the margin (lowest NPSHa/NPSHr %s over %s unit-hours/yr)\n", s.Name, ratio, study.Grouped(s.UnitHours*f))
		} else {
			fmt.Fprintf(out, "  %s: %s of %s unit-hours/yr below the margin, %s below NPSHr itself (lowest NPSHa/NPSHr %s)\n",
				s.Name, study.Grouped(s.Short*f), study.Grouped(s.UnitHours*f), study.Grouped(s.Below*f), ratio)
		}
		if s.Extrapolated > 0 {
			fmt.Fprintf(out, "  %s: %s unit-hours/yr past the last NPSHr datasheet point (NPSHr extrapolated)\n", s.Name, study.Grouped(s.Extrapolated*f))
		}
	}
	if len(c.Unchecked) > 0 {
		fmt.Fprintf(out, "  not checked (no NPSHr points): %v\n", c.Unchecked)
	}
	if len(c.Short) == 0 {
		return
	}
	fmt.Fprintln(out, "  Points of the lowest-power staging below the margin, worst first:")
	t := newTable(out)
	h := u.HeadUnit()
	t.row("  load flow ("+u.FlowUnit()+")", "model", "units", "speed (%)", "unit flow ("+u.FlowUnit()+")", "NPSHa ("+h+")", "NPSHr ("+h+")",
		"NPSHa/NPSHr", "h/yr")
	for _, p := range c.Short {
		mark := ""
		if p.Extrapolated {
			mark = " (extrapolated)"
		}
		t.row("  "+flowOut(u, p.Flow), r.Plant.Models[p.Model].Name, fmt.Sprint(p.Units), pct(p.Speed), flowOut(u, p.UnitFlow),
			npshOut(u, p.Available), npshOut(u, p.Required)+mark, fmt.Sprintf("%.2f", p.Ratio), study.Grouped(p.Hours*f))
	}
	t.flush()
}

// writeNPSHPoint writes the NPSH of each running unit of one solved state.
func writeNPSHPoint(out io.Writer, p *plant.Plant, r optimize.Result) {
	if r.Status != optimize.Served {
		return
	}
	heading(out, "NPSH")
	units := study.NPSHAt(p, p.Models, r)
	switch {
	case p.Suction == nil:
		fmt.Fprintln(out, "Not checked: the plant file gives no suction conditions (suction:); confirm the NPSH margin with the pump manufacturer.")
		return
	case len(units) == 0:
		fmt.Fprintln(out, "Not checked: no running unit's model has NPSHr points (pumps[].npshr); confirm the NPSH margin with the pump manufacturer.")
		return
	}
	u := p.Units
	h := u.HeadUnit()
	fmt.Fprintf(out, "Suction: %s\n", p.Suction.Basis)
	fmt.Fprintf(out, "%s %s available with %s through the suction; the check asks NPSHa ≥ %s × NPSHr\n",
		npshOut(u, units[0].Available), h, u.FormatFlow(r.PumpedFlow), fmtMargin(p.Suction.Margin))
	t := newTable(out)
	t.row("unit", "model", "speed (%)", "flow ("+u.FlowUnit()+")", "NPSHa ("+h+")", "NPSHr ("+h+")", "NPSHa/NPSHr", "verdict")
	for i, un := range r.Units {
		var n *study.NPSHUnit
		for j := range units {
			if units[j].Model == un.Model && units[j].Speed == un.Speed && units[j].Flow == un.Flow {
				n = &units[j]
				break
			}
		}
		if n == nil {
			t.row(fmt.Sprint(i+1), p.Models[un.Model].Name, pct(un.Speed), flowOut(u, un.Flow), "—", "—", "—", "no NPSHr points")
			continue
		}
		verdict := "meets the margin"
		switch {
		case n.Ratio < 1:
			verdict = "BELOW NPSHr: cavitation expected"
		case n.Short:
			verdict = "below the margin"
		}
		if n.Extrapolated {
			verdict += " (NPSHr extrapolated)"
		}
		t.row(fmt.Sprint(i+1), p.Models[un.Model].Name, pct(un.Speed), flowOut(u, un.Flow), npshOut(u, n.Available), npshOut(u, n.Required),
			fmt.Sprintf("%.2f", n.Ratio), verdict)
	}
	t.flush()
}

// fmtMargin writes a margin ratio with the decimals it needs.
func fmtMargin(v float64) string { return fmt.Sprintf("%g", v) }

// writeSuction writes what the NPSH check will use, where the file gives
// any of it: the suction conditions and each model's NPSHr points.
func writeSuction(out io.Writer, p *plant.Plant) {
	var with []string
	for _, m := range p.Models {
		if m.NPSHr != nil {
			pts := m.NPSHr.Points
			with = append(with, fmt.Sprintf("%s: %d NPSHr points, %s at %s to %s at %s", m.Name, len(pts),
				p.Units.FormatHead(pts[0].NPSHr), p.Units.FormatFlow(pts[0].Flow), p.Units.FormatHead(pts[len(pts)-1].NPSHr), p.Units.FormatFlow(pts[len(pts)-1].Flow)))
		}
	}
	if p.Suction == nil && len(with) == 0 {
		return
	}
	heading(out, "Suction (for the NPSH check)")
	if s := p.Suction; s != nil {
		fmt.Fprintf(out, "%s\n%s %s available at design flow; margin NPSHa ≥ %s × NPSHr\n", s.Basis,
			npshOut(p.Units, s.Available(p.DesignFlow)), p.Units.HeadUnit(), fmtMargin(s.Margin))
	} else {
		fmt.Fprintln(out, "No suction section: the NPSH check will not be made")
	}
	for _, w := range with {
		fmt.Fprintln(out, w)
	}
}
