package optimize

import (
	"math"
	"time"

	"wattstage/curves"
	"wattstage/plant"
)

// Cycling counts the stage changes of a time-ordered run and the unit
// starts they cause.
type Cycling struct {
	Changes    int     // stage changes
	Days       float64 // days the steps stand for
	PerDay     float64 // Changes / Days
	MaxPerHour int     // most stage changes within one clock hour
	Models     []ModelStarts
}

// ModelStarts are the starts of one model's units. With lead/lag rotation
// the starts spread over the model's units; MaxPerHour counts them all, as
// if one unit took them (the conservative reading).
type ModelStarts struct {
	Model      int
	Name       string
	Starts     int
	MaxPerHour int
	// Allowed is the NEMA MG 10 starts per hour of one motor of this size
	// and pole count (values from memory; across-the-line starts of design
	// A/B motors with load inertia within the table's limit); NaN outside
	// the table.
	Allowed float64
	Over    bool // MaxPerHour above Allowed
}

type cycleCounter struct {
	c       Cycling
	perHour map[time.Time]int
	model   []map[time.Time]int
}

func newCycleCounter(p *plant.Plant) *cycleCounter {
	cc := &cycleCounter{perHour: map[time.Time]int{}}
	for i, m := range p.Models {
		cc.c.Models = append(cc.c.Models, ModelStarts{Model: i, Name: m.Name,
			Allowed: StartsPerHour(m.Motor.Rated, curves.PoleCount(m.RatedSpeed))})
		cc.model = append(cc.model, map[time.Time]int{})
	}
	return cc
}

// change records stage change from → to (stage indexes from 0) at time at.
func (cc *cycleCounter) change(sp *Setpoints, from, to int, at time.Time) {
	cc.c.Changes++
	h := at.Truncate(time.Hour)
	cc.perHour[h]++
	a, b := sp.Stages[from].Counts, sp.Stages[to].Counts
	for i := range a {
		if n := b[i] - a[i]; n > 0 {
			cc.c.Models[i].Starts += n
			cc.model[i][h] += n
		}
	}
}

func (cc *cycleCounter) finish(hours float64) Cycling {
	c := cc.c
	c.Days = hours / 24
	if c.Days > 0 {
		c.PerDay = float64(c.Changes) / c.Days
	}
	for _, n := range cc.perHour {
		c.MaxPerHour = max(c.MaxPerHour, n)
	}
	for i := range c.Models {
		for _, n := range cc.model[i] {
			c.Models[i].MaxPerHour = max(c.Models[i].MaxPerHour, n)
		}
		c.Models[i].Over = !math.IsNaN(c.Models[i].Allowed) && float64(c.Models[i].MaxPerHour) > c.Models[i].Allowed
	}
	return c
}
