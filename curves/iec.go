package curves

// ie3FourPole is the IEC 60034-30-1 IE3 nominal full-load efficiency of a
// 4-pole 50 Hz motor by rated output, % (the table as reproduced in
// published summaries of the standard up to 7.5 kW; the larger sizes from
// memory). 200–375 kW are all 96.0 %.
var ie3FourPole = []struct{ kw, eff float64 }{
	{0.75, 82.5}, {1.1, 84.1}, {1.5, 85.3}, {2.2, 86.7}, {3, 87.7}, {4, 88.6}, {5.5, 89.6},
	{7.5, 90.4}, {11, 91.4}, {15, 92.1}, {18.5, 92.6}, {22, 93.0}, {30, 93.6}, {37, 93.9},
	{45, 94.2}, {55, 94.6}, {75, 95.0}, {90, 95.2}, {110, 95.4}, {132, 95.6}, {160, 95.8},
	{200, 96.0}, {375, 96.0},
}

// IE3Efficiency returns the IE3 default full-load efficiency (0–1) for a
// motor of the given rated output: the 4-pole 50 Hz value of IEC
// 60034-30-1, the smaller table size when between two (the conservative
// choice, common practice). The table covers 0.75–375 kW.
func IE3Efficiency(rated Power) (float64, error) {
	kw := float64(rated) / KW
	if kw < 0.75*(1-1e-6) || kw > 375*(1+1e-6) {
		return 0, ErrNoDefaultEff
	}
	eff := ie3FourPole[0].eff
	for _, r := range ie3FourPole {
		if r.kw <= kw*(1+1e-6) {
			eff = r.eff
		}
	}
	return eff / 100, nil
}

// SupplyHz guesses the supply frequency of an induction motor from its
// rated speed: 50 or 60 Hz, whichever has a synchronous speed (for 2, 4 or
// 6 poles) just above the rated speed within 10 % slip, the nearer one
// winning; 0 when none fits.
func SupplyHz(rpm float64) int {
	best, hz := 1e9, 0
	for _, p := range []int{2, 4, 6} {
		for _, f := range []int{50, 60} {
			sync := 120 * float64(f) / float64(p)
			if rpm <= sync*1.01 && rpm >= 0.9*sync && sync-rpm < best {
				best, hz = sync-rpm, f
			}
		}
	}
	return hz
}

// IECServiceFactor is the service factor of an IEC motor: IEC ratings have
// none (common practice), so the rated output is the limit.
const IECServiceFactor = 1.0
