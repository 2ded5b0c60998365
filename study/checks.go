package study

import (
	"wattstage/optimize"

	"wattstage/curves"
	"wattstage/plant"
)

// PartLoadCheck is the ASHRAE 90.1 §6.5.4.2 style check: the group's input
// at 50 % of design flow against its input at design flow (at most 30 %
// for hydronic variable-flow systems; per the user's code edition, verify
// locally).
type PartLoadCheck struct {
	Label    string
	DesignKW float64
	HalfKW   float64
	Ratio    float64 // HalfKW / DesignKW
	Limit    float64 // 0.30
	Pass     bool
	Note     string
}

// PartLoadLimit is the 30 %-of-design-power-at-50 %-flow limit of ASHRAE
// 90.1-2016/2019/2022 §6.5.4.2 and IECC-based codes (docs/sources.md §8).
const PartLoadLimit = 0.30

// CheckPartLoad evaluates one strategy at design flow and at half of it.
func CheckPartLoad(label string, p *plant.Plant, st optimize.Strategy) PartLoadCheck {
	run := st.Run([]optimize.Step{{Load: p.DesignFlow, Hours: 1}, {Load: p.DesignFlow / 2, Hours: 1}})
	c := PartLoadCheck{Label: label, Limit: PartLoadLimit}
	d, h := run.Points[0], run.Points[1]
	if d.Status != optimize.Served || h.Status != optimize.Served {
		c.Note = "the plant cannot serve design flow or half of it"
		return c
	}
	c.DesignKW, c.HalfKW = float64(d.Power)/curves.KW, float64(h.Power)/curves.KW
	c.Ratio = c.HalfKW / c.DesignKW
	c.Pass = c.Ratio <= c.Limit
	c.Note = "per the user's code edition (ASHRAE 90.1 §6.5.4.2 or local equivalent); verify locally"
	return c
}
