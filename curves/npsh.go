package curves

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/interp"
)

// ErrNPSHPoints is returned by NewNPSHCurve for too few points.
var ErrNPSHPoints = errors.New("curves: an NPSHr curve needs at least two points")

// NPSHPoint is one datasheet point of the net positive suction head the
// pump requires, at rated speed.
type NPSHPoint struct {
	Flow  Flow // m³/s, ≥ 0
	NPSHr Head // m, > 0: NPSH3, the NPSH at which the head drops by 3 %
}

// NPSHCurve is a pump's required NPSH against flow at rated speed, scaled
// to any speed by the affinity laws. Build one with NewNPSHCurve.
//
// Between datasheet points NPSHr is interpolated linearly in flow: a
// datasheet NPSHr curve is convex (it rises ever faster toward runout), so
// the chord lies on or above it, the cautious side. Below the first point
// the first value holds; past the last point the last segment is
// continued (an extrapolation, see Extrapolated).
type NPSHCurve struct {
	Points []NPSHPoint // as given, rising flow
	lin    interp.PiecewiseLinear
	slope  float64 // m per m³/s of the last segment, ≥ 0
}

// NewNPSHCurve checks the points (at least two, rising flow, NPSHr above
// zero, all finite) and builds the curve. Point errors are returned
// joined, every one at once, as PointError with Field "flow" or "npshr".
func NewNPSHCurve(points []NPSHPoint) (*NPSHCurve, error) {
	if len(points) < 2 {
		return nil, fmt.Errorf("%w: %d given", ErrNPSHPoints, len(points))
	}
	pts := append([]NPSHPoint(nil), points...)
	var errs []error
	for i, p := range pts {
		switch {
		case !finite(float64(p.Flow)):
			errs = append(errs, &PointError{i, "flow", ErrNotFinite})
		case p.Flow < 0:
			errs = append(errs, &PointError{i, "flow", ErrNegative})
		case i > 0 && p.Flow == pts[i-1].Flow:
			errs = append(errs, &PointError{i, "flow", ErrDuplicateFlow})
		case i > 0 && p.Flow < pts[i-1].Flow:
			errs = append(errs, &PointError{i, "flow", ErrUnsorted})
		}
		switch {
		case !finite(float64(p.NPSHr)):
			errs = append(errs, &PointError{i, "npshr", ErrNotFinite})
		case p.NPSHr <= 0:
			errs = append(errs, &PointError{i, "npshr", ErrNotPositive})
		}
	}
	if len(errs) > 0 {
		return nil, errors.Join(errs...)
	}
	xs, ys := make([]float64, len(pts)), make([]float64, len(pts))
	for i, p := range pts {
		xs[i], ys[i] = float64(p.Flow), float64(p.NPSHr)
	}
	c := &NPSHCurve{Points: pts}
	if err := c.lin.Fit(xs, ys); err != nil {
		return nil, err
	}
	n := len(pts) - 1
	c.slope = math.Max(0, (ys[n]-ys[n-1])/(xs[n]-xs[n-1]))
	return c, nil
}

// Required returns the NPSH the pump requires at flow q and speed ratio s,
// by the affinity laws (common practice; NPSHr scales about as speed²):
//
//	NPSHr(q, s) = s² · NPSHr₀(q/s)
func (c *NPSHCurve) Required(q Flow, s float64) Head {
	if s <= 0 {
		return 0
	}
	x := float64(q) / s
	last := c.Points[len(c.Points)-1]
	r := c.lin.Predict(x)
	if x > float64(last.Flow) {
		r = float64(last.NPSHr) + c.slope*(x-float64(last.Flow))
	}
	return Head(s * s * r)
}

// Extrapolated reports whether flow q at speed ratio s lies past the last
// datasheet point (q/s above its flow), where Required continues the last
// segment and understates a curve that steepens toward runout.
func (c *NPSHCurve) Extrapolated(q Flow, s float64) bool {
	return s > 0 && float64(q)/s > float64(c.Points[len(c.Points)-1].Flow)*(1+1e-9)
}
