package curves_test

import (
	"fmt"

	"wattstage/curves"
)

// Water at 20 °C by Kell (1975); docs/sources.md §2 gives 998.204 kg/m³ [D].
func ExampleWaterDensity() {
	rho, err := curves.WaterDensity(20)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.3f kg/m³\n", rho)
	_, err = curves.WaterDensity(180)
	fmt.Println(err)
	// Output:
	// 998.204 kg/m³
	// curves: water temperature outside 0–150 °C (Kell 1975 range)
}

// An 80 % efficient pump at half speed: 78.56 % by Sârbu & Borza (1998),
// docs/sources.md §3 check [D].
func ExampleSarbuBorza() {
	fmt.Printf("%.4f\n", curves.SarbuBorza(0.80, 0.50))
	// Output:
	// 0.7856
}

// A pump fitted from four datasheet points given in US units, and the speed
// it needs to deliver 600 gpm against 75 ft. The points lie on
// H = 120 − 1.25e-4 Q² ft (Q in gpm), so the speed solves
// 120 s² − 1.25e-4·600² = 75, s = √(120/120) = 1.0 at rated speed; against
// 52.5 ft it is √((52.5 + 45)/120) = 0.9014.
func ExampleNewPump() {
	us := curves.US
	pts := []curves.PumpPoint{
		{Flow: us.FlowIn(200), Head: us.HeadIn(115), Eff: 0.45},
		{Flow: us.FlowIn(400), Head: us.HeadIn(100), Eff: 0.70},
		{Flow: us.FlowIn(600), Head: us.HeadIn(75), Eff: 0.78},
		{Flow: us.FlowIn(800), Head: us.HeadIn(40), Eff: 0.72},
	}
	p, err := curves.NewPump(pts, curves.PumpOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("shutoff %s, head fit RMS %.3f ft\n", us.FormatHead(p.ShutoffHead()), us.HeadOut(curves.Head(p.HeadFit.RMS)))
	for _, h := range []float64{75, 52.5} {
		s, ok := p.SpeedFor(us.FlowIn(600), us.HeadIn(h))
		fmt.Printf("600 gpm at %.1f ft: speed %.4f (%v)\n", h, s, ok)
	}
	// Output:
	// shutoff 120.0 ft, head fit RMS 0.000 ft
	// 600 gpm at 75.0 ft: speed 1.0000 (true)
	// 600 gpm at 52.5 ft: speed 0.9014 (true)
}
