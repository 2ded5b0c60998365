package optimize

import (
	"encoding/csv"
	"encoding/json"
	"fmt"
	"io"
	"math"
	"strings"
)

// Table is one table of the sequence's submittal: named columns, the unit
// in each column's name (flow_gpm, delay_min), rows of values in the
// plant's display units; nil stands for a value that does not exist.
type Table struct {
	Name    string
	Columns []string
	Rows    [][]any
}

// unitKey writes a unit for a column name: gpm, m3h, ls, ft, m, psi, kpa.
func unitKey(u string) string {
	r := strings.NewReplacer("³", "3", "/", "", " ", "", "·", "")
	return strings.ToLower(r.Replace(u))
}

// Tables are the setpoint table, the stages, the DP schedule and the points
// list, ready for CSV or JSON.
func (sp *Setpoints) Tables() []Table {
	p := sp.Plant
	u := p.Units
	fk := unitKey(u.FlowUnit())
	stages := Table{Name: "stages", Columns: []string{"stage", "runs", "low_flow_" + fk, "high_flow_" + fk}}
	for _, st := range sp.Stages {
		stages.Rows = append(stages.Rows, []any{st.Number, sp.stageWords(st.Counts), sp.FlowSetpoint(st.Low), sp.FlowSetpoint(st.High)})
	}
	useSpeed := sp.Signal != FlowBasis
	useFlow := sp.Signal != SpeedBasis
	changes := Table{Name: "staging", Columns: []string{"change", "action", "signal", "flow_" + fk, "speed_pct", "delay_min",
		"band_low_flow_" + fk, "band_high_flow_" + fk, "set_by"}}
	for _, t := range sp.Transitions {
		for _, dir := range []struct {
			name        string
			th          Threshold
			start, stop []int
		}{{fmt.Sprintf("%d to %d", t.From, t.To), t.Up, t.Start, t.Stop}, {fmt.Sprintf("%d to %d", t.To, t.From), t.Down, t.Stop, t.Start}} {
			var flow, speed, lo, hi any
			sig := sp.Signal.String()
			if useFlow || math.IsNaN(dir.th.Speed) {
				flow = sp.FlowSetpoint(dir.th.Flow)
			}
			if useSpeed && !math.IsNaN(dir.th.Speed) {
				speed = math.Round(100 * dir.th.Speed)
			} else if useSpeed {
				sig = "flow" // no usable speed at this change
			}
			if t.Band != nil {
				lo, hi = sp.BandSetpoints(*t.Band)
			}
			set := string(dir.th.Limit)
			changes.Rows = append(changes.Rows, []any{dir.name, StartStop(p, dir.start, dir.stop), sig, flow, speed,
				dir.th.Delay.Minutes(), lo, hi, set})
		}
	}
	out := []Table{changes, stages}
	if rows, _, proposed := sp.DPSchedule(); rows != nil {
		pk, hk := unitKey(u.PressureUnit()), unitKey(u.HeadUnit())
		dp := Table{Name: "dp_schedule", Columns: []string{"load_flow_" + fk, "setpoint_" + pk, "setpoint_" + hk, "pump_head_" + hk, "proposed"}}
		rho := p.Fluid.Density
		for _, r := range rows {
			dp.Rows = append(dp.Rows, []any{round(u.FlowOut(r.Flow), 1), round(u.PressureOut(r.Setpoint, rho), 2),
				round(u.HeadOut(r.Setpoint), 2), round(u.HeadOut(r.PumpHead), 2), proposed})
		}
		out = append(out, dp)
	}
	pts := Table{Name: "points", Columns: []string{"point", "kind", "unit", "description"}}
	for _, pt := range sp.PointsList() {
		pts.Rows = append(pts.Rows, []any{pt.Name, pt.Kind, pt.Unit, pt.Description})
	}
	return append(out, pts)
}

func round(v float64, dec int) float64 {
	f := math.Pow(10, float64(dec))
	return math.Round(v*f) / f
}

// WriteCSV writes the tables as one CSV stream: each row starts with its
// table's name, each table with a header row, so that one reader (RFC 4180,
// encoding/csv with variable fields) takes the whole file and a
// spreadsheet filter on the first column splits it.
func (sp *Setpoints) WriteCSV(w io.Writer) error {
	cw := csv.NewWriter(w)
	for _, t := range sp.Tables() {
		if err := cw.Write(append([]string{"table"}, t.Columns...)); err != nil {
			return err
		}
		for _, r := range t.Rows {
			rec := []string{t.Name}
			for _, v := range r {
				rec = append(rec, cell(v))
			}
			if err := cw.Write(rec); err != nil {
				return err
			}
		}
	}
	cw.Flush()
	return cw.Error()
}

func cell(v any) string {
	switch x := v.(type) {
	case nil:
		return ""
	case float64:
		return fmt.Sprintf("%g", x)
	}
	return fmt.Sprint(v)
}

// SubmittalJSON is the sequence for a controls submittal as JSON: the
// signal, each table as a list of objects whose keys carry their units.
func (sp *Setpoints) SubmittalJSON() map[string]any {
	tables := map[string]any{}
	for _, t := range sp.Tables() {
		rows := []map[string]any{}
		for _, r := range t.Rows {
			m := map[string]any{}
			for i, c := range t.Columns {
				m[c] = r[i]
			}
			rows = append(rows, m)
		}
		tables[t.Name] = rows
	}
	return map[string]any{"plant": sp.Plant.Name, "signal": sp.Signal.String(), "signal_reason": sp.SignalWhy,
		"flow_resolution_" + unitKey(sp.Plant.Units.FlowUnit()): sp.Resolution(), "tables": tables}
}

var _ json.Marshaler = (*Basis)(nil)

// MarshalJSON writes a signal by its name.
func (b Basis) MarshalJSON() ([]byte, error) { return json.Marshal(b.String()) }
