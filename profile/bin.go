package profile

import (
	"fmt"
	"math"
	"slices"

	"wattstage/curves"
)

// FlowBin is one flow bin of a profile. Points with zero flow (the plant
// off) get a bin of their own with Low = High = Centre = 0, so that nobody
// evaluates an idle plant at half a bin width of flow.
type FlowBin struct {
	Low, High  curves.Flow  // edges, m³/s: the bin holds Low ≤ Q < High
	Centre     curves.Flow  // (Low + High)/2, m³/s: where a binned evaluation solves the plant
	MeanFlow   curves.Flow  // hours-weighted mean flow of the bin's points, m³/s
	Hours      float64      // hours the bin's points represent
	Count      int          // points in the bin
	DP         curves.Head  // hours-weighted mean DP of the points with one, m; 0 when DPHours is 0
	DPHours    float64      // hours of the points with a DP
	Power      curves.Power // hours-weighted mean measured power of the points with one, W
	PowerHours float64      // hours of the points with a measured power
}

// Binned is a profile binned by flow.
type Binned struct {
	Width curves.Flow // bin width, m³/s
	Bins  []FlowBin   // non-empty bins in increasing flow
	Hours float64     // total hours, equal to the points' hours

	// CubeError estimates the binning error of evaluating every bin at its
	// centre instead of every point at its own flow, for a power that goes
	// as the cube of flow (the steepest a pump group's power rises with flow
	// by the affinity laws; a control head makes the real curve flatter):
	//
	//	CubeError = (Σ_bins H_k c_k³ − Σ_points h_i q_i³) / Σ_points h_i q_i³
	//
	// Compare gives the exact error for the model's own power function.
	CubeError float64
}

// maxBinIndex bounds flow/width so that a width far too small for the flows
// is an error rather than millions of bins.
const maxBinIndex = 1e6

// Bin bins points by flow into bins [k·width, (k+1)·width), plus the zero
// bin, each with its hours, count and mean DP and measured power.
func Bin(points []Point, width curves.Flow) (*Binned, error) {
	w := float64(width)
	if !(w > 0) || math.IsInf(w, 0) {
		return nil, fmt.Errorf("%w (got %g m³/s)", ErrBinWidth, w)
	}
	byIndex := map[int]*FlowBin{}
	b := &Binned{Width: width}
	for _, p := range points {
		q := float64(p.Flow)
		k := -1 // the zero bin
		if q > 0 {
			f := math.Floor(q / w)
			if f > maxBinIndex {
				return nil, fmt.Errorf("%w: %g m³/s makes more than %g bins", ErrBinWidth, w, float64(maxBinIndex))
			}
			k = int(f)
		}
		fb := byIndex[k]
		if fb == nil {
			fb = &FlowBin{}
			if k >= 0 {
				fb.Low, fb.High = curves.Flow(float64(k)*w), curves.Flow(float64(k+1)*w)
				fb.Centre = (fb.Low + fb.High) / 2
			}
			byIndex[k] = fb
		}
		fb.Count++
		fb.Hours += p.Hours
		fb.MeanFlow += curves.Flow(q * p.Hours)
		if p.HasDP {
			fb.DPHours += p.Hours
			fb.DP += curves.Head(float64(p.DP) * p.Hours)
		}
		if p.HasPower {
			fb.PowerHours += p.Hours
			fb.Power += curves.Power(float64(p.Power) * p.Hours)
		}
		b.Hours += p.Hours
	}
	keys := make([]int, 0, len(byIndex))
	for k := range byIndex {
		keys = append(keys, k)
	}
	slices.Sort(keys)
	for _, k := range keys {
		fb := byIndex[k]
		if fb.Hours > 0 {
			fb.MeanFlow /= curves.Flow(fb.Hours)
		}
		if fb.DPHours > 0 {
			fb.DP /= curves.Head(fb.DPHours)
		}
		if fb.PowerHours > 0 {
			fb.Power /= curves.Power(fb.PowerHours)
		}
		b.Bins = append(b.Bins, *fb)
	}
	b.CubeError = b.Compare(points, func(q curves.Flow) float64 { return math.Pow(float64(q), 3) }).Relative
	return b, nil
}

// Comparison sets a point-by-point total against the binned one.
type Comparison struct {
	Points   float64 // Σ_points h_i f(q_i)
	Bins     float64 // Σ_bins H_k f(c_k)
	Relative float64 // (Bins − Points)/Points; 0 when Points is 0
}

// Compare evaluates f (e.g. the plant's optimised electrical power in kW as
// a function of flow) point by point and bin by bin at the bin centres, and
// returns both hour-weighted totals and their relative difference: the
// binning error for that f. The points must be the ones binned.
func (b *Binned) Compare(points []Point, f func(curves.Flow) float64) Comparison {
	var c Comparison
	for _, p := range points {
		c.Points += p.Hours * f(p.Flow)
	}
	for _, fb := range b.Bins {
		c.Bins += fb.Hours * f(fb.Centre)
	}
	if c.Points != 0 {
		c.Relative = (c.Bins - c.Points) / c.Points
	}
	return c
}
