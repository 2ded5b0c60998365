package study

import (
	"wattstage/curves"
	"wattstage/econ"
	"wattstage/optimize"
)

// pricer prices a strategy's steps as they are solved. Time-stamped steps
// (a trend solved interval by interval) go through an econ.Meter one at a
// time, so a trend of any length is priced without keeping its powers;
// untimed steps (bins, a few hundred at most) are kept and priced together
// by econ.Cost, which needs the whole series for its week-share prices.
// Both give the bill econ.Cost gives for the same series, bit for bit.
type pricer struct {
	tariff econ.Tariff
	steps  []optimize.Step
	meter  *econ.Meter // time-stamped steps; nil for bins
	kw     []float64   // bins: each step's input, kW
	costs  []float64   // each step's energy cost, when asked (Bill.SampleCost)
}

// newPricer returns a pricer over the study's steps; keepCosts keeps each
// step's cost in the bill's SampleCost (bins always have them).
func newPricer(r *Result, steps []optimize.Step, keepCosts bool) (*pricer, error) {
	p := &pricer{tariff: r.Plant.Tariff, steps: steps}
	if len(steps) == 0 || !steps[0].Timed() {
		p.kw = make([]float64, len(steps))
		return p, nil
	}
	m, err := econ.NewMeter(p.tariff)
	if err != nil {
		return nil, err
	}
	p.meter = m
	if keepCosts {
		p.costs = make([]float64, 0, len(steps))
	}
	return p, nil
}

// add prices step i at kw and returns its energy cost; for bins the cost
// is known only once every bin is in (bill), and 0 is returned.
func (p *pricer) add(i int, kw float64) float64 {
	if p.meter == nil {
		p.kw[i] = kw
		return 0
	}
	c := p.meter.Add(econ.Sample{Start: p.steps[i].Time, Hours: p.steps[i].Hours, Power: curves.Power(kw * curves.KW)})
	if p.costs != nil {
		p.costs = append(p.costs, c)
	}
	return c
}

// bill finishes the bill once every step is in.
func (p *pricer) bill() (*econ.Bill, error) {
	if p.meter == nil {
		return econ.Cost(p.tariff, samples(p.kw, p.steps))
	}
	b, err := p.meter.Bill()
	if err != nil {
		return nil, err
	}
	b.SampleCost = p.costs
	return b, nil
}

// samples turns a power series into tariff samples.
func samples(kw []float64, steps []optimize.Step) []econ.Sample {
	out := make([]econ.Sample, len(steps))
	for i, st := range steps {
		out[i] = econ.Sample{Start: st.Time, Hours: st.Hours, Power: curves.Power(kw[i] * curves.KW)}
	}
	return out
}
