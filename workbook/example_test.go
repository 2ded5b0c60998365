package workbook_test

import (
	"fmt"

	"wattstage/workbook"
)

func ExampleComputeEconomics() {
	r := &workbook.Report{
		Plant: "Example loop",
		Units: workbook.Units{Flow: "gpm", Head: "ft"},
		Strategies: []workbook.Strategy{
			{Name: "Two pumps at full speed", EnergyKWh: 100000, PeakKW: 20},
			{Name: "Staged on drives", EnergyKWh: 60000, PeakKW: 12, DrivesToBuy: 2},
		},
		Economics: workbook.EconomicsInputs{
			EnergyPrice: 0.10, DemandCharge: 10, DriveCost: 5000, OtherCost: 1000,
			LifeYears: 10, DiscountRate: 0.05, Escalation: 0.02,
		},
	}
	e, err := workbook.ComputeEconomics(r)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("UPV* %.4f years\n", e.PVFactor)
	for _, s := range e.Strategies {
		fmt.Printf("%-24s cost %6.0f $/yr  saved %5.0f $/yr  investment %6.0f $  NPV %7.0f $\n",
			s.Name, s.TotalCost, s.CostSaved, s.Investment, s.NPV)
	}
	// Output:
	// UPV* 8.5559 years
	// Two pumps at full speed  cost  12400 $/yr  saved     0 $/yr  investment      0 $  NPV       0 $
	// Staged on drives         cost   7440 $/yr  saved  4960 $/yr  investment  11000 $  NPV   31437 $
}
