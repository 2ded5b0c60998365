package optimize_test

import (
	"fmt"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
)

// Three identical 1000 gpm pumps on drives (an invented datasheet) serving a
// differential-pressure loop: the derived sequence runs one, two, then three
// pumps, and the first stage-up sits at the flow where one and two pumps
// draw the same power.
func ExampleDeriveSetpoints() {
	g, ft := curves.GPM, curves.Foot
	pump, err := curves.NewPump([]curves.PumpPoint{
		{Flow: 0, Head: curves.Head(115 * ft)},
		{Flow: curves.Flow(400 * g), Head: curves.Head(110 * ft), Eff: 0.55},
		{Flow: curves.Flow(800 * g), Head: curves.Head(98 * ft), Eff: 0.78},
		{Flow: curves.Flow(1100 * g), Head: curves.Head(84 * ft), Eff: 0.82},
		{Flow: curves.Flow(1400 * g), Head: curves.Head(62 * ft), Eff: 0.74},
	}, curves.PumpOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	design, head := curves.Flow(2700*g), curves.Head(88*ft)
	p := &plant.Plant{
		Name: "example loop", Units: curves.US, Fluid: curves.Fluid{Density: 999.7},
		Models: []plant.Model{{
			Name: "CHWP", Count: 3, RatedSpeed: 1780, Pump: pump, MinSpeed: 0.3, MaxSpeed: 1,
			MinFlow: curves.Flow(250 * g), Runout: curves.Flow(1500 * g),
			Motor: curves.Motor{Rated: curves.Power(30 * curves.Horsepower), FullLoadEff: 0.936},
			Drive: curves.DOEDrive{},
		}},
		System:     curves.DPControl{DesignFlow: design, DesignHead: head, ControlHead: curves.Head(30 * ft)},
		DesignFlow: design, DesignHead: head, MinFlow: curves.Flow(500 * g),
	}
	sp, err := optimize.DeriveSetpoints(p, optimize.SetpointOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, st := range sp.Stages {
		fmt.Printf("stage %d: %d running\n", st.Number, st.Running)
	}
	t := sp.Transitions[0]
	fmt.Printf("1 → 2 at %.0f gpm (%s), back below %.0f gpm (%s)\n",
		float64(t.Up.Flow)/g, t.Up.Limit, float64(t.Down.Flow)/g, t.Down.Limit)
	// Output:
	// stage 1: 1 running
	// stage 2: 2 running
	// stage 3: 3 running
	// 1 → 2 at 1010 gpm (power crossover), back below 909 gpm (deadband)
}
