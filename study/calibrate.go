package study

import (
	"math"
	"wattstage/optimize"
)

// Calibration compares predicted with measured pump power over a trend.
type Calibration struct {
	Strategy string  // the strategy whose predictions are compared
	N        int     // steps with both a prediction and a measurement
	MeanKW   float64 // mean measured power
	MeanErr  float64 // mean of predicted − measured, kW
	NMBE     float64 // normalised mean bias error, fraction of MeanKW; negative when the model predicts more than was measured
	CVRMSE   float64 // coefficient of variation of the RMSE, fraction of MeanKW
	MaxAbs   float64 // largest |predicted − measured|, kW
}

// Calibrate compares a run's predicted input with the measured kW of each
// step. NMBE and CV(RMSE) follow ASHRAE Guideline 14 (from memory), with y
// measured, ŷ predicted, ȳ the measured mean and one model parameter
// (n − 1 degrees of freedom):
//
//	NMBE     = Σ(y − ŷ) / ((n − 1)·ȳ)
//	CV(RMSE) = √(Σ(y − ŷ)² / (n − 1)) / ȳ
//
// so a model that predicts more than was measured has a negative NMBE.
func Calibrate(name string, kw []float64, served []bool, steps []optimize.Step) Calibration {
	c := Calibration{Strategy: name}
	var sumM, sumE, sumE2 float64
	for i, st := range steps {
		if math.IsNaN(st.MeasuredKW) || !served[i] {
			continue
		}
		pred := kw[i]
		e := pred - st.MeasuredKW
		c.N++
		sumM += st.MeasuredKW
		sumE += e
		sumE2 += e * e
		c.MaxAbs = math.Max(c.MaxAbs, math.Abs(e))
	}
	if c.N < 2 {
		return c
	}
	n := float64(c.N)
	c.MeanKW = sumM / n
	c.MeanErr = sumE / n
	if c.MeanKW > 0 {
		c.NMBE = -sumE / ((n - 1) * c.MeanKW)
		c.CVRMSE = math.Sqrt(sumE2/(n-1)) / c.MeanKW
	}
	return c
}

// Guideline 14 hourly calibration criteria (ASHRAE Guideline 14, from
// memory): |NMBE| ≤ 10 %, CV(RMSE) ≤ 30 %.
const (
	MaxHourlyNMBE   = 0.10
	MaxHourlyCVRMSE = 0.30
)

// Calibrated reports whether the comparison meets the hourly criteria.
func (c Calibration) Calibrated() bool {
	return math.Abs(c.NMBE) <= MaxHourlyNMBE && c.CVRMSE <= MaxHourlyCVRMSE
}
