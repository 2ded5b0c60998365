package optimize

import (
	"wattstage/curves"
	"wattstage/plant"
)

var _ Strategy = (*DriveBypass)(nil)

// maxBypassVariants bounds how many ways of bypassing drives are searched
// at each step (the product over models of one more than the units with a
// bypass).
const maxBypassVariants = 64

// DriveBypass is the lowest-power staging where units whose drives have a
// bypass contactor (plant.Model.DriveBypass) may also run across the line
// at rated speed: at each step, the best over every number of bypassed
// units of each such model. Near full speed a drive's own losses can exceed
// what speed control saves, so a bypassed unit throttled on its curve can
// draw less. The result is written in terms of the plant's own models; a
// bypassed unit shows speed 100 % and its drive efficiency as 1.
type DriveBypass struct {
	Label    string
	Plant    *plant.Plant
	variants []bypassVariant
}

type bypassVariant struct {
	solver *Solver
	orig   []int // variant model index → the plant's
}

// NewDriveBypass returns the strategy, or nil when no model has a bypass.
func NewDriveBypass(label string, p *plant.Plant) *DriveBypass {
	choices := [][]int{nil} // per variant: bypassed units per model
	for i, m := range p.Models {
		if !m.DriveBypass || !m.Drive.Variable() {
			continue
		}
		var next [][]int
		for _, c := range choices {
			for k := 0; k <= m.Count; k++ {
				v := make([]int, len(p.Models))
				copy(v, c)
				v[i] = k
				next = append(next, v)
			}
		}
		if len(next) > maxBypassVariants {
			break
		}
		choices = next
	}
	if len(choices) < 2 {
		return nil
	}
	b := &DriveBypass{Label: label, Plant: p}
	for _, c := range choices {
		w := make([]int, len(p.Models))
		for i, m := range p.Models {
			if m.Drive.Variable() {
				w[i] = m.Count - c[i]
			}
		}
		q := PartialVariant(p, w, nil)
		var orig []int
		for i, m := range p.Models {
			d := min(w[i], m.Count)
			if d > 0 {
				orig = append(orig, i)
			}
			if m.Count-d > 0 {
				orig = append(orig, i)
			}
		}
		// PartialVariant gives drive-less units a fixed drive and keeps the
		// others' drive; a nil drive argument keeps each model's own.
		b.variants = append(b.variants, bypassVariant{solver: New(q, Options{}), orig: orig})
	}
	return b
}

func (b *DriveBypass) Name() string { return b.Label }

// solve returns the best served state over the variants, in the plant's
// models; where none serves the load, the no-bypass variant's result.
func (b *DriveBypass) solve(load curves.Flow) Result {
	n := len(b.Plant.Models)
	var best *Result
	var first Result
	for k, v := range b.variants {
		r := v.solver.Solve(load)
		if k == 0 {
			first = v.remap(r, n)
		}
		if r.Status == Served && (best == nil || r.Power < best.Power) {
			m := v.remap(r, n)
			best = &m
		}
	}
	if best == nil {
		return first
	}
	return *best
}

// remap writes a variant's result in terms of the plant's models.
func (v bypassVariant) remap(r Result, n int) Result {
	counts := make([]int, n)
	for j, c := range r.Counts {
		counts[v.orig[j]] += c
	}
	r.Counts = counts
	units := make([]Unit, len(r.Units))
	for k, u := range r.Units {
		u.Model = v.orig[u.Model]
		units[k] = u
	}
	r.Units = units
	return r
}

func (b *DriveBypass) Stream(steps []Step, visit func(int, *Result)) Run {
	r := Run{Name: b.Label, Drives: drives(b.Plant), Plant: b.Plant,
		Note: "the lowest-power staging, a unit's drive bypassed (across the line at rated speed) wherever that draws less"}
	prev := -1
	for i, st := range steps {
		res := b.solve(st.Load)
		visit(i, &res)
		prev = countChange(&r, st, res, prev)
	}
	return r
}
