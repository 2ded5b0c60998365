package profile

import (
	"errors"
	"math"
	"testing"

	"wattstage/curves"
)

func TestBin(t *testing.T) {
	pts := []Point{
		{Flow: 0, Hours: 2},                                                        // plant off
		{Flow: 0.010, Hours: 1, DP: 8, HasDP: true},                                // bin [0, 0.02)
		{Flow: 0.015, Hours: 3, Power: 4000, HasPower: true},                       // bin [0, 0.02)
		{Flow: 0.020, Hours: 1, DP: 9, HasDP: true},                                // bin [0.02, 0.04): lower edge included
		{Flow: 0.049, Hours: 0.5, DP: 10, HasDP: true, Power: 9e3, HasPower: true}, // bin [0.04, 0.06)
	}
	b, err := Bin(pts, 0.02)
	if err != nil {
		t.Fatal(err)
	}
	// every number below is hand computed from the points
	want := []FlowBin{
		{Low: 0, High: 0, Centre: 0, MeanFlow: 0, Hours: 2, Count: 1},
		{Low: 0, High: 0.02, Centre: 0.01, MeanFlow: (0.010*1 + 0.015*3) / 4, Hours: 4, Count: 2, DP: 8, DPHours: 1, Power: 4000, PowerHours: 3},
		{Low: 0.02, High: 0.04, Centre: 0.03, MeanFlow: 0.02, Hours: 1, Count: 1, DP: 9, DPHours: 1},
		{Low: 0.04, High: 0.06, Centre: 0.05, MeanFlow: 0.049, Hours: 0.5, Count: 1, DP: 10, DPHours: 0.5, Power: 9e3, PowerHours: 0.5},
	}
	if len(b.Bins) != len(want) {
		t.Fatalf("bins %+v", b.Bins)
	}
	close := func(a, b float64) bool { return math.Abs(a-b) <= 1e-12*max(1, math.Abs(b)) }
	for i, w := range want {
		g := b.Bins[i]
		if g.Count != w.Count || !close(float64(g.Low), float64(w.Low)) || !close(float64(g.High), float64(w.High)) ||
			!close(float64(g.Centre), float64(w.Centre)) || !close(float64(g.MeanFlow), float64(w.MeanFlow)) ||
			!close(g.Hours, w.Hours) || !close(float64(g.DP), float64(w.DP)) || !close(g.DPHours, w.DPHours) ||
			!close(float64(g.Power), float64(w.Power)) || !close(g.PowerHours, w.PowerHours) {
			t.Errorf("bin %d\n got %+v\nwant %+v", i, g, w)
		}
	}
	if b.Hours != 7.5 {
		t.Errorf("hours %v, want 7.5", b.Hours)
	}
	// Cube-law error: Σ H c³ over bins = 4·0.01³ + 1·0.03³ + 0.5·0.05³ and
	// Σ h q³ over points = 0.01³ + 3·0.015³ + 0.02³ + 0.5·0.049³.
	bins := 4*1e-6 + 27e-6 + 0.5*125e-6
	points := 1e-6 + 3*3.375e-6 + 8e-6 + 0.5*math.Pow(0.049, 3)
	if !close(b.CubeError, (bins-points)/points) {
		t.Errorf("cube error %v, want %v", b.CubeError, (bins-points)/points)
	}
	// For an f linear in flow the binned total differs from the point total
	// only by Σ H_k (c_k − mean_k) f': check Compare on f(q) = q.
	c := b.Compare(pts, func(q curves.Flow) float64 { return float64(q) })
	wantDiff := 4*(0.01-float64(want[1].MeanFlow)) + 1*(0.03-0.02) + 0.5*(0.05-0.049)
	if !close(c.Bins-c.Points, wantDiff) {
		t.Errorf("linear compare %+v, want difference %v", c, wantDiff)
	}
}

func TestBinErrorShrinksWithWidth(t *testing.T) {
	tr, err := ReadTrendFile(exampleSpec, exampleFile)
	if err != nil {
		t.Fatal(err)
	}
	prev := math.Inf(1)
	for _, gpm := range []float64{800, 400, 200, 100, 50} {
		b, err := tr.Bin(curves.Flow(gpm * curves.GPM))
		if err != nil {
			t.Fatal(err)
		}
		// hours are conserved exactly (up to rounding of the sums)
		var h float64
		for _, fb := range b.Bins {
			h += fb.Hours
		}
		if math.Abs(h-tr.Hours) > 1e-9*tr.Hours {
			t.Errorf("width %v gpm: bins hold %v h, points %v h", gpm, h, tr.Hours)
		}
		// centre evaluation of a convex cube is mostly biased upward, and
		// the error shrinks with the width (roughly as its square)
		if e := math.Abs(b.CubeError); e >= prev {
			t.Errorf("width %v gpm: cube error %v not below %v", gpm, e, prev)
		} else {
			prev = e
		}
	}
	if prev > 1e-3 {
		t.Errorf("50 gpm bins still err by %v on a cube law", prev)
	}
}

func TestBinInvalidWidth(t *testing.T) {
	pts := []Point{{Flow: 1, Hours: 1}}
	for _, w := range []curves.Flow{0, -1, curves.Flow(math.NaN()), curves.Flow(math.Inf(1)), 1e-9} {
		if _, err := Bin(pts, w); !errors.Is(err, ErrBinWidth) {
			t.Errorf("width %v: err %v", w, err)
		}
	}
	b, err := Bin(nil, 1)
	if err != nil || len(b.Bins) != 0 || b.CubeError != 0 {
		t.Errorf("no points: %+v %v", b, err)
	}
}
