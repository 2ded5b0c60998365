package plant

import (
	"errors"
	"fmt"
	"math"

	"gopkg.in/yaml.v3"

	"wattstage/curves"
)

// DefaultNPSHMargin is the NPSHa/NPSHr ratio the NPSH check asks for when
// the file is silent: inside the range of about 1.1 to 1.5 or more that the
// Hydraulic Institute's NPSH margin guideline (ANSI/HI 9.6.1) recommends by
// application and suction energy (from memory). Pumps of high suction
// energy call for the larger ratios; give suction.margin for the
// application.
const DefaultNPSHMargin = 1.3

// Limits of the suction section.
const (
	minAltitude = -500.0 // m: below the shores of the lowest lakes
	maxAltitude = 5000.0 // m: above any plant's site; the standard atmosphere holds to 11 km
	maxPressure = 10e6   // Pa: 10 MPa (100 bar, 1450 psi), far above a building system's
	maxMargin   = 5.0    // NPSHa/NPSHr: far above any guideline's ratio
)

var suctionKeys = []string{"static_head", "loss", "altitude", "absolute_pressure", "gauge_pressure", "margin"}

// npshr reads a pump model's NPSHr datasheet points (flow and NPSHr at
// rated speed, in the file's flow and head units).
func (d *decoder) npshr(n *yaml.Node, path string) *curves.NPSHCurve {
	items, ok := d.sequence(n, path, "NPSHr datasheet points at rated speed: flow and npshr")
	if !ok {
		return nil
	}
	if len(items) < 2 || len(items) > maxPoints {
		d.errorf(n, path, "has %d points; give from 2 to %d", len(items), maxPoints)
		return nil
	}
	pts := make([]curves.NPSHPoint, len(items))
	nodes := make([]*fields, len(items))
	for j, it := range items {
		rp := index(path, j)
		f := d.mapping(it, rp, "an NPSHr point: flow and npshr", "flow", "npshr")
		if f == nil {
			ok = false
			continue
		}
		nodes[j] = f
		fv, fok := d.flow(d.required(f, "flow", "the point's flow"), join(rp, "flow"), "")
		hn := d.required(f, "npshr", "the NPSH the pump requires at that flow (NPSH3)")
		h, hok := d.head(hn, join(rp, "npshr"))
		if hok && h == 0 {
			d.errorf(hn, join(rp, "npshr"), "the NPSH a pump requires is greater than zero")
			hok = false
		}
		pts[j] = curves.NPSHPoint{Flow: fv.Q, NPSHr: h}
		ok = ok && fok && hok
	}
	if !ok {
		return nil
	}
	c, err := curves.NewNPSHCurve(pts)
	if err != nil {
		for _, e := range splitErrors(err) {
			var pe *curves.PointError
			if !errors.As(e, &pe) || pe.Index < 0 || pe.Index >= len(nodes) || nodes[pe.Index] == nil {
				d.errorf(n, path, "%v", e)
				continue
			}
			node, rp := d.resolve(nodes[pe.Index].vals[pe.Field]), join(index(path, pe.Index), pe.Field)
			switch {
			case errors.Is(pe.Err, curves.ErrDuplicateFlow):
				d.errorf(node, rp, "%s repeats the flow of the point before; each point needs its own flow", d.fmtFlow(pts[pe.Index].Flow))
			case errors.Is(pe.Err, curves.ErrUnsorted):
				d.errorf(node, rp, "%s is below the flow of the point before (%s): list the points in order of rising flow",
					d.fmtFlow(pts[pe.Index].Flow), d.fmtFlow(pts[pe.Index-1].Flow))
			default:
				d.errorf(node, rp, "%v", pe.Err)
			}
		}
		return nil
	}
	return c
}

// suction reads the suction section: the conditions of NPSH available
// shared by every unit, and the margin the check asks for.
func (d *decoder) suction(n *yaml.Node, sys *systemSpec, fl curves.Fluid) *Suction {
	f := d.mapping(n, "suction", "static_head, loss, and altitude or a pressure", suctionKeys...)
	if f == nil {
		return nil
	}
	s := &Suction{Margin: DefaultNPSHMargin}
	s.Density = fl.Density
	ok := true
	z, zok := d.signedHead(d.required(f, "static_head", "the height of the liquid level (or of the point where the pressure is given) above the impeller eye; negative for a suction lift"), "suction.static_head")
	s.StaticHead, ok = z, ok && zok
	if ln := d.value(f, "loss"); ln != nil {
		ok = d.suctionLoss(ln, sys, s) && ok
	} else if !f.has("loss") {
		d.defaultf("suction.loss", "none: no friction between the tank and the pump suction (give loss for the strainer, valves and piping)")
	}
	alt, abs, gauge := d.value(f, "altitude"), d.value(f, "absolute_pressure"), d.value(f, "gauge_pressure")
	if abs != nil && gauge != nil {
		d.errorf(gauge, "suction.gauge_pressure", "give absolute_pressure or gauge_pressure, not both")
		ok = false
	}
	if abs != nil && alt != nil {
		d.errorf(alt, "suction.altitude", "an absolute pressure already includes the atmosphere: give altitude with gauge_pressure or alone (open tank), not with absolute_pressure")
		ok = false
	}
	atm, z0 := curves.StandardPressure, 0.0
	if alt != nil {
		v, aok := d.altitude(alt)
		if aok {
			atm, _ = curves.AtmosphericPressure(v)
			z0 = v
		}
		ok = ok && aok
	}
	switch {
	case abs != nil:
		p, pok := d.pressure(abs, "suction.absolute_pressure", false)
		if pok && p == 0 {
			d.errorf(abs, "suction.absolute_pressure", "an absolute pressure must be above zero (a perfect vacuum)")
			pok = false
		}
		s.Pressure, ok = p, ok && pok
		s.Basis = fmt.Sprintf("closed system at %s absolute", d.fmtPressure(p))
	case gauge != nil:
		p, pok := d.pressure(gauge, "suction.gauge_pressure", true)
		if pok && atm+p <= 0 {
			d.errorf(gauge, "suction.gauge_pressure", "%s gauge is below a perfect vacuum (the atmosphere is %s absolute)", d.fmtPressure(p), d.fmtPressure(atm))
			pok = false
		}
		s.Pressure, ok = atm+p, ok && pok
		s.Basis = fmt.Sprintf("closed system at %s gauge + %s atmosphere at %s (ISO 2533) = %s absolute",
			d.fmtPressure(p), d.fmtPressure(atm), d.fmtAltitude(z0), d.fmtPressure(atm+p))
		if alt == nil && !f.has("altitude") {
			d.defaultf("suction.altitude", "sea level: the gauge pressure is taken above 101.325 kPa (14.696 psi), the standard atmosphere (ISO 2533)")
		}
	default:
		s.Pressure = atm
		s.Basis = fmt.Sprintf("open tank at %s absolute, the standard atmosphere at %s (ISO 2533)", d.fmtPressure(atm), d.fmtAltitude(z0))
		if alt == nil && !f.has("altitude") && !f.has("absolute_pressure") && !f.has("gauge_pressure") {
			d.defaultf("suction.altitude", "sea level: an open tank at 101.325 kPa (14.696 psi), the standard atmosphere (ISO 2533); give altitude, or a pressure for a closed system")
		}
	}
	if mn := d.value(f, "margin"); mn != nil {
		m, mok := d.number(mn, "suction.margin")
		switch {
		case !mok:
		case m < 1 || m > maxMargin:
			d.errorf(mn, "suction.margin", "%s is outside 1–%s: the margin is the ratio NPSHa/NPSHr asked for (about 1.1 to 1.5 by ANSI/HI 9.6.1, from memory)", mn.Value, fmtNum(maxMargin))
			mok = false
		default:
			s.Margin = m
		}
		ok = ok && mok
	} else if !f.has("margin") {
		d.defaultf("suction.margin", "NPSHa/NPSHr of %s at every operating point (within the 1.1 to 1.5 or more the Hydraulic Institute's ANSI/HI 9.6.1 recommends by application and suction energy, from memory; give the application's ratio)", fmtNum(DefaultNPSHMargin))
	}
	t := fl.Temperature
	switch {
	case math.IsNaN(t):
		d.errorf(n, "suction", "the NPSH check needs the fluid's temperature for its vapour pressure: give fluid.temperature")
		ok = false
	case t < 0:
		// Below 0 °C only a glycol or brine flows; the vapour pressure of
		// water at 0 °C is above the mixture's, the cautious side.
		s.VapourPressure, _ = curves.WaterVapourPressure(0)
		d.defaultf("suction.vapour_pressure", "%s, water's at 0 °C (IAPWS-IF97), above a mixture's at %s: cautious", d.fmtPressure(s.VapourPressure), d.fmtTemp(t))
	default:
		s.VapourPressure, _ = curves.WaterVapourPressure(t)
		if fl.SG != 0 && !math.IsNaN(fl.SG) && d.isMixture(fl) {
			d.defaultf("suction.vapour_pressure", "%s, water's at %s (IAPWS-IF97); a glycol mixture's is lower: cautious", d.fmtPressure(s.VapourPressure), d.fmtTemp(t))
		}
	}
	if !ok {
		return nil
	}
	s.Basis += "; " + d.suctionTerms(s, t)
	return s
}

// suctionTerms words the static head, loss and vapour pressure for the
// reports, so a reviewer can redo NPSHa by hand.
func (d *decoder) suctionTerms(s *Suction, t float64) string {
	level := fmt.Sprintf("level %s above the impeller eye", d.fmtHead(s.StaticHead))
	if s.StaticHead < 0 {
		level = fmt.Sprintf("level %s below the impeller eye (suction lift)", d.fmtHead(-s.StaticHead))
	}
	loss := "no suction loss"
	if s.Loss > 0 {
		loss = fmt.Sprintf("suction loss %s at %s", d.fmtHead(s.Loss), d.fmtFlow(s.LossFlow))
	}
	return fmt.Sprintf("%s, %s, vapour pressure %s at %s (IAPWS-IF97)", level, loss, d.fmtPressure(s.VapourPressure), d.fmtTemp(t))
}

// isMixture reports whether the fluid was given by specific gravity (a
// glycol or brine) rather than as water at a temperature.
func (d *decoder) isMixture(fl curves.Fluid) bool {
	rho, err := curves.WaterDensity(fl.Temperature)
	return err != nil || math.Abs(rho-fl.Density) > 1e-9
}

// suctionLoss reads suction.loss: a head at a plant flow, by default the
// design flow.
func (d *decoder) suctionLoss(n *yaml.Node, sys *systemSpec, s *Suction) bool {
	f := d.mapping(n, "suction.loss", "head and optionally flow", "head", "flow")
	if f == nil {
		return false
	}
	h, ok := d.head(d.required(f, "head", "the friction head lost in the suction at the flow"), "suction.loss.head")
	if !ok {
		return false
	}
	s.Loss = h
	if fn := d.value(f, "flow"); fn != nil {
		fv, fok := d.flow(fn, "suction.loss.flow", "design flow")
		if !fok {
			return false
		}
		q := fv.Q
		if fv.IsPct {
			if sys == nil || !sys.ok {
				return false
			}
			q = fv.of(sys.designFlow)
		}
		if q == 0 {
			d.errorf(fn, "suction.loss.flow", "the flow of a suction loss must be above zero")
			return false
		}
		s.LossFlow = q
		return true
	}
	if f.has("flow") || sys == nil || !sys.ok {
		return false
	}
	s.LossFlow = sys.designFlow
	d.defaultf("suction.loss.flow", "%s (the design flow); the loss scales with the square of the plant's pumped flow", d.fmtFlow(s.LossFlow))
	return true
}

// altitude reads a site altitude in m (SI) or ft (US), in metres.
func (d *decoder) altitude(n *yaml.Node) (float64, bool) {
	units := []string{"m"}
	if d.units == curves.US {
		units = []string{"ft"}
	}
	v, _, ok := d.quantity(n, "suction.altitude", "the site's altitude above sea level in "+units[0], units...)
	if !ok {
		return 0, false
	}
	z := float64(d.units.HeadIn(v))
	if z < minAltitude || z > maxAltitude {
		d.errorf(n, "suction.altitude", "%s is outside %s to %s", d.fmtAltitude(z), d.fmtAltitude(minAltitude), d.fmtAltitude(maxAltitude))
		return 0, false
	}
	return z, true
}

// pressure reads a pressure in kPa (SI) or psi (US) and returns Pa; a
// negative value is accepted only when signed (a gauge pressure below the
// atmosphere).
func (d *decoder) pressure(n *yaml.Node, path string, signed bool) (float64, bool) {
	unit, per := "kPa", curves.KPa
	if d.units == curves.US {
		unit, per = "psi", curves.PSI
	}
	v, _, ok := d.quantity(n, path, "a pressure in "+unit, unit)
	if !ok {
		return 0, false
	}
	p := v * per
	switch {
	case p < 0 && !signed:
		d.errorf(n, path, "%s: an absolute pressure must not be negative", n.Value)
		return 0, false
	case math.Abs(p) > maxPressure:
		d.errorf(n, path, "%s is above %s, the largest pressure accepted (check the unit)", n.Value, d.fmtPressure(maxPressure))
		return 0, false
	}
	return p, true
}

func (d *decoder) fmtPressure(pa float64) string {
	if d.units == curves.US {
		return fmtNum(pa/curves.PSI) + " psi"
	}
	return fmtNum(pa/curves.KPa) + " kPa"
}

func (d *decoder) fmtAltitude(z float64) string {
	return fmtNum(d.units.HeadOut(curves.Head(z))) + " " + d.units.HeadUnit()
}
