package plant

import (
	"fmt"
	"strings"

	"wattstage/curves"
)

// Thresholds of the size checks. A pump whose shaft power at its own BEP
// is more than tooLarge times (or less than tooSmall times) its motor
// rating cannot be the pump that motor drives: the flows or heads were
// almost surely typed in the wrong unit (gallons per hour for gpm, L/s for
// m³/h, m³/s…), so the mistake is reported as one, not as an undersized
// motor.
const (
	tooLarge = 10.0
	tooSmall = 0.01
)

// checkPlant compares each pump model with its motor and with the system.
// It needs the file's unit system to word its findings, and runs only on
// the parts that were read without error.
func (d *decoder) checkPlant(specs []*pumpSpec, sys *systemSpec) {
	if !d.unitsKnown {
		return
	}
	allFitted := len(specs) > 0
	var fitted []*pumpSpec
	for _, s := range specs {
		if s == nil || s.model.Pump == nil {
			allFitted = false
			continue
		}
		fitted = append(fitted, s)
		if !s.motorOK {
			continue
		}
		if d.checkSize(s) && sys != nil && sys.ok {
			d.checkMotorAtDesign(s, sys)
		}
	}
	if sys == nil || !sys.ok || len(fitted) == 0 {
		return
	}
	d.checkShutoff(fitted, allFitted, sys)
	if allFitted {
		d.checkCapacity(fitted, sys)
	}
}

// checkSize compares the pump's shaft power at BEP with its motor rating.
func (d *decoder) checkSize(s *pumpSpec) bool {
	p, m := s.model.Pump, s.model.Motor
	shaft := p.ShaftPower(p.BEPFlow, 1, d.density)
	ratio := float64(shaft) / float64(m.Rated)
	var how string
	switch {
	case ratio > tooLarge:
		how = fmt.Sprintf("%s times its %s motor: the flows or heads look far too large", fmtNum(ratio), d.fmtPower(m.Rated))
	case ratio < tooSmall:
		how = fmt.Sprintf("1/%s of its %s motor: the flows or heads look far too small", fmtNum(1/ratio), d.fmtPower(m.Rated))
	default:
		return true
	}
	d.errorf(s.curveNode, join(s.path, "curve"), "at its fitted BEP (%s at %s) the pump would take %s, %s — check their units (this file is read in %s and %s)",
		d.fmtFlow(p.BEPFlow), d.fmtHead(p.BEPHead), d.fmtPower(shaft), how, d.units.FlowUnit(), d.units.HeadUnit())
	return false
}

// checkMotorAtDesign compares the motor with the pump's shaft power at
// rated speed against the design head: the duty a unit sees at design
// flow. Above rated output times the service factor the motor cannot run
// there continuously (an error); between the two it runs into its service
// factor (a warning).
func (d *decoder) checkMotorAtDesign(s *pumpSpec, sys *systemSpec) {
	p, m := s.model.Pump, s.model.Motor
	q, ok := p.FlowAt(1, sys.designHead)
	if !ok || q <= 0 {
		return
	}
	if s.model.Runout > 0 && q > s.model.Runout {
		q = s.model.Runout
	}
	shaft := p.ShaftPower(q, 1, d.density)
	duty := fmt.Sprintf("%s at %s and %s, rated speed", d.fmtPower(shaft), d.fmtFlow(q), d.fmtHead(sys.designHead))
	switch {
	case shaft > m.Rated*curves.Power(m.SF()):
		d.errorf(s.ratedNode, join(s.path, "motor.rated_output"), "%s is less than the pump's shaft power at the design head (%s), even with service factor %s",
			d.fmtPower(m.Rated), duty, fmtNum(m.SF()))
	case shaft > m.Rated:
		d.warnf(s.ratedNode, join(s.path, "motor.rated_output"), "%s runs into its service factor at the design head (%s)", d.fmtPower(m.Rated), duty)
	}
}

// checkShutoff refuses a design head above every model's highest head at
// its maximum speed (the shutoff head, or the peak of a humped curve, which
// lies above it), and warns of models that cannot reach it.
func (d *decoder) checkShutoff(fitted []*pumpSpec, allFitted bool, sys *systemSpec) {
	var short []string
	for _, s := range fitted {
		sh := curves.Head(float64(s.model.Pump.MaxHead()) * s.model.MaxSpeed * s.model.MaxSpeed)
		if sh > sys.designHead {
			continue
		}
		short = append(short, fmt.Sprintf("%s %s at %s %%", s.path, d.fmtHead(sh), fmtNum(100*s.model.MaxSpeed)))
	}
	switch {
	case len(short) == 0:
	case len(short) == len(fitted) && allFitted:
		d.errorf(sys.headNode, "system.design_head", "%s is above the highest head (shutoff, or the peak of a humped curve) of every pump at its maximum speed (%s): no unit can deliver the design head",
			d.fmtHead(sys.designHead), strings.Join(short, ", "))
	default:
		for _, s := range short {
			d.warnf(sys.headNode, "system.design_head", "%s is not below the highest head (shutoff, or the peak of a humped curve) of %s: that unit cannot run at design head", d.fmtHead(sys.designHead), s)
		}
	}
}

// checkCapacity compares what every unit together delivers at the design
// head and maximum speed with the design flow.
func (d *decoder) checkCapacity(fitted []*pumpSpec, sys *systemSpec) {
	total := curves.Flow(0)
	for _, s := range fitted {
		m := s.model
		q, ok := m.Pump.FlowAt(m.MaxSpeed, sys.designHead)
		if !ok {
			continue
		}
		if lim := curves.Flow(float64(m.Runout) * m.MaxSpeed); m.Runout > 0 && q > lim {
			q = lim
		}
		if m.Count > 0 {
			total += q * curves.Flow(m.Count)
		}
	}
	switch {
	case total <= 0:
	case total*tooLarge < sys.designFlow:
		d.errorf(sys.flowNode, "system.design_flow", "%s is %s times what every unit together delivers at the design head (%s): check the flow unit (this file is read in %s)",
			d.fmtFlow(sys.designFlow), fmtNum(float64(sys.designFlow/total)), d.fmtFlow(total), d.units.FlowUnit())
	case total < sys.designFlow*0.999:
		d.warnf(sys.flowNode, "system.design_flow", "every unit together at maximum speed delivers %s at the design head %s, short of the design flow %s",
			d.fmtFlow(total), d.fmtHead(sys.designHead), d.fmtFlow(sys.designFlow))
	}
}
