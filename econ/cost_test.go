package econ

import (
	"errors"
	"math"
	"strings"
	"testing"
	"time"

	"wattstage/curves"
)

// hourly returns n hourly samples of constant power kw from start.
func hourly(start time.Time, n int, kw float64) []Sample {
	s := make([]Sample, n)
	for i := range s {
		s[i] = Sample{Start: start.Add(time.Duration(i) * time.Hour), Hours: 1, Power: curves.Power(kw * curves.KW)}
	}
	return s
}

func near(got, want, tol float64) bool { return math.Abs(got-want) <= tol }

func TestCostFlat(t *testing.T) {
	// 100 kW all year at 0.10 /kWh: 876 000 kWh, 87 600 (hand computed);
	// emissions 0.4 kg/kWh → 350 400 kg.
	tar := Tariff{EnergyPrice: 0.10, EmissionsFactor: 0.4}
	for _, c := range []struct {
		name   string
		series []Sample
	}{
		{"timed", hourly(time.Date(2025, 1, 1, 0, 0, 0, 0, time.UTC), 8760, 100)},
		{"untimed", []Sample{{Hours: 4380, Power: 50e3}, {Hours: 4380, Power: 150e3}}},
	} {
		t.Run(c.name, func(t *testing.T) {
			b, err := Cost(tar, c.series)
			if err != nil {
				t.Fatal(err)
			}
			// tolerance 1e-6 relative: sums of 8760 terms
			if !near(b.Energy, 876000, 1e-6*876000) || !near(b.EnergyCost, 87600, 1e-6*87600) ||
				!near(b.Emissions, 350400, 1e-6*350400) || b.DemandCost != 0 || b.Total != b.EnergyCost {
				t.Errorf("bill %+v", b)
			}
			if len(b.Warnings) != 0 {
				t.Errorf("warnings %q", b.Warnings)
			}
		})
	}
}

// onPeak is weekdays 12–18 at 0.20 with 0.08 outside: 30 of the week's 168
// hours.
var onPeak = Tariff{EnergyPrice: 0.08, Periods: []Period{{Name: "on-peak", Price: 0.20, StartHour: 12, EndHour: 18, Weekdays: true}}}

func TestCostTimeOfUse(t *testing.T) {
	monday := time.Date(2025, 1, 6, 0, 0, 0, 0, time.UTC) // 6 January 2025 is a Monday
	chicago, err := time.LoadLocation("America/Chicago")
	if err != nil {
		t.Fatal(err)
	}
	cases := []struct {
		name         string
		t            Tariff
		series       []Sample
		energy, cost float64 // hand computed
		onPeakKWh    float64
	}{
		// One week at 10 kW: 5 × 6 h × 10 kW = 300 kWh on-peak at 0.20 = 60;
		// 1680 − 300 = 1380 kWh at 0.08 = 110.40.
		{"one week", onPeak, hourly(monday, 168, 10), 1680, 170.40, 300},
		// The weekend alone is all off-peak: 48 h × 10 kW × 0.08.
		{"weekend", onPeak, hourly(monday.AddDate(0, 0, 5), 48, 10), 480, 38.40, 0},
		// An hour from 11:30 is half off-peak, half on: 10 kWh split 5/5.
		{"straddles 12:00", onPeak, []Sample{{Start: monday.Add(11*time.Hour + 30*time.Minute), Hours: 1, Power: 10e3}},
			10, 5*0.08 + 5*0.20, 5},
		// A 15-minute sample inside the period.
		{"quarter hour", onPeak, []Sample{{Start: monday.Add(13 * time.Hour), Hours: 0.25, Power: 40e3}}, 10, 2, 10},
		// Local clock: 12:00 in Chicago is 18:00 UTC in January; priced by
		// the sample's own zone.
		{"local zone", onPeak, []Sample{{Start: time.Date(2025, 1, 6, 12, 0, 0, 0, chicago), Hours: 1, Power: 10e3}}, 10, 2, 10},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			b, err := Cost(c.t, c.series)
			if err != nil {
				t.Fatal(err)
			}
			if !near(b.Energy, c.energy, 1e-9) || !near(b.EnergyCost, c.cost, 1e-9) || !near(b.Periods[0].Energy, c.onPeakKWh, 1e-9) {
				t.Errorf("energy %v cost %v on-peak %v, want %v %v %v", b.Energy, b.EnergyCost, b.Periods[0].Energy, c.energy, c.cost, c.onPeakKWh)
			}
			// the periods partition the bill
			var e, cost, h float64
			for _, u := range b.Periods {
				e, cost, h = e+u.Energy, cost+u.Cost, h+u.Hours
			}
			if !near(e, b.Energy, 1e-9) || !near(cost, b.EnergyCost, 1e-9) || !near(h, b.Hours, 1e-9) {
				t.Errorf("periods sum to %v kWh %v %v h, bill %v %v %v", e, cost, h, b.Energy, b.EnergyCost, b.Hours)
			}
			if b.Periods[1].Name != "outside periods" || b.Periods[0].Name != "on-peak" {
				t.Errorf("period names %q %q", b.Periods[0].Name, b.Periods[1].Name)
			}
		})
	}
}

func TestCostDaylightSaving(t *testing.T) {
	// 2 November 2025, America/Chicago falls back at 02:00 CDT: the day has
	// 25 hours and local hour 01 occurs twice (US Energy Policy Act 2005
	// rules, as encoded in the IANA time zone database). A tariff priced
	// 0.30 for 01:00–02:00 must see two hours there.
	chicago, err := time.LoadLocation("America/Chicago")
	if err != nil {
		t.Fatal(err)
	}
	day := time.Date(2025, 11, 2, 0, 0, 0, 0, chicago)
	tar := Tariff{EnergyPrice: 0.10, Periods: []Period{{Price: 0.30, StartHour: 1, EndHour: 2, Weekends: true, Weekdays: true}}}
	b, err := Cost(tar, hourly(day, 25, 1))
	if err != nil {
		t.Fatal(err)
	}
	if !near(b.Periods[0].Hours, 2, 1e-9) || !near(b.EnergyCost, 2*0.30+23*0.10, 1e-9) {
		t.Errorf("period hours %v cost %v", b.Periods[0].Hours, b.EnergyCost)
	}
	if b.Periods[0].Name != "periods[0]" {
		t.Errorf("unnamed period is %q", b.Periods[0].Name)
	}
}

func TestCostDemand(t *testing.T) {
	// January at 50 kW with one hour at 80, February at 30 kW: peaks 80 and
	// 30 kW, demand at 12 /kW → (80 + 30) × 12 = 1320 (hand computed).
	jan := hourly(time.Date(2025, 1, 1, 0, 0, 0, 0, time.UTC), 31*24, 50)
	jan[100].Power = 80e3
	feb := hourly(time.Date(2025, 2, 1, 0, 0, 0, 0, time.UTC), 28*24, 30)
	tar := Tariff{EnergyPrice: 0.1, DemandCharge: 12}
	// given out of order: months come back sorted
	b, err := Cost(tar, append(feb, jan...))
	if err != nil {
		t.Fatal(err)
	}
	if len(b.Months) != 2 || b.Months[0].Month != time.January || b.Months[1].Month != time.February {
		t.Fatalf("months %+v", b.Months)
	}
	if !near(b.Months[0].PeakKW, 80, 0) || !near(b.Months[1].PeakKW, 30, 0) || !near(b.DemandCost, 1320, 1e-9) || b.PeakKW != 80 {
		t.Errorf("peaks %v %v demand %v", b.Months[0].PeakKW, b.Months[1].PeakKW, b.DemandCost)
	}
	wantE := (31*24-1)*50.0 + 80 + 28*24*30
	if !near(b.Energy, wantE, 1e-6) || !near(b.Total, wantE*0.1+1320, 1e-6) {
		t.Errorf("energy %v total %v", b.Energy, b.Total)
	}
	// hourly means: a warning about 15-minute demand
	if len(b.Warnings) != 1 || !strings.Contains(b.Warnings[0], "15-minute") {
		t.Errorf("warnings %q", b.Warnings)
	}
	// A series that covers half of March says the month is partial.
	b, err = Cost(tar, hourly(time.Date(2025, 3, 1, 0, 0, 0, 0, time.UTC), 15*24, 10))
	if err != nil {
		t.Fatal(err)
	}
	if len(b.Warnings) != 2 || !strings.Contains(b.Warnings[1], "partly covered") {
		t.Errorf("warnings %q", b.Warnings)
	}
}

func TestCostUntimed(t *testing.T) {
	bins := []Sample{{Hours: 2000, Power: 20e3}, {Hours: 5000, Power: 40e3}, {Hours: 1760, Power: 70e3}, {Hours: 0, Power: 500e3}}
	tar := onPeak
	tar.DemandCharge = 10
	b, err := Cost(tar, bins)
	if err != nil {
		t.Fatal(err)
	}
	// Energy 2000·20 + 5000·40 + 1760·70 = 363 200 kWh; the share of the
	// week on-peak is 30/168, so the price is 30/168·0.20 + 138/168·0.08;
	// demand is the highest bin with hours (70 kW, not the empty 500 kW
	// bin) × 12 months × 10 (all hand computed).
	const e = 363200.0
	price := 30.0/168*0.20 + 138.0/168*0.08
	if !near(b.Energy, e, 1e-6) || !near(b.EnergyCost, e*price, 1e-6) || !near(b.DemandCost, 12*70*10, 1e-9) || b.Timed || b.Months != nil {
		t.Errorf("bill %+v", b)
	}
	if !near(b.Periods[0].Energy, e*30/168, 1e-6) || !near(b.Periods[0].Cost+b.Periods[1].Cost, b.EnergyCost, 1e-6) {
		t.Errorf("periods %+v", b.Periods)
	}
	if len(b.Warnings) != 2 {
		t.Errorf("want the time-of-use and demand estimate warnings, got %q", b.Warnings)
	}
	// bins that do not add up to a year get a third warning
	b, _ = Cost(tar, bins[:2])
	if len(b.Warnings) != 3 {
		t.Errorf("warnings %q", b.Warnings)
	}
}

func TestWeekShare(t *testing.T) {
	tar := Tariff{Periods: []Period{
		{StartHour: 8, EndHour: 20, Weekdays: true},                 // 60 h
		{StartHour: 0, EndHour: 24, Weekends: true},                 // 48 h
		{StartHour: 0, EndHour: 8, Weekdays: true, Weekends: false}, // 40 h
	}}
	want := []float64{60.0 / 168, 48.0 / 168, 40.0 / 168}
	for i, w := range want {
		if got := tar.WeekShare(i); !near(got, w, 1e-15) {
			t.Errorf("share %d = %v, want %v", i, got, w)
		}
	}
	if got := tar.WeekShare(-1); !near(got, 20.0/168, 1e-15) {
		t.Errorf("outside share = %v, want 20/168", got)
	}
}

func TestCostInvalid(t *testing.T) {
	day := time.Date(2025, 1, 6, 0, 0, 0, 0, time.UTC)
	p := func(s, e int, wd, we bool) Period {
		return Period{Price: 0.1, StartHour: s, EndHour: e, Weekdays: wd, Weekends: we}
	}
	cases := []struct {
		name   string
		t      Tariff
		series []Sample
		class  error
		want   string
	}{
		{"negative price", Tariff{EnergyPrice: -0.1}, nil, ErrTariff, "energy price -0.1"},
		{"NaN demand", Tariff{DemandCharge: math.NaN()}, nil, ErrTariff, "demand charge NaN"},
		{"infinite emissions", Tariff{EmissionsFactor: math.Inf(1)}, nil, ErrTariff, "emissions factor +Inf"},
		{"start hour", Tariff{Periods: []Period{p(24, 24, true, false)}}, nil, ErrTariff, "periods[0]: start hour 24"},
		{"end hour", Tariff{Periods: []Period{p(3, 25, true, false)}}, nil, ErrTariff, "periods[0]: end hour 25"},
		{"over midnight", Tariff{Periods: []Period{p(22, 6, true, false)}}, nil, ErrTariff, "split a period over midnight"},
		{"no days", Tariff{Periods: []Period{p(1, 6, false, false)}}, nil, ErrTariff, "neither weekdays nor weekends"},
		{"overlap", Tariff{Periods: []Period{p(8, 12, true, false), p(0, 24, true, true)}}, nil, ErrTariff, "periods[1]: overlaps periods[0] at 08:00 on weekdays"},
		{"negative period price", Tariff{Periods: []Period{{Price: -1, StartHour: 1, EndHour: 2, Weekdays: true}}}, nil, ErrTariff, "periods[0]: price -1"},
		{"mixed samples", Tariff{}, []Sample{{Start: day, Hours: 1}, {Hours: 1}}, ErrSeries, "1 of 2 samples are time-stamped"},
		{"negative hours", Tariff{}, []Sample{{Hours: -1}}, ErrSeries, "samples[0]: hours -1"},
		{"NaN power", Tariff{}, []Sample{{Hours: 1, Power: curves.Power(math.NaN())}}, ErrSeries, "samples[0]: power NaN"},
		{"long timed sample", Tariff{}, []Sample{{Start: day, Hours: 800}}, ErrSeries, "longer than a month"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := Cost(c.t, c.series)
			if !errors.Is(err, c.class) || !strings.Contains(err.Error(), c.want) {
				t.Errorf("err = %v, want %v containing %q", err, c.class, c.want)
			}
		})
	}
}

func BenchmarkCostHourlyYear(b *testing.B) {
	s := hourly(time.Date(2025, 1, 1, 0, 0, 0, 0, time.UTC), 8760, 40)
	tar := onPeak
	tar.DemandCharge = 10
	b.ReportAllocs()
	for b.Loop() {
		if _, err := Cost(tar, s); err != nil {
			b.Fatal(err)
		}
	}
}

func TestCostZeroHourSample(t *testing.T) {
	// a zero-length interval draws no energy and sets no peak
	day := time.Date(2025, 1, 6, 0, 0, 0, 0, time.UTC)
	b, err := Cost(Tariff{EnergyPrice: 0.1, DemandCharge: 10}, []Sample{{Start: day, Hours: 1, Power: 10e3}, {Start: day.Add(time.Hour), Hours: 0, Power: 900e3}})
	if err != nil {
		t.Fatal(err)
	}
	if b.PeakKW != 10 || b.Energy != 10 || b.DemandCost != 100 {
		t.Errorf("peak %v energy %v demand %v", b.PeakKW, b.Energy, b.DemandCost)
	}
}
