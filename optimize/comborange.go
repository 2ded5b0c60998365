package optimize

import "wattstage/curves"

// capacity returns the largest flow for which ok holds, searching up from
// the design flow (or down to a served flow) and bisecting the edge.
func (d *deriver) capacity(ok func(curves.Flow) bool) curves.Flow {
	qd := d.p.DesignFlow
	lo, hi := curves.Flow(0), qd
	if ok(qd) {
		lo = qd
		for hi = qd * 1.05; ok(hi); hi *= 1.05 {
			lo = hi
			if hi > 8*qd {
				return hi
			}
		}
	} else {
		found := false
		for q := qd * 0.95; q > qd*0.005; q *= 0.95 {
			if ok(q) {
				lo, hi, found = q, q/0.95, true
				break
			}
		}
		if !found {
			return 0
		}
	}
	return bisectEdge(ok, lo, hi)
}

// bisectEdge narrows [lo, hi] with ok(lo) true and ok(hi) false to the edge,
// returning the last flow where ok holds.
func bisectEdge(ok func(curves.Flow) bool, lo, hi curves.Flow) curves.Flow {
	for it := 0; it < 60 && hi-lo > 1e-10*hi; it++ {
		m := (lo + hi) / 2
		if ok(m) {
			lo = m
		} else {
			hi = m
		}
	}
	return lo
}

// comboTop returns the largest flow a combination serves above a flow where
// it serves, and the limit that stops it there.
func (d *deriver) comboTop(cnt []int, from curves.Flow) (curves.Flow, Limit) {
	ok := func(q curves.Flow) bool { return d.served(cnt, q) }
	lo, hi := from, from
	for hi = from * 1.02; ok(hi); hi *= 1.02 {
		lo = hi
		if hi > 8*d.p.DesignFlow {
			return hi, LimitNone
		}
	}
	top := bisectEdge(ok, lo, hi)
	lim := pointLimit(ptr(d.at(cnt, top)))
	if lim == LimitNone || lim == LimitPlantBypass {
		lim = LimitCapacity
	}
	return top, lim
}

// comboBottom returns the lowest flow, not below floor, a combination serves
// below a flow where it serves, and the limit it sits on there.
func (d *deriver) comboBottom(cnt []int, from, floor curves.Flow) (curves.Flow, Limit) {
	ok := func(q curves.Flow) bool { return d.served(cnt, q) }
	if ok(floor) {
		return floor, pointLimit(ptr(d.at(cnt, floor)))
	}
	// Bisect with the roles reversed: served at from, not at floor.
	lo, hi := floor, from
	for it := 0; it < 60 && hi-lo > 1e-10*hi; it++ {
		m := (lo + hi) / 2
		if ok(m) {
			hi = m
		} else {
			lo = m
		}
	}
	lim := pointLimit(ptr(d.at(cnt, hi)))
	if lim == LimitNone {
		lim = LimitMinFlow
	}
	return hi, lim
}
