package plant

import (
	"gopkg.in/yaml.v3"

	"wattstage/curves"
)

// systemSpec is the system as read, with the nodes the plant checks point at.
type systemSpec struct {
	curve      curves.System
	designFlow curves.Flow
	designHead curves.Head
	minFlow    curves.Flow
	loopEnd    bool // bypass_at: loop_end
	flowNode   *yaml.Node
	headNode   *yaml.Node
	ok         bool   // design flow and head are both valid
	sensor     string // dp_control.sensor: where the DP sensor is
}

var systemKeys = []string{"design_flow", "design_head", "dp_control", "fixed_curve", "plant_min_flow", "bypass_at"}

// system reads the system the pumps serve.
func (d *decoder) system(n *yaml.Node) *systemSpec {
	f := d.mapping(n, "system", "design_flow, design_head, dp_control or fixed_curve, plant_min_flow, bypass_at", systemKeys...)
	if f == nil {
		return nil
	}
	s := &systemSpec{}
	s.flowNode = d.required(f, "design_flow", "the plant's design flow")
	fv, fok := d.flow(s.flowNode, "system.design_flow", "")
	if fok && fv.Q == 0 {
		d.errorf(s.flowNode, "system.design_flow", "the design flow must be above zero")
		fok = false
	}
	s.headNode = d.required(f, "design_head", "the head at the pumps at design flow")
	h, hok := d.head(s.headNode, "system.design_head")
	if hok && h == 0 {
		d.errorf(s.headNode, "system.design_head", "the design head must be above zero")
		hok = false
	}
	s.designFlow, s.designHead, s.ok = fv.Q, h, fok && hok

	dpN, fcN := d.value(f, "dp_control"), d.value(f, "fixed_curve")
	switch {
	case dpN != nil && fcN != nil:
		d.errorf(fcN, "system.fixed_curve", "give dp_control or fixed_curve, not both")
		s.ok = false
	case dpN != nil:
		s.curve = d.dpControl(dpN, s)
	case fcN != nil:
		s.curve = d.fixedCurve(fcN, s)
	case !f.has("dp_control") && !f.has("fixed_curve"):
		d.errorf(f.node, "system", "missing: give dp_control (closed loop held at a remote differential-pressure sensor) or fixed_curve (static head plus friction)")
		s.ok = false
	}
	if mn := d.value(f, "plant_min_flow"); mn != nil {
		mv, ok := d.flow(mn, "system.plant_min_flow", "design flow")
		if ok && fok {
			s.minFlow = mv.of(s.designFlow)
			if s.minFlow >= s.designFlow {
				d.errorf(mn, "system.plant_min_flow", "%s is not below the design flow %s", d.fmtFlow(s.minFlow), d.fmtFlow(s.designFlow))
			}
		}
	} else if !f.has("plant_min_flow") {
		d.defaultf("system.plant_min_flow", "none (no bypass: the pumps follow the load down; give the chiller or boiler minimum flow if there is one)")
	}
	if bn := d.value(f, "bypass_at"); bn != nil {
		switch v, _ := d.text(bn, "system.bypass_at"); v {
		case "plant":
		case "loop_end":
			s.loopEnd = true
		case "":
		default:
			d.errorf(bn, "system.bypass_at", "must be plant or loop_end, not %q", clip(v))
		}
	} else if s.minFlow > 0 {
		d.defaultf("system.bypass_at", "plant: below the plant minimum flow the bypass at the plant carries the difference and the pumps make the head the system needs at the load flow (give loop_end for a bypass at the far end of the loop: the head at the pumped flow)")
	}
	if s.curve == nil {
		s.ok = false
	}
	return s
}

// dpControl reads differential-pressure control with optional reset.
func (d *decoder) dpControl(n *yaml.Node, s *systemSpec) curves.System {
	const path = "system.dp_control"
	f := d.mapping(n, path, "control_head and optionally reset and sensor", "control_head", "reset", "sensor")
	if f == nil {
		return nil
	}
	if sn := d.value(f, "sensor"); sn != nil {
		s.sensor, _ = d.text(sn, join(path, "sensor"))
	}
	cn := d.required(f, "control_head", "the control head (setpoint at the sensor, as head or pressure)")
	ch, ok := d.head(cn, join(path, "control_head"))
	if !ok {
		return nil
	}
	if s.ok && ch > s.designHead {
		d.errorf(cn, join(path, "control_head"), "%s is above the design head %s: the head at the pumps includes the control head", d.fmtHead(ch), d.fmtHead(s.designHead))
		return nil
	}
	dp := curves.DPControl{DesignFlow: s.designFlow, DesignHead: s.designHead, ControlHead: ch}
	rn := d.value(f, "reset")
	if rn == nil {
		return dp
	}
	rp := join(path, "reset")
	rf := d.mapping(rn, rp, "low_flow, low_head, high_flow", "low_flow", "low_head", "high_flow")
	if rf == nil {
		return nil
	}
	lfn := d.required(rf, "low_flow", "the flow at and below which the low control head holds")
	lf, lok := d.flow(lfn, join(rp, "low_flow"), "design flow")
	lhn := d.required(rf, "low_head", "the reset control head at low flow")
	lh, hok := d.head(lhn, join(rp, "low_head"))
	hfn := d.required(rf, "high_flow", "the flow at and above which the design control head holds")
	hf, fok := d.flow(hfn, join(rp, "high_flow"), "design flow")
	if !lok || !hok || !fok || !s.ok {
		return nil
	}
	r := &curves.Reset{LowFlow: lf.of(s.designFlow), LowHead: lh, HighFlow: hf.of(s.designFlow)}
	ok = true
	if r.HighFlow <= r.LowFlow {
		d.errorf(hfn, join(rp, "high_flow"), "%s is not above low_flow %s", d.fmtFlow(r.HighFlow), d.fmtFlow(r.LowFlow))
		ok = false
	}
	if r.LowHead > ch {
		d.errorf(lhn, join(rp, "low_head"), "%s is above the control head %s: a reset lowers the setpoint at low flow", d.fmtHead(r.LowHead), d.fmtHead(ch))
		ok = false
	}
	if r.HighFlow > s.designFlow {
		d.warnf(hfn, join(rp, "high_flow"), "%s is above the design flow %s", d.fmtFlow(r.HighFlow), d.fmtFlow(s.designFlow))
	}
	if !ok {
		return nil
	}
	dp.Reset = r
	return dp
}

// fixedCurve reads a static-plus-friction system curve.
func (d *decoder) fixedCurve(n *yaml.Node, s *systemSpec) curves.System {
	const path = "system.fixed_curve"
	f := d.mapping(n, path, "static_head", "static_head")
	if f == nil {
		return nil
	}
	sn := d.required(f, "static_head", "the static head (lift) of the system")
	sh, ok := d.head(sn, join(path, "static_head"))
	if !ok {
		return nil
	}
	if s.ok && sh >= s.designHead {
		d.errorf(sn, join(path, "static_head"), "%s is not below the design head %s: the design head is static head plus friction", d.fmtHead(sh), d.fmtHead(s.designHead))
		return nil
	}
	return curves.FixedCurve{DesignFlow: s.designFlow, DesignHead: s.designHead, Static: sh}
}
