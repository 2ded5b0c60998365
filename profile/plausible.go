package profile

import (
	"fmt"
	"math"
	"slices"

	"wattstage/curves"
)

// Expect is what a plant says its trend's flows should look like.
type Expect struct {
	DesignFlow curves.Flow // the plant's design flow, m³/s; 0 skips the checks that need it
	Capacity   curves.Flow // the most every unit together can move (runout at maximum speed), m³/s; 0 = unknown
	MinFlow    curves.Flow // the plant minimum flow held by a bypass, m³/s; 0 = none
	// Format writes a flow for a message in the plant's unit; nil writes m³/h.
	Format func(curves.Flow) string
}

// Limits of the plausibility checks, rules of our own (common practice:
// a plant's logged flow sits between a few per cent of design and its
// pumps' capacity). A median beyond them is almost always a unit slip —
// L/s, gal/h or m³/h read as gpm differ by factors of 4 to 60 — or the
// wrong column.
const (
	// a median flow above this many times the capacity is refused
	implausiblyHigh = 1.5
	// a median flow below this fraction of the design flow is refused
	implausiblyLow = 0.01
	// the 99th percentile above this many times the capacity is warned of
	aboveCapacity = 1.05
	// a median flow below this fraction of the design flow is warned of
	suspiciouslyLow = 0.1
	// a share of zero-flow intervals above this is warned of
	mostlyOff = 0.5
)

// Plausible checks the trend's flows against the plant: every flow zero,
// a median flow many times what the pumps can move or a tiny fraction of
// the design flow (refused, with the unit that would fit named when one
// does), the top flows above the pumps' capacity, every flow below the
// plant minimum flow (so that every interval would be "served" by the
// bypass), and a log that is mostly zero flow (warned of, appended to
// t.Warnings). A refusal is a *ParseError wrapping ErrImplausible.
func (t *Trend) Plausible(e Expect) error {
	fmtQ := e.Format
	if fmtQ == nil {
		fmtQ = func(q curves.Flow) string { return fmt.Sprintf("%.4g m³/h", float64(q)/curves.M3PerH) }
	}
	warn := func(format string, a ...any) {
		t.Warnings = append(t.Warnings, Warning{File: t.Name, Message: fmt.Sprintf(format, a...)})
	}
	refuse := func(format string, a ...any) error {
		return &ParseError{File: t.Name, Field: t.Spec.FlowColumn, Err: fmt.Errorf("%w: "+format, append([]any{ErrImplausible}, a...)...)}
	}
	var pos []float64
	var hours, zeroHours float64
	for _, p := range t.Points {
		hours += p.Hours
		if p.Flow > 0 {
			pos = append(pos, float64(p.Flow))
		} else {
			zeroHours += p.Hours
		}
	}
	col := fmt.Sprintf("column %q (read in %s)", t.Spec.FlowColumn, t.Spec.FlowUnit)
	if len(pos) == 0 {
		return refuse("every flow in %s is zero: the plant never ran in this log, or the column is not the plant flow", col)
	}
	slices.Sort(pos)
	median := curves.Flow(pos[len(pos)/2])
	p99 := curves.Flow(pos[int(math.Ceil(0.99*float64(len(pos))))-1])
	switch {
	case e.Capacity > 0 && median > implausiblyHigh*e.Capacity:
		return refuse("the median running flow in %s is %s, %.3g times the %s every unit together can move: check the flow unit%s",
			col, fmtQ(median), float64(median/e.Capacity), fmtQ(e.Capacity), t.unitHint(median, e))
	case e.DesignFlow > 0 && median < implausiblyLow*e.DesignFlow:
		return refuse("the median running flow in %s is %s, %.2g %% of the design flow %s: check the flow unit and the column%s",
			col, fmtQ(median), 100*float64(median/e.DesignFlow), fmtQ(e.DesignFlow), t.unitHint(median, e))
	}
	if e.DesignFlow > 0 && median < suspiciouslyLow*e.DesignFlow {
		warn("the median running flow in %s is %s, only %.2g %% of the design flow %s: check the flow unit%s",
			col, fmtQ(median), 100*float64(median/e.DesignFlow), fmtQ(e.DesignFlow), t.unitHint(median, e))
	}
	if e.Capacity > 0 && p99 > aboveCapacity*e.Capacity {
		warn("the top 1 %% of running flows in %s reach %s, above the %s every unit together can move: check the flow unit and the meter", col, fmtQ(p99), fmtQ(e.Capacity))
	}
	if e.MinFlow > 0 && p99 < e.MinFlow {
		warn("99 %% of the running flows in %s are below the plant minimum flow %s: nearly every interval would be served by the bypass, hiding the pumps' own load — check the flow unit", col, fmtQ(e.MinFlow))
	}
	if hours > 0 && zeroHours/hours > mostlyOff {
		warn("%.0f %% of the logged hours have zero flow in %s: the plant was mostly off, or the meter was not reading", 100*zeroHours/hours, col)
	}
	return nil
}

// unitHint names a flow unit under which the median would sit between 20
// and 100 % of the design flow, when there is one: " (if the column is in
// L/s, set flow_unit: L/s)".
func (t *Trend) unitHint(median curves.Flow, e Expect) string {
	if e.DesignFlow <= 0 {
		return ""
	}
	raw := float64(median) / flowUnits[unitKey(t.Spec.FlowUnit)]
	for _, u := range []struct{ name, key string }{{"gpm", "gpm"}, {"m3/h", "m3/h"}, {"L/s", "l/s"}, {"gal/h", ""}, {"L/min", ""}, {"L/h", ""}} {
		mul := flowUnits[u.key]
		switch u.name {
		case "gal/h":
			mul = curves.GPM / 60
		case "L/min":
			mul = curves.LPerS / 60
		case "L/h":
			mul = curves.LPerS / 3600
		}
		if unitKey(u.name) == unitKey(t.Spec.FlowUnit) {
			continue
		}
		if r := raw * mul / float64(e.DesignFlow); r >= 0.2 && r <= 1 {
			if u.key == "" {
				return fmt.Sprintf(" (the numbers would fit in %s, which is not read: convert the column to gpm, m3/h or L/s)", u.name)
			}
			return fmt.Sprintf(" (the numbers would fit in %s: if the column is in %s, set flow_unit: %s)", u.name, u.name, u.name)
		}
	}
	return ""
}
