package econ_test

import (
	"fmt"
	"time"

	"wattstage/curves"
	"wattstage/econ"
)

func ExampleCost() {
	tariff := econ.Tariff{
		EnergyPrice:  0.09,
		Currency:     "USD",
		DemandCharge: 14,
		Periods: []econ.Period{
			{Name: "on-peak", Price: 0.16, StartHour: 12, EndHour: 19, Weekdays: true},
		},
	}
	// A Tuesday at 40 kW, with 55 kW through the afternoon.
	day := time.Date(2025, 7, 8, 0, 0, 0, 0, time.UTC)
	var series []econ.Sample
	for h := range 24 {
		kw := 40.0
		if h >= 13 && h < 17 {
			kw = 55
		}
		series = append(series, econ.Sample{Start: day.Add(time.Duration(h) * time.Hour), Hours: 1, Power: curves.Power(kw * curves.KW)})
	}
	bill, err := econ.Cost(tariff, series)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, p := range bill.Periods {
		fmt.Printf("%-16s %5.0f kWh  %6.2f %s\n", p.Name, p.Energy, p.Cost, tariff.Currency)
	}
	fmt.Printf("demand %.0f kW peak  %6.2f %s\n", bill.PeakKW, bill.DemandCost, tariff.Currency)
	fmt.Printf("total            %6.2f %s\n", bill.Total, tariff.Currency)
	// Output:
	// on-peak            340 kWh   54.40 USD
	// outside periods    680 kWh   61.20 USD
	// demand 55 kW peak  770.00 USD
	// total            885.60 USD
}

func ExampleAppraise() {
	baseline := &econ.Bill{Hours: 8760, Energy: 420000, EnergyCost: 42000, DemandCost: 7800}
	drives := &econ.Bill{Hours: 8760, Energy: 235000, EnergyCost: 23500, DemandCost: 5400}
	r := econ.Retrofit{DriveCost: 14000, OtherCost: 6000, LifeYears: 15, DiscountRate: 0.03, Escalation: 0.02}
	a, err := econ.Appraise(r, baseline, drives, 3)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("investment      %8.0f USD\n", a.Investment)
	fmt.Printf("annual savings  %8.0f USD/yr (%.0f kWh/yr)\n", a.AnnualSavings, a.EnergySaved)
	fmt.Printf("simple payback  %s\n", econ.PaybackText(a.SimplePayback))
	fmt.Printf("NPV             %8.0f USD over %d years\n", a.NPV, r.LifeYears)
	fmt.Printf("SIR             %8.2f\n", a.SIR)
	// Output:
	// investment         48000 USD
	// annual savings     20900 USD/yr (185000 kWh/yr)
	// simple payback  2.3 years
	// NPV               242220 USD over 15 years
	// SIR                 6.05
}

func ExampleUPVStar() {
	// Present value of 1 a year for 20 years at a 3 % real discount rate,
	// flat and with prices escalating 2 % a year.
	fmt.Printf("%.4f\n", econ.UPVStar(0.03, 0, 20))
	fmt.Printf("%.4f\n", econ.UPVStar(0.03, 0.02, 20))
	// Output:
	// 14.8775
	// 18.0812
}
