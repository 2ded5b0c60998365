package plant

import (
	"errors"
	"fmt"
	"math"

	"gopkg.in/yaml.v3"

	"wattstage/curves"
)

// Limits on the size of a plant file's lists: far above any real pump
// group, low enough that a mistyped or hostile file cannot make the
// optimiser's combination count explode.
const (
	maxModels = 12
	maxCount  = 20
	maxPoints = 100
	maxTable  = 100
)

// Defaults of a pump model, applied and recorded when the file is silent.
const (
	// DefaultMinSpeed is the minimum speed of a variable-speed unit as a
	// fraction of rated: 30 % is a common habit in the field (common
	// practice; confirm pump, motor-cooling and drive limits with their
	// manufacturers).
	DefaultMinSpeed = 0.30
	// DefaultMaxSpeed is the maximum speed as a fraction of rated.
	DefaultMaxSpeed = 1.0
	// DefaultMinFlowPct is the minimum continuous stable flow as a
	// percentage of BEP flow when the datasheet's value is not given
	// (common practice for end-suction and split-case pumps; the
	// manufacturer's value governs).
	DefaultMinFlowPct = 30.0
	// DefaultSpeedCorrection applies the Sârbu–Borza (1998) efficiency
	// step-down at reduced speed unless the file says otherwise: it is the
	// cautious choice, since it lowers predicted savings.
	DefaultSpeedCorrection = true
)

var pumpKeys = []string{"name", "count", "rated_speed", "curve", "head_fit", "allow_rising", "speed_correction",
	"min_speed", "max_speed", "min_flow", "runout", "motor", "drive", "branch_loss", "tags", "standby", "drive_bypass", "npshr"}

// pumpSpec is a pump model while it is being read: the model and what is
// still needed to finish it once the system is known.
type pumpSpec struct {
	path         string
	f            *fields
	model        Model
	rpmOK        bool
	pointNodes   []*fields // nil entries for points that were not mappings
	curveNode    *yaml.Node
	minFlow      *flowValue
	runout       *flowValue
	branch       *branchSpec
	headDegree   int // 2 or 3, as read from head_fit
	motorOK      bool
	ratedNode    *yaml.Node // motor.rated_output, for the motor size checks
	driveNode    *yaml.Node
	driveOK      bool
	motorTable   bool
	partLoadNode *yaml.Node // motor.part_load, for the warning on the DOE drive
	doeDrive     bool
}

type branchSpec struct {
	head curves.Head
	flow *flowValue // nil: at BEP flow
	node *yaml.Node
}

// pumps reads the list of pump models.
func (d *decoder) pumps(n *yaml.Node) []*pumpSpec {
	items, ok := d.sequence(n, "pumps", "one entry per pump model")
	if !ok {
		return nil
	}
	if len(items) == 0 {
		d.errorf(n, "pumps", "needs at least one pump model")
		return nil
	}
	if len(items) > maxModels {
		d.errorf(n, "pumps", "has %d pump models; at most %d are supported", len(items), maxModels)
		return nil
	}
	var specs []*pumpSpec
	names := map[string]int{}
	for i, it := range items {
		s := d.pump(it, index("pumps", i))
		if s != nil {
			d.finishPump(s)
		}
		specs = append(specs, s)
		if s == nil || s.model.Name == "" {
			continue
		}
		if j, dup := names[s.model.Name]; dup {
			d.errorf(d.resolve(s.f.vals["name"]), join(s.path, "name"), "%q is also the name of pumps[%d]; give each model its own name", s.model.Name, j)
		} else {
			names[s.model.Name] = i
		}
	}
	d.checkVectors(n, specs)
	return specs
}

// maxVectors caps the number of count vectors a plant offers the optimiser,
// Π(count + 1) − 1 over its models (every way to run some of its units):
// the cost of a year grows with it. An hourly year of `plan` on the 2-core
// machine (DEVELOPERS.md, "Plants of many models, long trends") took
// 11 s of CPU at 728 vectors, 36–41 s at 4,095 (four models of seven,
// twelve single-unit models), 48 s at 7,775 (five models of five) and
// 43 s at 15,624 (six models of four), and 111 s at 16,806 (five models of
// six, before the last speed-ups): the cap keeps a year within about a
// minute.
const maxVectors = 16000

// maxMixedVectors is the cap where fixed-speed models run beside variable-
// speed ones: the bounds are widened there (a higher head lowers a fixed-
// speed unit's flow and draw), and a year took 15 s of CPU at 728 vectors,
// 49 s at 2,400 and 80 s at 4,095.
const maxMixedVectors = 2500

// checkVectors refuses a plant whose models' counts give more count vectors
// than its cap.
func (d *decoder) checkVectors(n *yaml.Node, specs []*pumpSpec) {
	prod := 1
	fixed, variable := false, false
	for _, s := range specs {
		if s == nil || s.model.Count < 1 {
			return
		}
		v := s.model.Drive.Variable()
		fixed, variable = fixed || !v, variable || v
	}
	limit, why := maxVectors, ""
	if fixed && variable {
		limit, why = maxMixedVectors, " where fixed-speed units run beside variable-speed ones"
	}
	for _, s := range specs {
		prod *= s.model.Count + 1
		if prod-1 > limit {
			break
		}
	}
	if prod-1 > limit {
		d.errorf(n, "pumps", "the models' counts give %s ways to run some of the units (the product of count + 1 over the models, less one); at most %s are supported%s: merge identical models, or hold units in standby (pumps[].standby)", vectorsText(specs), fmtGrouped(float64(limit)), why)
	}
}

// vectorsText is Π(count + 1) − 1 written out, or "more than a billion".
func vectorsText(specs []*pumpSpec) string {
	prod := 1.0
	for _, s := range specs {
		prod *= float64(s.model.Count + 1)
	}
	if prod > 1e9 {
		return "more than a billion"
	}
	return fmtGrouped(prod - 1)
}

// pump reads one pump model and fits its curve.
func (d *decoder) pump(n *yaml.Node, path string) *pumpSpec {
	f := d.mapping(n, path, "a pump model", pumpKeys...)
	if f == nil {
		return nil
	}
	s := &pumpSpec{path: path, f: f}
	m := &s.model
	m.Name, _ = d.label(d.required(f, "name", "the pump model's name"), join(path, "name"), MaxModelNameLen)
	if c := d.value(f, "count"); c != nil {
		if v, ok := d.integer(c, join(path, "count")); ok {
			if v < 1 || v > maxCount {
				d.errorf(c, join(path, "count"), "%d installed units: give from 1 to %d", v, maxCount)
			} else {
				m.Count = v
			}
		}
	} else if !f.has("count") {
		m.Count = 1
		d.defaultf(join(path, "count"), "1 installed unit")
	}
	d.tagsAndStandby(s)
	if rn := d.required(f, "rated_speed", "the rated speed in rpm"); rn != nil {
		v, _, ok := d.quantity(rn, join(path, "rated_speed"), "a speed in rpm", "rpm")
		switch {
		case !ok:
		case v < 100 || v > 10000:
			d.errorf(rn, join(path, "rated_speed"), "%s rpm is outside 100–10000 rpm", fmtNum(v))
		default:
			m.RatedSpeed, s.rpmOK = v, true
		}
	}
	var variable, driveOK bool
	m.Drive, variable, driveOK = d.drive(d.required(f, "drive", "the drive: variable or fixed"), join(path, "drive"), s)
	s.driveOK = driveOK
	d.speedLimits(s, variable, driveOK)
	d.curve(s)
	m.Motor, s.motorOK = d.motor(d.required(f, "motor", "the motor (at least rated_output)"), join(path, "motor"), s)
	if s.motorTable && s.doeDrive {
		d.warnf(s.partLoadNode, join(path, "motor.part_load"), "with the DOE default drive losses the motor table only splits the combined motor-and-drive loss; give drive.efficiency_table or drive.iec_losses for the table to change the power")
	}
	if v := d.value(f, "min_flow"); v != nil {
		if fv, ok := d.flow(v, join(path, "min_flow"), "BEP flow"); ok {
			s.minFlow = &fv
		}
	}
	if v := d.value(f, "runout"); v != nil {
		if fv, ok := d.flow(v, join(path, "runout"), "BEP flow"); ok {
			s.runout = &fv
		}
	}
	if v := d.value(f, "drive_bypass"); v != nil {
		if b, ok := d.boolean(v, join(path, "drive_bypass")); ok {
			switch {
			case b && driveOK && !variable:
				d.errorf(v, join(path, "drive_bypass"), "a bypass goes round a variable-speed drive; this unit runs across the line already")
			default:
				m.DriveBypass = b
			}
		}
	}
	if v := d.value(f, "branch_loss"); v != nil {
		s.branch = d.branchLoss(v, join(path, "branch_loss"))
	}
	if v := d.value(f, "npshr"); v != nil {
		m.NPSHr = d.npshr(v, join(path, "npshr"))
	}
	return s
}

// speedLimits reads min_speed and max_speed; a fixed-speed unit has none.
func (d *decoder) speedLimits(s *pumpSpec, variable, driveOK bool) {
	m, f, path := &s.model, s.f, s.path
	minN, maxN := d.value(f, "min_speed"), d.value(f, "max_speed")
	if driveOK && !variable {
		m.MinSpeed, m.MaxSpeed = 1, 1
		for _, k := range []struct {
			n   *yaml.Node
			key string
		}{{minN, "min_speed"}, {maxN, "max_speed"}} {
			if k.n != nil {
				d.errorf(k.n, join(path, k.key), "a fixed-speed unit runs at rated speed; remove %s or give the unit a variable drive", k.key)
			}
		}
		return
	}
	minOK, maxOK := true, true
	m.MinSpeed, m.MaxSpeed = DefaultMinSpeed, DefaultMaxSpeed
	if minN != nil {
		m.MinSpeed, minOK = d.ratio(minN, join(path, "min_speed"), "the minimum speed", 2)
		if minOK && m.MinSpeed <= 0 {
			d.errorf(minN, join(path, "min_speed"), "%s: the minimum speed must be above zero", minN.Value)
			minOK = false
		}
	} else if !f.has("min_speed") && driveOK {
		d.defaultf(join(path, "min_speed"), "%s %% of rated speed (common practice; confirm pump, motor-cooling and drive minimums with their manufacturers)", fmtNum(100*DefaultMinSpeed))
	}
	if maxN != nil {
		m.MaxSpeed, maxOK = d.ratio(maxN, join(path, "max_speed"), "the maximum speed", 2)
		if maxOK && (m.MaxSpeed <= 0 || m.MaxSpeed > 1.5) {
			d.errorf(maxN, join(path, "max_speed"), "%s %% of rated speed is outside 0–150 %%", fmtNum(100*m.MaxSpeed))
			maxOK = false
		}
	} else if !f.has("max_speed") && driveOK {
		d.defaultf(join(path, "max_speed"), "100 %% of rated speed")
	}
	if minOK && maxOK && m.MinSpeed > m.MaxSpeed {
		at := minN
		if at == nil {
			at = maxN
		}
		d.errorf(at, join(path, "min_speed"), "minimum speed %s %% is above the maximum speed %s %%", fmtNum(100*m.MinSpeed), fmtNum(100*m.MaxSpeed))
	}
}

// curve reads the datasheet points and fit options and fits the pump.
func (d *decoder) curve(s *pumpSpec) {
	f, path := s.f, s.path
	cpath := join(path, "curve")
	opt := curves.PumpOptions{HeadDegree: 2, SpeedCorrection: DefaultSpeedCorrection}
	optOK := true
	if n := d.value(f, "head_fit"); n != nil {
		switch v, _ := d.text(n, join(path, "head_fit")); v {
		case "quadratic":
		case "cubic":
			opt.HeadDegree = 3
		case "":
			optOK = false
		default:
			d.errorf(n, join(path, "head_fit"), "must be quadratic or cubic, not %q", clip(v))
			optOK = false
		}
	} else if !f.has("head_fit") {
		d.defaultf(join(path, "head_fit"), "quadratic (least squares)")
	}
	if n := d.value(f, "allow_rising"); n != nil {
		var ok bool
		opt.AllowRising, ok = d.boolean(n, join(path, "allow_rising"))
		optOK = optOK && ok
	}
	if n := d.value(f, "speed_correction"); n != nil {
		var ok bool
		opt.SpeedCorrection, ok = d.boolean(n, join(path, "speed_correction"))
		optOK = optOK && ok
	} else if !f.has("speed_correction") {
		d.defaultf(join(path, "speed_correction"), "on: Sârbu–Borza (1998) efficiency step-down below rated speed")
	}
	n := d.required(f, "curve", "the datasheet points at rated speed")
	items, ok := d.sequence(n, cpath, "datasheet points: flow, head and efficiency or shaft_power")
	if !ok {
		return
	}
	s.curveNode = n
	need := max(3, opt.HeadDegree+1)
	switch {
	case len(items) < need:
		d.errorf(n, cpath, "has %d points; a %s head fit needs at least %d", len(items), fitName(opt.HeadDegree), need)
		ok = false
	case len(items) > maxPoints:
		d.errorf(n, cpath, "has %d points; at most %d are accepted", len(items), maxPoints)
		return
	}
	pts := make([]curves.PumpPoint, len(items))
	s.pointNodes = make([]*fields, len(items))
	for j, it := range items {
		p, pok := d.point(it, index(cpath, j), &s.pointNodes[j])
		pts[j] = p
		ok = ok && pok
	}
	if !ok || !optOK {
		return
	}
	s.headDegree = opt.HeadDegree
	if flatCurve(pts) {
		d.errorf(n, cpath, "every point has the same head (%s): a flat head curve fixes no flow at any head, so parallel units cannot share the load; give the datasheet's falling curve", d.fmtHead(pts[0].Head))
		return
	}
	pump, err := curves.NewPump(pts, opt)
	if err != nil {
		d.pumpErrors(s, err)
		return
	}
	s.model.Pump = pump
	d.checkDatasheet(s)
}

// flatCurve reports whether every point has the same head.
func flatCurve(pts []curves.PumpPoint) bool {
	for _, p := range pts[1:] {
		if p.Head != pts[0].Head {
			return false
		}
	}
	return true
}

func fitName(deg int) string {
	if deg == 3 {
		return "cubic"
	}
	return "quadratic"
}

// point reads one datasheet point.
func (d *decoder) point(n *yaml.Node, path string, out **fields) (curves.PumpPoint, bool) {
	var p curves.PumpPoint
	f := d.mapping(n, path, "a datasheet point: flow, head and efficiency or shaft_power", "flow", "head", "efficiency", "shaft_power")
	if f == nil {
		return p, false
	}
	*out = f
	ok := true
	fv, fok := d.flow(d.required(f, "flow", "the point's flow"), join(path, "flow"), "")
	p.Flow = fv.Q
	ok = ok && fok
	hn := d.required(f, "head", "the point's head")
	h, hok := d.head(hn, join(path, "head"))
	if hok && h == 0 {
		d.errorf(hn, join(path, "head"), "a datasheet head must be greater than zero")
		hok = false
	}
	p.Head = h
	ok = ok && hok
	en, sn := d.value(f, "efficiency"), d.value(f, "shaft_power")
	switch {
	case en != nil && sn != nil:
		d.errorf(sn, join(path, "shaft_power"), "give efficiency or shaft_power for a point, not both")
		ok = false
	case en != nil && fok && fv.Q == 0:
		e, eok := d.percent(en, join(path, "efficiency"), "an efficiency")
		if eok && e != 0 {
			d.errorf(en, join(path, "efficiency"), "a pump's efficiency at zero flow is 0 %%; leave it out or give the shutoff shaft_power")
		}
		ok = ok && eok && e == 0
	case en != nil:
		e, eok := d.efficiency(en, join(path, "efficiency"))
		p.Eff = e
		ok = ok && eok
	case sn != nil:
		sp, sok := d.power(sn, join(path, "shaft_power"))
		p.Shaft = sp
		ok = ok && sok
	case f.has("efficiency") || f.has("shaft_power"):
		ok = false // given without a value: already reported
	case fok && fv.Q > 0:
		if !f.suggested["efficiency"] && !f.suggested["shaft_power"] {
			d.errorf(f.node, path, "a point with flow needs an efficiency (%%) or a shaft_power (%s)", d.units.PowerUnit())
		}
		ok = false
	}
	return p, ok
}

// splitErrors flattens errors.Join trees.
func splitErrors(err error) []error {
	if j, ok := err.(interface{ Unwrap() []error }); ok {
		var out []error
		for _, e := range j.Unwrap() {
			out = append(out, splitErrors(e)...)
		}
		return out
	}
	return []error{err}
}

// pumpErrors maps the errors of curves.NewPump onto the file: a point
// error onto the point's own field, the rest onto the curve.
func (d *decoder) pumpErrors(s *pumpSpec, err error) {
	cpath := join(s.path, "curve")
	pts := s.pointNodes
	for _, e := range splitErrors(err) {
		var pe *curves.PointError
		if errors.As(e, &pe) && pe.Index >= 0 && pe.Index < len(pts) && pts[pe.Index] != nil {
			pf := pts[pe.Index]
			path := index(cpath, pe.Index)
			node := pf.node
			if v, ok := pf.vals[pe.Field]; ok && pe.Field != "" {
				node, path = d.resolve(v), join(path, pe.Field)
			}
			d.errorf(node, path, "%s", d.pointMessage(s, pe))
			continue
		}
		d.errorf(s.curveNode, cpath, "%s", d.curveMessage(s, e))
	}
}

// pointMessage words a curves.PointError in the file's units.
func (d *decoder) pointMessage(s *pumpSpec, pe *curves.PointError) string {
	cur, prev := d.pointAt(s, pe.Index), d.pointAt(s, pe.Index-1)
	switch {
	case errors.Is(pe.Err, curves.ErrDuplicateFlow):
		return fmt.Sprintf("%s repeats the flow of the point before; each point needs its own flow", d.fmtFlow(cur.Flow))
	case errors.Is(pe.Err, curves.ErrUnsorted):
		return fmt.Sprintf("%s is below the flow of the point before (%s): list the points in order of rising flow", d.fmtFlow(cur.Flow), d.fmtFlow(prev.Flow))
	case errors.Is(pe.Err, curves.ErrRisingHead):
		return fmt.Sprintf("%s is above the %s of the point before: the head curve rises with flow (set allow_rising: true if the datasheet really shows a rising curve)",
			d.fmtHead(cur.Head), d.fmtHead(prev.Head))
	case errors.Is(pe.Err, curves.ErrNoEfficiency):
		return fmt.Sprintf("a point with flow needs an efficiency (%%) or a shaft_power (%s)", d.units.PowerUnit())
	case errors.As(pe.Err, new(*curves.EffMissError)):
		var me *curves.EffMissError
		errors.As(pe.Err, &me)
		others := ""
		if me.Misses > 1 {
			others = fmt.Sprintf(" (the worst of %d points missed by more than that)", me.Misses)
		}
		return fmt.Sprintf("the fitted efficiency curve gives %s %% at %s where %s %% is given, %s points apart, more than the %s-point tolerance%s: "+
			"the fit starts from zero efficiency at zero flow and needs the datasheet's efficiency curve with its rise from low flow "+
			"to the best efficiency point and past it; one constant efficiency at every point is not a pump curve",
			fmtNum(100*me.Fitted), d.fmtFlow(cur.Flow), fmtNum(100*me.Given), fmtNum(100*math.Abs(me.Fitted-me.Given)),
			fmtNum(100*curves.EffMissTolerance), others)
	case pe.Field == "shaft_power":
		return fmt.Sprintf("%s %v at %s and %s", d.fmtPower(cur.Shaft), pe.Err, d.fmtFlow(cur.Flow), d.fmtHead(cur.Head))
	}
	return pe.Err.Error()
}

// pointAt returns the point i as given (SI), or the zero point.
func (d *decoder) pointAt(s *pumpSpec, i int) curves.PumpPoint {
	if i < 0 || i >= len(s.pointNodes) || s.pointNodes[i] == nil {
		return curves.PumpPoint{}
	}
	f := s.pointNodes[i]
	var p curves.PumpPoint
	quiet := &decoder{file: d.file, units: d.units, density: d.density}
	if v := f.vals["flow"]; v != nil {
		fv, _ := quiet.flow(quiet.resolve(v), "", "")
		p.Flow = fv.Q
	}
	if v := f.vals["head"]; v != nil {
		p.Head, _ = quiet.head(quiet.resolve(v), "")
	}
	if v := f.vals["shaft_power"]; v != nil {
		p.Shaft, _ = quiet.power(quiet.resolve(v), "")
	}
	return p
}

// curveMessage words a whole-curve error of curves.NewPump.
func (d *decoder) curveMessage(s *pumpSpec, err error) string {
	switch {
	case errors.Is(err, curves.ErrBEPOutsidePoint):
		return d.bepMessage(s)
	case errors.Is(err, curves.ErrRisingHead):
		if s.headDegree == 3 {
			return "the fitted cubic head curve rises above its shutoff head between the points: check the heads, or set allow_rising: true if the datasheet really shows a rising curve"
		}
		return "the fitted head curve rises above its shutoff head between the points: check the heads, try head_fit: cubic, or set allow_rising: true if the datasheet really shows a rising curve"
	case errors.Is(err, curves.ErrIllConditioned):
		return "the points do not pin down a curve (the least-squares fit is ill-conditioned): spread the flows from near shutoff to runout"
	case errors.Is(err, curves.ErrShutoffHead):
		return "the fitted head at zero flow is not positive: check the heads"
	case errors.Is(err, curves.ErrNegativeFit):
		return "the fitted head curve goes below zero between the points: check the heads"
	case errors.Is(err, curves.ErrEfficiencyFit):
		return "the fitted efficiency curve leaves 0–100 % between the points: check the efficiencies (or shaft powers)"
	case errors.Is(err, curves.ErrTooFewPoints):
		return "too few points with flow for the efficiency fit: give at least 2 points with flow and efficiency or shaft power"
	}
	msg := err.Error()
	if len(msg) > 8 && msg[:8] == "curves: " {
		msg = msg[8:]
	}
	return msg
}

// bepMessage explains a best efficiency point outside the datasheet points
// from the points themselves.
func (d *decoder) bepMessage(s *pumpSpec) string {
	type pe struct {
		q curves.Flow
		e float64
	}
	var pts []pe
	for i := range s.pointNodes {
		p := d.pointAt(s, i)
		e := 0.0
		if f := s.pointNodes[i]; f != nil {
			if v := f.vals["efficiency"]; v != nil {
				quiet := &decoder{units: d.units}
				e, _ = quiet.percent(quiet.resolve(v), "", "")
			} else if p.Shaft > 0 {
				e = float64(curves.HydraulicPower(curves.ReferenceDensity, p.Flow, p.Head)) / float64(p.Shaft)
			}
		}
		if p.Flow > 0 {
			pts = append(pts, pe{p.Flow, e})
		}
	}
	base := "the best efficiency point of the fitted curve lies outside the datasheet points"
	if len(pts) == 0 {
		return base
	}
	best := 0
	for i, p := range pts {
		if p.e > pts[best].e {
			best = i
		}
	}
	last := pts[len(pts)-1]
	switch best {
	case len(pts) - 1:
		return fmt.Sprintf("%s: the efficiency still rises at the last point (%s %% at %s); add points past the best efficiency point",
			base, fmtNum(100*last.e), d.fmtFlow(last.q))
	case 0:
		return fmt.Sprintf("%s: the efficiency falls from the first point with flow (%s %% at %s); add points below the best efficiency point",
			base, fmtNum(100*pts[0].e), d.fmtFlow(pts[0].q))
	}
	return base + ": add points close to both sides of the peak efficiency"
}

// motor reads the motor of a pump model and fills in its defaults.
func (d *decoder) motor(n *yaml.Node, path string, s *pumpSpec) (curves.Motor, bool) {
	var m curves.Motor
	f := d.mapping(n, path, "the motor: rated_output, full_load_efficiency, service_factor, part_load",
		"rated_output", "full_load_efficiency", "service_factor", "part_load")
	if f == nil {
		return m, false
	}
	ok := true
	rn := d.required(f, "rated_output", "the motor's rated output ("+d.units.PowerUnit()+")")
	s.ratedNode = rn
	var rok bool
	m.Rated, rok = d.power(rn, join(path, "rated_output"))
	ok = ok && rok
	if en := d.value(f, "full_load_efficiency"); en != nil {
		e, eok := d.efficiency(en, join(path, "full_load_efficiency"))
		if eok && e < 0.5 {
			d.errorf(en, join(path, "full_load_efficiency"), "%s %% is below any induction motor's full-load efficiency (50 %% or more)", fmtNum(100*e))
			eok = false
		}
		m.FullLoadEff = e
		ok = ok && eok
	} else if !f.has("full_load_efficiency") && rok && s.rpmOK && d.iecMotor(s) {
		e, err := curves.IE3Efficiency(m.Rated)
		if err != nil {
			d.errorf(f.node, join(path, "full_load_efficiency"), "missing, and no default for a %s motor (the IE3 table covers 0.75–375 kW): give full_load_efficiency",
				d.fmtPower(m.Rated))
			ok = false
		} else {
			m.FullLoadEff = e
			poles, _ := polesFor(s.model.RatedSpeed)
			note := ""
			if poles != 4 {
				note = fmt.Sprintf("; the 4-pole value used for this %d-pole motor, whose IE3 value differs by about a point: give full_load_efficiency for a better figure", poles)
			}
			d.defaultf(join(path, "full_load_efficiency"), "%s %% (IEC 60034-30-1 IE3, 4-pole 50 Hz table, %s, the smaller table size when between two%s)",
				fmtNum(100*e), d.fmtPower(m.Rated), note)
		}
	} else if !f.has("full_load_efficiency") && rok && s.rpmOK {
		poles, pok := polesFor(s.model.RatedSpeed)
		var err error
		if pok {
			m.FullLoadEff, err = curves.PremiumEfficiency(m.Rated, poles)
		}
		switch {
		case !pok:
			d.errorf(f.node, join(path, "full_load_efficiency"), "missing, and no default: %s rpm is not the speed of a 2-, 4- or 6-pole motor on 50 or 60 Hz (give full_load_efficiency)",
				fmtNum(s.model.RatedSpeed))
			ok = false
		case err != nil && m.Rated < curves.Horsepower:
			d.errorf(rn, join(path, "rated_output"), "%s is smaller than any motor of the NEMA Premium table (1–500 hp), which gives the default efficiency: check the rating and its unit (%s), or give full_load_efficiency for a fractional-horsepower motor",
				d.fmtPower(m.Rated), d.units.PowerUnit())
			ok = false
		case err != nil:
			d.errorf(f.node, join(path, "full_load_efficiency"), "missing, and no default for a %s motor (the NEMA Premium table covers 1–500 hp): give full_load_efficiency",
				d.fmtPower(m.Rated))
			ok = false
		default:
			size := d.fmtPower(m.Rated)
			if d.units == curves.SI {
				size += fmt.Sprintf(" = %s hp", fmtNum(float64(m.Rated)/curves.Horsepower))
			}
			d.defaultf(join(path, "full_load_efficiency"), "%s %% (NEMA Premium, 10 CFR 431.25 Table 5, enclosed %d-pole motor, %s, the smaller table size when between two; poles from rated speed %s rpm)",
				fmtNum(100*m.FullLoadEff), poles, size, fmtNum(s.model.RatedSpeed))
		}
	} else {
		ok = false
	}
	if sn := d.value(f, "service_factor"); sn != nil {
		sf, sok := d.number(sn, join(path, "service_factor"))
		if sok && (sf < 1 || sf > 1.5) {
			d.errorf(sn, join(path, "service_factor"), "%s is outside 1.0–1.5", sn.Value)
			sok = false
		}
		m.ServiceFactor = sf
		ok = ok && sok
	} else if !f.has("service_factor") && s.rpmOK && d.iecMotor(s) {
		m.ServiceFactor = curves.IECServiceFactor
		d.defaultf(join(path, "service_factor"), "1.0 (an IEC-rated motor has no service factor, common practice)")
	} else if !f.has("service_factor") {
		m.ServiceFactor = curves.DefaultServiceFactor
		d.defaultf(join(path, "service_factor"), "%s (usual NEMA value for general-purpose motors, common practice)", fmtNum(curves.DefaultServiceFactor))
	}
	if tn := d.value(f, "part_load"); tn != nil {
		t, tok := d.loadTable(tn, join(path, "part_load"), "the motor's shaft load as a fraction of rated output")
		m.Table = t
		ok = ok && tok
		s.motorTable, s.partLoadNode = tok, tn
	} else if !f.has("part_load") {
		d.defaultf(join(path, "part_load"), "US DOE default part-load loss factor (10 CFR 431 subpart Y, appendix A)")
	}
	return m, ok
}

// polesFor infers the pole count from a rated speed, accepting it only
// when the slip below synchronous speed on 50 or 60 Hz is 0–6 %.
func polesFor(rpm float64) (int, bool) {
	p := curves.PoleCount(rpm)
	if p == 0 {
		return 0, false
	}
	for _, hz := range []float64{50, 60} {
		sync := 120 * hz / float64(p)
		if slip := (sync - rpm) / sync; slip >= -0.01 && slip <= 0.06 {
			return p, true
		}
	}
	return 0, false
}

// loadTable reads a table of (load, efficiency) rows.
func (d *decoder) loadTable(n *yaml.Node, path, loadWhat string) ([]curves.LoadEff, bool) {
	items, ok := d.sequence(n, path, "rows of load and efficiency")
	if !ok {
		return nil, false
	}
	if len(items) < 2 || len(items) > maxTable {
		d.errorf(n, path, "has %d rows; give from 2 to %d", len(items), maxTable)
		return nil, false
	}
	t := make([]curves.LoadEff, 0, len(items))
	var prevNode *yaml.Node
	prevLoad := math.Inf(-1)
	for i, it := range items {
		rp := index(path, i)
		f := d.mapping(it, rp, "a row: load and efficiency", "load", "efficiency")
		if f == nil {
			ok = false
			continue
		}
		ln := d.required(f, "load", loadWhat)
		l, lok := d.ratio(ln, join(rp, "load"), loadWhat, 2)
		if lok && l < 0 {
			d.errorf(ln, join(rp, "load"), "%s: a load must not be negative", ln.Value)
			lok = false
		}
		if lok && prevNode != nil && l <= prevLoad {
			d.errorf(ln, join(rp, "load"), "%s %% is not above the load of the row before (%s %%): list rows by rising load", fmtNum(100*l), fmtNum(100*prevLoad))
			lok = false
		}
		if lok {
			prevNode, prevLoad = ln, l
		}
		e, eok := d.efficiency(d.required(f, "efficiency", "the efficiency at that load (%)"), join(rp, "efficiency"))
		ok = ok && lok && eok
		t = append(t, curves.LoadEff{Load: l, Eff: e})
	}
	if ok {
		if err := curves.CheckTable(t); err != nil {
			d.errorf(n, path, "%v", err)
			ok = false
		}
	}
	return t, ok
}

var driveKeys = []string{"type", "efficiency_table", "iec_losses"}

// drive reads the drive: "fixed", "variable" (DOE default losses), or a
// mapping with a loss table.
func (d *decoder) drive(n *yaml.Node, path string, s *pumpSpec) (curves.Drive, bool, bool) {
	if n == nil {
		return curves.FixedSpeed{}, false, false
	}
	s.driveNode = n
	if n.Kind == yaml.ScalarNode {
		switch v, _ := d.text(n, path); v {
		case "fixed":
			return curves.FixedSpeed{}, false, true
		case "variable":
			s.doeDrive = true
			d.defaultf(path, "variable speed with the US DOE default motor-and-drive part-load loss (10 CFR 431 subpart Y, appendix A), floored at the motor's own part-load loss where the fit falls below it (light load)")
			return curves.DOEDrive{}, true, true
		case "":
			return curves.FixedSpeed{}, false, false
		default:
			d.errorf(n, path, "must be variable or fixed (or a mapping with type and a loss table), not %q", clip(v))
			return curves.FixedSpeed{}, false, false
		}
	}
	f := d.mapping(n, path, "type and optionally efficiency_table or iec_losses", driveKeys...)
	if f == nil {
		return curves.FixedSpeed{}, false, false
	}
	tn := d.required(f, "type", "variable or fixed")
	typ, ok := d.text(tn, join(path, "type"))
	if ok && typ != "variable" && typ != "fixed" {
		d.errorf(tn, join(path, "type"), "must be variable or fixed, not %q", clip(typ))
		ok = false
	}
	et, il := d.value(f, "efficiency_table"), d.value(f, "iec_losses")
	if typ == "fixed" {
		for _, k := range []struct {
			n   *yaml.Node
			key string
		}{{et, "efficiency_table"}, {il, "iec_losses"}} {
			if k.n != nil {
				d.errorf(k.n, join(path, k.key), "a fixed-speed unit has no drive; remove %s", k.key)
				ok = false
			}
		}
		return curves.FixedSpeed{}, false, ok
	}
	switch {
	case et != nil && il != nil:
		d.errorf(il, join(path, "iec_losses"), "give efficiency_table or iec_losses, not both")
		return curves.DOEDrive{}, true, false
	case et != nil:
		t, tok := d.loadTable(et, join(path, "efficiency_table"), "the drive's load as a fraction of the motor's rated input")
		return curves.TableDrive{Table: t}, true, ok && tok
	case il != nil:
		dr, dok := d.iecTable(il, join(path, "iec_losses"))
		return dr, true, ok && dok
	}
	if !f.has("efficiency_table") && !f.has("iec_losses") {
		s.doeDrive = true
		d.defaultf(path, "variable speed with the US DOE default motor-and-drive part-load loss (10 CFR 431 subpart Y, appendix A), floored at the motor's own part-load loss where the fit falls below it (light load)")
	}
	return curves.DOEDrive{}, true, ok
}

// iecTable reads an IEC 61800-9-2 eight-point loss table.
func (d *decoder) iecTable(n *yaml.Node, path string) (curves.IECDrive, bool) {
	items, ok := d.sequence(n, path, "the eight IEC 61800-9-2 loss points: speed, torque, loss")
	if !ok {
		return curves.IECDrive{}, false
	}
	var pts []curves.IECPoint
	seen := map[[2]float64]int{}
	for i, it := range items {
		rp := index(path, i)
		f := d.mapping(it, rp, "a loss point: speed (%), torque (%), loss (% of rated power)", "speed", "torque", "loss")
		if f == nil {
			ok = false
			continue
		}
		sp, sok := d.number(d.required(f, "speed", "the relative speed in % (0, 50 or 90)"), join(rp, "speed"))
		tq, tok := d.number(d.required(f, "torque", "the relative torque in % (25, 50 or 100)"), join(rp, "torque"))
		ln := d.required(f, "loss", "the loss in % of rated power")
		loss, lok := d.percent(ln, join(rp, "loss"), "a loss")
		if lok && (loss < 0 || loss >= 1) {
			d.errorf(ln, join(rp, "loss"), "%s %% must be from 0 to below 100 %%", fmtNum(100*loss))
			lok = false
		}
		if sok && tok {
			key := [2]float64{sp, tq}
			valid := false
			for _, q := range curves.IECPoints {
				valid = valid || q == key
			}
			switch j, dup := seen[key]; {
			case !valid:
				d.errorf(f.node, rp, "(%s;%s) is not one of the IEC 61800-9-2 points (0;25) (0;50) (0;100) (50;25) (50;50) (50;100) (90;50) (90;100)", fmtNum(sp), fmtNum(tq))
				sok = false
			case dup:
				d.errorf(f.node, rp, "(%s;%s) is given twice (also %s)", fmtNum(sp), fmtNum(tq), index(path, j))
				sok = false
			default:
				seen[key] = i
			}
		}
		ok = ok && sok && tok && lok
		pts = append(pts, curves.IECPoint{Speed: sp, Torque: tq, LossPct: 100 * loss})
	}
	if ok && len(seen) != 8 {
		var missing []string
		for _, q := range curves.IECPoints {
			if _, has := seen[q]; !has {
				missing = append(missing, fmt.Sprintf("(%s;%s)", fmtNum(q[0]), fmtNum(q[1])))
			}
		}
		d.errorf(n, path, "needs all eight IEC 61800-9-2 points; missing %v", missing)
		return curves.IECDrive{}, false
	}
	if !ok {
		return curves.IECDrive{}, false
	}
	dr, err := curves.NewIECDrive(pts)
	if err != nil {
		d.errorf(n, path, "%v", err)
		return dr, false
	}
	return dr, true
}

// branchLoss reads a per-unit branch loss: the head lost in the unit's own
// piping at a flow (default: its BEP flow).
func (d *decoder) branchLoss(n *yaml.Node, path string) *branchSpec {
	f := d.mapping(n, path, "head and optionally flow", "head", "flow")
	if f == nil {
		return nil
	}
	hn := d.required(f, "head", "the head lost in the unit's branch at the flow")
	h, ok := d.head(hn, join(path, "head"))
	if !ok {
		return nil
	}
	b := &branchSpec{head: h, node: hn}
	if fn := d.value(f, "flow"); fn != nil {
		fv, fok := d.flow(fn, join(path, "flow"), "BEP flow")
		if !fok {
			return nil
		}
		if fv.Q == 0 && !fv.IsPct || fv.IsPct && fv.Pct == 0 {
			d.errorf(fn, join(path, "flow"), "the flow of a branch loss must be above zero")
			return nil
		}
		b.flow = &fv
	} else if !f.has("flow") {
		b.flow = nil
	}
	return b
}

// finishPump resolves the flows given as % of BEP and checks them against
// the fitted curve.
func (d *decoder) finishPump(s *pumpSpec) {
	m := &s.model
	if m.Pump == nil {
		return
	}
	bep := m.Pump.BEPFlow
	path := s.path
	if s.minFlow != nil {
		m.MinFlow = s.minFlow.of(bep)
	} else if !s.f.has("min_flow") {
		m.MinFlow = curves.Flow(DefaultMinFlowPct / 100 * float64(bep))
		d.defaultf(join(path, "min_flow"), "%s (%g %% of the fitted BEP flow %s; common practice — use the manufacturer's minimum continuous stable flow)",
			d.fmtFlow(m.MinFlow), DefaultMinFlowPct, d.fmtFlow(bep))
	}
	if s.runout != nil {
		m.Runout = s.runout.of(bep)
	} else if !s.f.has("runout") {
		m.Runout = m.Pump.LastFlow
		d.defaultf(join(path, "runout"), "%s (the last datasheet point)", d.fmtFlow(m.Runout))
	}
	if s.minFlow != nil && m.MinFlow >= bep {
		d.errorf(s.minFlow.node, join(path, "min_flow"), "%s is not below the fitted BEP flow %s", d.fmtFlow(m.MinFlow), d.fmtFlow(bep))
	}
	if s.runout != nil {
		switch {
		case m.Runout <= bep:
			d.errorf(s.runout.node, join(path, "runout"), "%s is not above the fitted BEP flow %s", d.fmtFlow(m.Runout), d.fmtFlow(bep))
		case m.Runout > m.Pump.LastFlow*1.0001:
			d.warnf(s.runout.node, join(path, "runout"), "%s is past the last datasheet point (%s): the curve is extrapolated there", d.fmtFlow(m.Runout), d.fmtFlow(m.Pump.LastFlow))
		}
	}
	if s.branch != nil {
		q := bep
		if s.branch.flow != nil {
			q = s.branch.flow.of(bep)
		}
		m.BranchK = float64(s.branch.head) / (float64(q) * float64(q))
		if s.branch.flow == nil {
			d.defaultf(join(path, "branch_loss.flow"), "%s (the fitted BEP flow)", d.fmtFlow(q))
		}
		if s.branch.head >= m.Pump.BEPHead {
			d.errorf(s.branch.node, join(path, "branch_loss.head"), "%s is not below the pump's head at that flow (about %s): check the value", d.fmtHead(s.branch.head), d.fmtHead(m.Pump.BEPHead))
		}
	}
}

// iecMotor reports whether a motor takes the IEC defaults: a file in SI
// units, or a rated speed that belongs to a 50 Hz supply. A US file with a
// 60 Hz speed takes the NEMA ones.
func (d *decoder) iecMotor(s *pumpSpec) bool {
	hz := curves.SupplyHz(s.model.RatedSpeed)
	return hz != 0 && (d.units == curves.SI || hz == 50)
}
