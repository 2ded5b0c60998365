package optimize

import (
	"math"

	"wattstage/curves"
)

// mg10Row is one row of the NEMA MG 10 table of allowed starts per hour
// for design A and B motors at 2, 4 and 6 poles.
type mg10Row struct {
	hp         float64
	p2, p4, p6 float64
}

// mg10 holds NEMA MG 10 (Energy Management Guide for Selection and Use of
// Fixed Frequency Medium AC Squirrel-Cage Polyphase Induction Motors),
// Table 1, column A: maximum starts per hour. The values are from memory
// (the table itself was not at hand); use them as guidance and take the
// motor manufacturer's limit where it is given.
var mg10 = []mg10Row{
	{1, 15, 30, 34}, {1.5, 12.9, 25.7, 29.1}, {2, 11.5, 23, 26.1}, {3, 9.9, 19.8, 22.4},
	{5, 8.1, 16.3, 18.4}, {7.5, 7.0, 14.0, 15.8}, {10, 6.2, 12.5, 14.2}, {15, 5.4, 10.7, 12.1},
	{20, 4.9, 9.8, 11.1}, {25, 4.5, 9.0, 10.2}, {30, 4.2, 8.4, 9.5}, {40, 3.8, 7.6, 8.6},
	{50, 3.5, 7.0, 7.9}, {60, 3.3, 6.5, 7.4}, {75, 3.1, 6.1, 6.9}, {100, 2.8, 5.6, 6.3},
	{125, 2.6, 5.2, 5.9}, {150, 2.4, 4.9, 5.5}, {200, 2.3, 4.5, 5.1}, {250, 2.1, 4.2, 4.8},
}

// StartsPerHour returns the NEMA MG 10 guidance on starts per hour for a
// motor of the given rated output and pole count (values from memory). A
// size between two rows takes the larger motor's row, the fewer starts
// (conservative). NaN outside 1–250 hp or for an unknown pole count.
func StartsPerHour(rated curves.Power, poles int) float64 {
	hp := float64(rated) / curves.Horsepower
	if hp < 1-1e-6 || hp > 250*(1+1e-6) {
		return math.NaN()
	}
	for _, r := range mg10 {
		if r.hp >= hp*(1-1e-6) {
			switch poles {
			case 2:
				return r.p2
			case 4:
				return r.p4
			case 6:
				return r.p6
			}
			return math.NaN()
		}
	}
	return math.NaN()
}
