package econ

import (
	"errors"
	"math"
	"reflect"
	"testing"
	"time"

	"wattstage/curves"
)

// A meter fed the samples one by one must give Cost's bill bit for bit
// (same sums in the same order) and each sample's cost as Cost's
// SampleCost: the study prices long trends with the meter and short ones
// with Cost, and the two must not disagree.
func TestMeterMatchesCost(t *testing.T) {
	tar := Tariff{EnergyPrice: 0.08, DemandCharge: 11, EmissionsFactor: 0.4,
		Periods: []Period{{Name: "on-peak", Price: 0.20, StartHour: 12, EndHour: 18, Weekdays: true}}}
	loc, err := time.LoadLocation("America/New_York")
	if err != nil {
		t.Skip("no time zone data:", err)
	}
	// 20-minute intervals over 70 days across a month end and the autumn
	// clock change, with 50-minute intervals here and there crossing hours.
	start := time.Date(2025, 10, 20, 0, 10, 0, 0, loc)
	var series []Sample
	at := start
	for i := 0; i < 70*72; i++ {
		h := 1.0 / 3
		if i%97 == 0 {
			h = 50.0 / 60
		}
		kw := 40 + 25*math.Sin(float64(i)/37) + float64(i%11)
		series = append(series, Sample{Start: at, Hours: h, Power: curves.Power(kw * curves.KW)})
		at = at.Add(time.Duration(h * float64(time.Hour)))
	}
	want, err := Cost(tar, series)
	if err != nil {
		t.Fatal(err)
	}
	m, err := NewMeter(tar)
	if err != nil {
		t.Fatal(err)
	}
	for i, s := range series {
		if c := m.Add(s); c != want.SampleCost[i] {
			t.Fatalf("sample %d: meter %v, Cost %v", i, c, want.SampleCost[i])
		}
	}
	got, err := m.Bill()
	if err != nil {
		t.Fatal(err)
	}
	got.SampleCost = want.SampleCost
	if !reflect.DeepEqual(got, want) {
		t.Errorf("meter bill\n%+v\nCost bill\n%+v", got, want)
	}
	if len(got.Months) != 3 || len(got.Periods) != 2 {
		t.Errorf("months %d, periods %d: the series should span 3 months and fill both period slots", len(got.Months), len(got.Periods))
	}
}

// A bad sample is reported by Bill with its index, as Cost reports it.
func TestMeterRefusesBadSamples(t *testing.T) {
	at := time.Date(2025, 1, 1, 0, 0, 0, 0, time.UTC)
	for _, bad := range []Sample{
		{Start: at, Hours: -1, Power: 1},
		{Start: at, Hours: 1, Power: curves.Power(math.NaN())},
		{Hours: 1, Power: 1},
		{Start: at, Hours: 800, Power: 1},
	} {
		m, err := NewMeter(Tariff{EnergyPrice: 0.1})
		if err != nil {
			t.Fatal(err)
		}
		m.Add(Sample{Start: at, Hours: 1, Power: 1000})
		m.Add(bad)
		if _, err := m.Bill(); !errors.Is(err, ErrSeries) {
			t.Errorf("%+v: error %v, want ErrSeries", bad, err)
		}
	}
}
