package cmd

import (
	"time"

	"wattstage/curves"
	"wattstage/econ"
	"wattstage/optimize"
)

type planReport struct {
	Plant      string                   `json:"plant"`
	Units      map[string]string        `json:"units"`
	Baseline   string                   `json:"baseline"`
	Strategies []strategyReport         `json:"strategies"`
	Range      []rangeReport            `json:"savings_range"`
	PartLoad   []optimize.PartLoadCheck `json:"part_load_checks"`
	UnitOut    *unitOutReport           `json:"one_unit_out,omitempty"`
	Warnings   []string                 `json:"warnings,omitempty"`
	Cautions   []string                 `json:"cautions"`
}

type strategyReport struct {
	Key         string          `json:"key"`
	Name        string          `json:"name"`
	Note        string          `json:"note"`
	KWh         float64         `json:"energy_kwh"`
	PeakKW      float64         `json:"peak_kw"`
	HoursUnmet  float64         `json:"hours_unmet"`
	Changes     int             `json:"stage_changes"`
	Drives      int             `json:"drives"`
	DrivesAdded int             `json:"drives_added"`
	Bill        *econ.Bill      `json:"bill"`
	Appraisal   *econ.Appraisal `json:"appraisal,omitempty"`
	Steps       []stepReport    `json:"steps"`
}

type stepReport struct {
	Time    *time.Time `json:"time,omitempty"`
	Load    float64    `json:"load_flow"`
	Hours   float64    `json:"hours"`
	Status  string     `json:"status"`
	Counts  []int      `json:"counts"`
	Speeds  []float64  `json:"speeds"`
	Head    float64    `json:"header_head"`
	PowerKW float64    `json:"power_kw"`
	Limit   string     `json:"limit,omitempty"`
}

type rangeReport struct {
	Case         string  `json:"case"`
	ControlScale float64 `json:"control_head_scale"`
	LossScale    float64 `json:"loss_scale"`
	SavedKWh     float64 `json:"saved_kwh"`
	SavedCost    float64 `json:"saved_cost"`
}

type unitOutReport struct {
	Removed      string    `json:"removed_model"`
	ServesDesign bool      `json:"serves_design_flow"`
	MaxFlow      float64   `json:"max_flow"`
	HeadAtMax    float64   `json:"head_at_max_flow"`
	MotorLoads   []float64 `json:"motor_loads_at_max"`
}

func planJSON(in *planInput, pl *optimize.Plan) planReport {
	p := in.plant
	u := p.Units
	rep := planReport{Plant: p.Name, Baseline: pl.Outcomes[pl.Baseline].Key, PartLoad: pl.PartLoad, Warnings: pl.Warnings,
		Units:    map[string]string{"flow": u.FlowUnit(), "head": u.HeadUnit(), "power": "kW", "currency": p.Tariff.Currency},
		Cautions: cautions}
	for _, o := range pl.Outcomes {
		sr := strategyReport{Key: o.Key, Name: o.Run.Name, Note: o.Run.Note, KWh: o.Energy.KWh, PeakKW: o.Energy.PeakKW,
			HoursUnmet: o.Energy.HoursUnmet, Changes: o.Energy.Changes, Drives: o.Run.Drives, DrivesAdded: o.DrivesAdded,
			Bill: o.Bill, Appraisal: o.Appraisal}
		for i, st := range in.steps {
			r := o.Run.Points[i]
			s := stepReport{Load: u.FlowOut(st.Load), Hours: st.Hours, Status: r.Status.String(), Counts: r.Counts,
				Head: u.HeadOut(r.HeaderHead), PowerKW: float64(r.Power) / curves.KW, Limit: string(r.Limit)}
			if st.Timed() {
				t := st.Time
				s.Time = &t
			}
			for _, un := range r.Units {
				s.Speeds = append(s.Speeds, un.Speed)
			}
			sr.Steps = append(sr.Steps, s)
		}
		rep.Strategies = append(rep.Strategies, sr)
	}
	for _, rc := range pl.Range {
		rep.Range = append(rep.Range, rangeReport{Case: rc.Sensitivity.Label, ControlScale: rc.Sensitivity.ControlScale,
			LossScale: rc.Sensitivity.LossScale, SavedKWh: rc.SavedKWh, SavedCost: rc.SavedCost})
	}
	if uo := pl.UnitOut; uo != nil {
		r := &unitOutReport{Removed: uo.Removed, ServesDesign: uo.ServesDesign, MaxFlow: u.FlowOut(uo.MaxFlow),
			HeadAtMax: u.HeadOut(uo.AtMax.HeaderHead)}
		for _, un := range uo.AtMax.Units {
			r.MotorLoads = append(r.MotorLoads, un.Load)
		}
		rep.UnitOut = r
	}
	return rep
}
