package study

import (
	"fmt"
	"slices"
	"strconv"
	"strings"
)

// Sources of warnings that do not come from a file position.
const (
	SourceProfile   = "profile"
	SourceTariff    = "tariff"
	SourceStudy     = "study"
	SourceSetpoints = "setpoints"
)

// warn adds a warning once.
func (r *Result) warn(source, format string, args ...any) {
	w := Warning{Source: source, Message: fmt.Sprintf(format, args...)}
	if !slices.Contains(r.Warnings, w) {
		r.Warnings = append(r.Warnings, w)
	}
}

// gatherWarnings collects the loader's, the trend reader's, the tariff's
// and the study's own warnings, in that order.
func (r *Result) gatherWarnings(in *Input) {
	p := r.Plant
	for _, w := range p.Warnings {
		r.warn(w.Origin(), "%s", w.Message)
	}
	if in.Trend != nil {
		for _, w := range in.Trend.Warnings {
			r.warn(w.Origin(), "%s", w.Message)
		}
	}
	if w := r.Period.warning(); w != "" {
		r.warn(SourceProfile, "%s", w)
	}
	for _, s := range r.Strategies {
		for _, w := range s.Bill.Warnings {
			r.warn(SourceTariff, "%s", w)
		}
	}
	if !r.Appraised {
		r.warn(SourceStudy, "the plant file has no retrofit section: savings are shown, but no investment, payback or NPV (add retrofit: with drive_cost and the other terms to appraise them)")
	}
	b := r.BaselineStrategy()
	if p.Sequence == nil && b.Key == KeyThrottled {
		r.warn(SourceStudy, "the plant file does not say how the plant runs today, so the baseline runs the fewest units that serve each flow at fixed speed: the lowest the baseline could be, so the savings are the least they could be (give sequence: running or bands to describe the units the operators run)")
	}
	for _, s := range r.Strategies {
		if s.Key != b.Key && s.Energy.HoursUnmet > b.Energy.HoursUnmet {
			r.warn(SourceStudy, "%s leaves %.0f h unmet (baseline %.0f h): its savings count energy it did not deliver",
				s.Name, s.Energy.HoursUnmet, b.Energy.HoursUnmet)
		}
		for _, l := range s.Energy.UnmetReasons() {
			r.warn(SourceStudy, "%s: %.0f h unmet (%s)", s.Name, s.Energy.UnmetBy[l], l)
		}
	}
	r.beatenNotes()
	for _, s := range r.Strategies {
		g, f := s.Regions, r.Period.Factor
		if g.Overspeed > 0 {
			r.warn(SourceStudy, "%s runs units above rated speed for %s unit-hours a year: confirm the pump, motor and coupling are rated for it", s.Name, Grouped(g.Overspeed*f))
		}
		if g.Overload > 0 {
			r.warn(SourceStudy, "%s runs motors above their rated output (into the service factor) for %s unit-hours a year: confirm with the motor manufacturer, and that the drive is sized for the current", s.Name, Grouped(g.Overload*f))
		}
	}
	if c := r.NPSH; c != nil && c.Made {
		for _, s := range c.Strategies {
			if s.Short > 0 {
				r.warn(SourceStudy, "%s runs units with NPSH available below %s × NPSHr for %s unit-hours a year (%s of them below NPSHr itself; lowest ratio %.2f): cavitation risk; raise the suction head or confirm the pump's NPSH3 and margin with its manufacturer",
					s.Name, fmtRatio(c.Margin), Grouped(s.Short*r.Period.Factor), Grouped(s.Below*r.Period.Factor), s.LowestRatio)
			}
		}
		if len(c.Unchecked) > 0 {
			r.warn(SourceStudy, "NPSH not checked for %s: the plant file gives no NPSHr points (pumps[].npshr)", joinNames(c.Unchecked))
		}
	}
	if r.SetpointsError != "" {
		r.warn(SourceSetpoints, "no staging setpoints derived: %s", r.SetpointsError)
	} else {
		for _, w := range r.Setpoints.Warnings {
			r.warn(SourceSetpoints, "%s", w)
		}
	}
	if c := r.Calibration; c != nil && !c.Calibrated() {
		r.warn(SourceStudy, "predicted power (%s) misses the logged power (NMBE %+.1f %%, CV(RMSE) %.1f %%, outside the ASHRAE Guideline 14 hourly criteria, from memory): calibrate the control head, curves or motor and drive data before relying on the savings",
			c.Strategy, 100*c.NMBE, 100*c.CVRMSE)
	}
}

// beatenNotes says where a strategy on other equipment (fewer drives)
// draws less than the lowest-power staging: near full speed a drive's own
// losses can exceed what speed control saves.
func (r *Result) beatenNotes() {
	lo := r.Strategy(KeyLowest)
	if lo == nil {
		return
	}
	var items []string
	for _, s := range r.Strategies {
		if s.Key == KeyLowest || s.Key == KeyBypassed || s.Drives >= lo.Drives {
			continue
		}
		hours, worst := s.beaten.hours, s.beaten.worst
		if hours > 0 {
			items = append(items, fmt.Sprintf("%s, %.0f h of the period, by up to %.1f %%", s.Name, hours, 100*worst))
		}
	}
	if len(items) == 0 {
		return
	}
	cure := "a drive bypass (drive_bypass: true) would recover it"
	if bp := r.Strategy(KeyBypassed); bp != nil {
		cure = fmt.Sprintf("with the drive bypass the plant draws %s kWh/yr less than the lowest-power staging", Grouped(lo.Annual.Energy-bp.Annual.Energy))
	}
	r.warn(SourceStudy, "near full speed a drive's own losses exceed what speed control saves, so strategies with fewer drives draw less than the lowest-power staging there (%s); %s",
		strings.Join(items, "; "), cure)
}

// fmtRatio writes a margin ratio with as many decimals as it needs (1.3, 1.25).
func fmtRatio(v float64) string { return strconv.FormatFloat(v, 'f', -1, 64) }

// joinNames lists names: "A", "A and B", "A, B and C".
func joinNames(names []string) string {
	if len(names) < 2 {
		return strings.Join(names, "")
	}
	return strings.Join(names[:len(names)-1], ", ") + " and " + names[len(names)-1]
}
