package optimize

import (
	"encoding/json"
	"math"
)

// MarshalJSON writes the speeds that do not exist (NaN) as null.
func (t Threshold) MarshalJSON() ([]byte, error) {
	type plain Threshold
	return json.Marshal(struct {
		plain
		Speed, After, SpeedAfter *float64
		DelayMin                 float64
	}{plain(t), finiteOrNil(t.Speed), finiteOrNil(t.After), finiteOrNil(t.SpeedAfter), t.Delay.Minutes()})
}

// MarshalJSON writes the speeds that do not exist (NaN) as null.
func (s Stage) MarshalJSON() ([]byte, error) {
	type plain Stage
	return json.Marshal(struct {
		plain
		LowSpeed, HighSpeed *float64
	}{plain(s), finiteOrNil(s.LowSpeed), finiteOrNil(s.HighSpeed)})
}

func finiteOrNil(v float64) *float64 {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return nil
	}
	return &v
}
