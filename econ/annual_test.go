package econ

import (
	"math"
	"testing"
	"time"
)

// Annualise on hand-countable series: energy scales by the factor, demand
// is the covered months' mean charge times 12, each month weighted by the
// share of it covered; an untimed bill keeps its 12 months of demand.
func TestAnnualise(t *testing.T) {
	tr := Tariff{EnergyPrice: 0.10, DemandCharge: 10}
	at := func(y int, m time.Month, d int) time.Time { return time.Date(y, m, d, 0, 0, 0, 0, time.UTC) }
	// All of June 2025 (720 h) at 50 kW, and 1 July at 80 kW for 24 h.
	series := []Sample{{Start: at(2025, 6, 1), Hours: 720, Power: 50e3}, {Start: at(2025, 7, 1), Hours: 24, Power: 80e3}}
	b, err := Cost(tr, series)
	if err != nil {
		t.Fatal(err)
	}
	f := 8760.0 / 744
	a := b.Annualise(f)
	// Hand count: energy 50·720 + 80·24 = 37,920 kWh; June charge 500,
	// July 800 with weight 24/744; mean (500 + 800·24/744)/(1 + 24/744).
	wJul := 24.0 / 744
	wantDemand := 12 * (500 + 800*wJul) / (1 + wJul)
	for _, c := range []struct {
		what      string
		got, want float64
	}{
		{"energy", a.Energy, 37920 * f},
		{"energy cost", a.EnergyCost, 3792 * f},
		{"demand cost", a.DemandCost, wantDemand},
		{"billed demand", a.BilledDemand, 12 * (50 + 80*wJul) / (1 + wJul)},
		{"total", a.Total, 3792*f + wantDemand},
	} {
		if math.Abs(c.got-c.want) > 1e-9*c.want {
			t.Errorf("%s = %v, want %v", c.what, c.got, c.want)
		}
	}
	// Untimed: the highest bin power billed 12 times, not scaled.
	u, err := Cost(tr, []Sample{{Hours: 4380, Power: 30e3}, {Hours: 4380, Power: 60e3}})
	if err != nil {
		t.Fatal(err)
	}
	if ua := u.Annualise(1); ua.DemandCost != 12*60*10 || ua.BilledDemand != 720 {
		t.Errorf("untimed demand %v (billed %v kW·month), want 7,200 (720)", ua.DemandCost, ua.BilledDemand)
	}
	// Sample costs add up to the energy cost.
	sum := 0.0
	for _, c := range b.SampleCost {
		sum += c
	}
	if math.Abs(sum-b.EnergyCost) > 1e-9*b.EnergyCost {
		t.Errorf("sample costs add up to %v, energy cost %v", sum, b.EnergyCost)
	}
}
