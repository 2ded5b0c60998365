package optimize

import (
	"fmt"
	"math"
	"sort"
	"strings"

	"wattstage/curves"
)

// unmet explains why no combination serves the flow.
func (s *Solver) unmet(res Result, Q, hr float64, c Constraint) Result {
	res.Status = Unmet
	u := s.plant.Units
	best := s.capacity(hr, c)
	if best.flow < Q {
		res.Limit = LimitCapacity
		res.Shortfall = curves.Flow(Q - best.flow)
		switch {
		case best.flow > 0:
			res.Reason = fmt.Sprintf("the units can deliver at most %s %s; short by %s",
				u.FormatFlow(curves.Flow(best.flow)), s.describeCapacity(best, hr), u.FormatFlow(res.Shortfall))
		case best.reach:
			res.Reason = fmt.Sprintf("no allowed combination of units can run at or above the required head of %s within its limits",
				u.FormatHead(curves.Head(hr)))
		default:
			res.Reason = fmt.Sprintf("no unit can make the required head of %s", u.FormatHead(curves.Head(hr)))
		}
		return res
	}
	res.Limit = LimitGap
	res.Reason = fmt.Sprintf("no combination of running units delivers %s at %s or more without breaking a unit's minimum flow, speed or motor limit",
		u.FormatFlow(curves.Flow(Q)), u.FormatHead(curves.Head(hr)))
	return res
}

// capacityPoint is the largest flow an allowed combination of running
// units delivers together at a header head at or above the required one,
// every unit inside every limit, and where that is.
type capacityPoint struct {
	flow  float64 // m³/s; 0 when no combination can run
	head  float64 // header head there, m
	cnt   []int   // the combination
	reach bool    // some allowed combination makes the required head
}

// capacity returns the plant's capacity at or above the required head hr:
// the maximum over allowed combinations and over header heads h ≥ hr of
// F(h) = Σ n_i·q_i,max(h), where q_i,max is the top of unit i's allowed
// range at h (span.hi: its flow at top speed, at runout, or at the motor's
// rating × service factor, whichever is least) and every running unit can
// run at h at all. It is not F(hr): a unit held at runout below top speed
// gives more at a higher head (q = X_run·√(h/H₀(X_run)) rises with h),
// while a unit at top speed gives less (its curve falls), so the maximum
// often lies at a head above the required one, where a unit reaches its
// runout at its top speed (h = s_max²·H₀net(X_run)).
//
// The search: F is evaluated for every combination on one set of heads —
// hr, each model's runout/top-speed corner and top head, and 48 heads in
// between — from the spans of each model at each head computed once; then
// golden-section search refines, for every combination within 5 % of the
// best sample, the head between the samples either side of its best one.
// Each q_i,max(h) is continuous and unimodal in h (rising on runout,
// falling on its curve), so the refinement converges on the maximum to
// 1e-12 of the head where F is unimodal between those samples, which holds
// unless two models' corners fall between two neighbouring samples.
func (s *Solver) capacity(hr float64, c Constraint) capacityPoint {
	var combos [][]int
	top := hr
	best := capacityPoint{}
	for _, cnt := range s.combos {
		if !c.allows(cnt) {
			continue
		}
		if hc := s.headCap(cnt); hc >= hr {
			combos = append(combos, cnt)
			top = math.Max(top, hc)
			best.reach = true
		}
	}
	if len(combos) == 0 {
		return best
	}
	heads := []float64{hr, top}
	for _, u := range s.units {
		heads = append(heads, u.topHead())
		if corner := u.runoutCorner(); corner > hr && corner < top {
			heads = append(heads, corner)
		}
	}
	const n = 48
	for k := 1; k < n; k++ {
		heads = append(heads, hr+(top-hr)*float64(k)/n)
	}
	sort.Float64s(heads)
	heads = dedupeAbove(heads, hr)
	spans := make([][]span, len(heads))
	for k, h := range heads {
		spans[k] = make([]span, len(s.units))
		for i, u := range s.units {
			spans[k][i] = u.bounds(h)
		}
	}
	// The best sample of every combination.
	type sample struct {
		flow float64
		k    int
	}
	samples := make([]sample, len(combos))
	top1 := 0.0
	for j, cnt := range combos {
		samples[j] = sample{flow: -1}
		for k := range heads {
			if f, ok := comboFlow(cnt, spans[k]); ok && f > samples[j].flow {
				samples[j] = sample{f, k}
			}
		}
		top1 = math.Max(top1, samples[j].flow)
	}
	if top1 <= 0 {
		return best
	}
	for j, cnt := range combos {
		sm := samples[j]
		if sm.flow < 0.95*top1 {
			continue
		}
		h, f := heads[sm.k], sm.flow
		lo, hi := heads[max(sm.k-1, 0)], heads[min(sm.k+1, len(heads)-1)]
		if gh, gf := s.goldenCapacity(cnt, lo, hi); gf > f {
			h, f = gh, gf
		}
		if f > best.flow {
			best.flow, best.head, best.cnt = f, h, cnt
		}
	}
	return best
}

// runoutCorner is the header head at which a variable unit at its top speed
// reaches its runout: s_max²·H₀net(X_run); 0 for a fixed-speed unit or one
// without a runout.
func (u *unitModel) runoutCorner() float64 {
	if !u.variable || math.IsInf(u.qrun, 1) {
		return 0
	}
	return u.smax * u.smax * float64(u.net.At(curves.Flow(u.qrun)))
}

// dedupeAbove drops, from sorted heads, those below lo and repeats.
func dedupeAbove(heads []float64, lo float64) []float64 {
	out := heads[:0]
	for _, h := range heads {
		if h >= lo && (len(out) == 0 || h > out[len(out)-1]) {
			out = append(out, h)
		}
	}
	return out
}

// comboFlow is Σ n_i·span_i.hi, and whether every running unit can run.
func comboFlow(cnt []int, spans []span) (float64, bool) {
	sum := 0.0
	for i, n := range cnt {
		if n == 0 {
			continue
		}
		if !spans[i].ok {
			return 0, false
		}
		sum += float64(n) * spans[i].hi
	}
	return sum, true
}

// goldenCapacity maximises a combination's top flow over header heads in
// [lo, hi] by golden-section search (Kiefer 1953; Press et al., Numerical
// Recipes, 3rd ed. (2007), §10.2), a head where a unit cannot run counting
// as no flow. It returns the head and the flow there.
func (s *Solver) goldenCapacity(cnt []int, lo, hi float64) (float64, float64) {
	spans := make([]span, len(s.units))
	f := func(h float64) float64 {
		for i, n := range cnt {
			if n > 0 {
				spans[i] = s.units[i].bounds(h)
			}
		}
		v, ok := comboFlow(cnt, spans)
		if !ok {
			return -1
		}
		return v
	}
	const g = 0.6180339887498949 // (√5 − 1)/2
	a, b := lo, hi
	m1, m2 := b-g*(b-a), a+g*(b-a)
	f1, f2 := f(m1), f(m2)
	for it := 0; it < 200 && b-a > 1e-12*b; it++ {
		if f1 < f2 {
			a, m1, f1 = m1, m2, f2
			m2 = a + g*(b-a)
			f2 = f(m2)
		} else {
			b, m2, f2 = m2, m1, f1
			m1 = b - g*(b-a)
			f1 = f(m1)
		}
	}
	h := (a + b) / 2
	return h, f(h)
}

// describeCapacity says where the capacity is reached and what holds it
// there: the header head (the required head itself, which then binds, or a
// higher one where the units' flows peak), and for each running model the
// limits its units sit on — runout, maximum speed, the motor's rating ×
// service factor, or the curve of a fixed-speed unit.
func (s *Solver) describeCapacity(cp capacityPoint, hr float64) string {
	u := s.plant.Units
	var where string
	if cp.head <= hr*(1+1e-9) {
		where = fmt.Sprintf("at the required head of %s, which binds with ", u.FormatHead(curves.Head(hr)))
	} else {
		where = fmt.Sprintf("with the header raised to %s above the required %s, ",
			u.FormatHead(curves.Head(cp.head)), u.FormatHead(curves.Head(hr)))
	}
	var parts []string
	running := 0
	for _, n := range cp.cnt {
		if n > 0 {
			running++
		}
	}
	for i, n := range cp.cnt {
		if n == 0 {
			continue
		}
		lims := s.units[i].limitsAtTop(cp.head)
		if running == 1 {
			parts = append(parts, fmt.Sprintf("%s %s", unitWord(n), lims))
		} else {
			parts = append(parts, fmt.Sprintf("%d × %s %s", n, s.plant.Models[i].Name, lims))
		}
	}
	return where + strings.Join(parts, ", ")
}

func unitWord(n int) string {
	if n == 1 {
		return "the running unit"
	}
	return "every running unit"
}

// limitsAtTop names the limits a unit sits on at the top of its range at
// header head h: each of runout, maximum speed and the motor's rating ×
// service factor that it meets to 1e-6, or its curve for a fixed-speed
// unit.
func (u *unitModel) limitsAtTop(h float64) string {
	sp := u.bounds(h)
	if !sp.ok {
		return "unable to run"
	}
	if !u.variable {
		lims := "on its curve at fixed speed"
		if u.shaftAt(sp.hi, h) >= u.shaftMax*(1-1e-6) {
			lims += ", at its motor's rating × service factor"
		}
		return lims
	}
	s, _ := u.speed(sp.hi, h)
	var on []string
	if !math.IsInf(u.qrun, 1) && sp.hi >= u.qrun*s*(1-1e-6) {
		on = append(on, "its runout")
	}
	if s >= u.smax*(1-1e-6) {
		on = append(on, "its maximum speed")
	}
	if u.shaftAt(sp.hi, h) >= u.shaftMax*(1-1e-6) {
		on = append(on, "its motor's rating × service factor")
	}
	if len(on) == 0 {
		on = append(on, "the limit "+string(sp.hiLim.Limit()))
	}
	return "at " + strings.Join(on, " and ")
}
