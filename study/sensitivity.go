package study

import (
	"wattstage/curves"
	"wattstage/plant"
)

// Sensitivity describes one variant of the plant for the savings range.
type Sensitivity struct {
	Label        string
	ControlScale float64 // control head (or static head) multiplied by this; 1 = as given
	LossScale    float64 // motor and drive losses multiplied by this; 1 = as given
}

// DefaultSensitivities are the cases of the savings range: the control
// head (static head on a fixed curve) and the motor-plus-drive losses, each
// moved by ±25 % on its own, the spread of setpoints seen on site and of
// part-load loss data (common practice; the bounds are stated in every
// report). One at a time, because savings need not move the same way with
// both: on a plant already on drives, a higher and a lower control head can
// both widen the gap between two sequences.
var DefaultSensitivities = []Sensitivity{
	{Label: "control head +25 %", ControlScale: 1.25, LossScale: 1},
	{Label: "control head −25 %", ControlScale: 0.75, LossScale: 1},
	{Label: "motor and drive losses +25 %", ControlScale: 1, LossScale: 1.25},
	{Label: "motor and drive losses −25 %", ControlScale: 1, LossScale: 0.75},
}

// Vary returns a copy of the plant with the sensitivity applied: every
// unit's losses (drive and motor, across-the-line units too) scaled by
// LossScale, and the control head (or static head) by ControlScale, capped
// at the design head. Strategies built on the copy — the fixed-speed and
// partial-retrofit variants included — keep the scale (curves.Rewire).
func Vary(p *plant.Plant, s Sensitivity) *plant.Plant {
	q := *p
	q.Models = append([]plant.Model(nil), p.Models...)
	for i := range q.Models {
		q.Models[i].Drive = curves.ScaledLoss{Drive: q.Models[i].Drive, Factor: s.LossScale}
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
