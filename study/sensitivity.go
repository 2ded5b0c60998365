package optimize

import (
	"wattstage/curves"
	"wattstage/plant"
)

// ScaledLoss wraps a drive and scales every loss between shaft and wire by
// Factor (1 = unchanged), to test how savings depend on the motor and drive
// defaults.
type ScaledLoss struct {
	Drive  curves.Drive
	Factor float64
}

var _ curves.Drive = ScaledLoss{}

func (d ScaledLoss) Variable() bool   { return d.Drive.Variable() }
func (d ScaledLoss) Describe() string { return d.Drive.Describe() }
func (d ScaledLoss) Electrical(m curves.Motor, shaft curves.Power, speed float64) curves.Power {
	return shaft + curves.Power(d.Factor*float64(d.Drive.Electrical(m, shaft, speed)-shaft))
}
func (d ScaledLoss) Input(m curves.Motor, shaft curves.Power, speed float64) curves.Chain {
	c := d.Drive.Input(m, shaft, speed)
	loss := float64(c.Electrical - c.Shaft)
	c.Electrical = c.Shaft + curves.Power(d.Factor*loss)
	if c.MotorEff > 0 && c.DriveEff > 0 {
		// Keep the split's proportions: scale each loss share alike.
		motorLoss := float64(shaft)/c.MotorEff - float64(shaft)
		motorIn := float64(shaft) + d.Factor*motorLoss
		c.MotorEff = float64(shaft) / motorIn
		c.DriveEff = motorIn / float64(c.Electrical)
	}
	return c
}

// Sensitivity describes one variant of the plant for the savings range.
type Sensitivity struct {
	Label        string
	ControlScale float64 // control head (or static head) multiplied by this
	LossScale    float64 // motor and drive losses multiplied by this
}

// DefaultSensitivities are the cases of the savings range: the
// control head and the motor/drive losses moved by ±25 %, the spread of
// setpoints seen on site and of part-load loss data (common practice; the
// bounds are stated in every report).
var DefaultSensitivities = []Sensitivity{
	{Label: "control head and losses +25 %", ControlScale: 1.25, LossScale: 1.25},
	{Label: "control head and losses −25 %", ControlScale: 0.75, LossScale: 0.75},
}

// Vary returns a copy of the plant with the sensitivity applied.
func Vary(p *plant.Plant, s Sensitivity) *plant.Plant {
	q := *p
	q.Models = append([]plant.Model(nil), p.Models...)
	for i := range q.Models {
		q.Models[i].Drive = ScaledLoss{Drive: q.Models[i].Drive, Factor: s.LossScale}
	}
	switch sys := p.System.(type) {
	case curves.DPControl:
		sys.ControlHead *= curves.Head(s.ControlScale)
		if sys.ControlHead > sys.DesignHead {
			sys.ControlHead = sys.DesignHead
		}
		if sys.Reset != nil {
			r := *sys.Reset
			r.LowHead *= curves.Head(s.ControlScale)
			if r.LowHead > sys.ControlHead {
				r.LowHead = sys.ControlHead
			}
			sys.Reset = &r
		}
		q.System = sys
	case curves.FixedCurve:
		sys.Static *= curves.Head(s.ControlScale)
		if sys.Static > sys.DesignHead {
			sys.Static = sys.DesignHead
		}
		q.System = sys
	}
	return &q
}
