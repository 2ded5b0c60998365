package optimize

import (
	"fmt"

	"wattstage/curves"
	"wattstage/plant"
)

// DPPoint is one row of the differential-pressure setpoint schedule.
type DPPoint struct {
	Flow     curves.Flow // plant flow through the load, m³/s
	Setpoint curves.Head // setpoint at the sensor, as head, m
	PumpHead curves.Head // head the pumps then deliver on the control curve, m
}

// ProposedReset is the reset wattstage proposes where a DP-controlled
// plant file gives none: the setpoint falls linearly from the design
// control head at 80 % of design flow to half of it at 40 %. A starting
// value to be replaced by a reset on valve position (the valve that needs
// the most pressure), as energy codes ask for with DDC valve control; it is
// not in the energy figures, which use the file's system.
func ProposedReset(dp curves.DPControl) curves.Reset {
	return curves.Reset{LowFlow: 0.4 * dp.DesignFlow, LowHead: dp.ControlHead / 2, HighFlow: 0.8 * dp.DesignFlow}
}

// DPSchedule returns the setpoint against load at 10 % steps of the design
// flow: the file's reset, or the proposed one (proposed true) where the
// file gives none. Nil for a system that is not under DP control.
func (sp *Setpoints) DPSchedule() (rows []DPPoint, reset curves.Reset, proposed bool) {
	dp, ok := sp.Plant.System.(curves.DPControl)
	if !ok {
		return nil, curves.Reset{}, false
	}
	if dp.Reset != nil {
		reset = *dp.Reset
	} else {
		reset, proposed = ProposedReset(dp), true
		dp.Reset = &reset
	}
	for k := 1; k <= 10; k++ {
		q := dp.DesignFlow * curves.Flow(float64(k)/10)
		rows = append(rows, DPPoint{Flow: q, Setpoint: dp.ControlAt(q), PumpHead: dp.Required(q)})
	}
	return rows, reset, proposed
}

// IOPoint is one input or output the sequence needs in the automation
// system.
type IOPoint struct {
	Name        string
	Kind        string // AI, AO, DI or DO (analog or digital, input or output of the controller)
	Unit        string // engineering unit; "" for a digital point
	Description string
}

// PointsList lists the points the sequence reads and writes: the plant flow
// meter, the DP sensor (DP control), the bypass valve (plant minimum flow),
// and per installed unit (standby included) its start/stop, run status and
// proof of flow, and on a drive its speed command, speed feedback and fault.
func (sp *Setpoints) PointsList() []IOPoint {
	p := sp.Plant
	u := p.Units
	out := []IOPoint{{Name: "Plant flow", Kind: "AI", Unit: u.FlowUnit(),
		Description: "flow at the pumps, bypass flow included"}}
	if _, ok := p.System.(curves.DPControl); ok {
		where := p.DPSensor
		if where == "" {
			where = "the remote sensor (location not in the file)"
		}
		out = append(out, IOPoint{Name: "Loop differential pressure", Kind: "AI", Unit: u.PressureUnit(),
			Description: "at " + where})
	}
	if p.MinFlow > 0 {
		out = append(out, IOPoint{Name: "Bypass valve", Kind: "AO", Unit: "%",
			Description: fmt.Sprintf("holds the plant minimum flow of %s", sp.flowWords(p.MinFlow))})
	}
	for _, m := range p.Models {
		for k := 0; k < m.Installed(); k++ {
			out = append(out, unitPoints(m, k)...)
		}
	}
	return out
}

func unitPoints(m plant.Model, k int) []IOPoint {
	tag := m.Tag(k)
	pts := []IOPoint{
		{Name: tag + " start/stop", Kind: "DO", Description: "run command"},
		{Name: tag + " run status", Kind: "DI", Description: "motor running"},
		{Name: tag + " proof of flow", Kind: "DI", Description: "flow switch or DP switch"},
	}
	if m.Drive.Variable() {
		pts = append(pts,
			IOPoint{Name: tag + " speed command", Kind: "AO", Unit: "%", Description: "common speed, % of rated"},
			IOPoint{Name: tag + " speed feedback", Kind: "AI", Unit: "%", Description: "drive output speed"},
			IOPoint{Name: tag + " drive fault", Kind: "DI", Description: "drive trip"})
	}
	return pts
}
