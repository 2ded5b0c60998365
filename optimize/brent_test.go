package optimize

import (
	"math"
	"testing"
)

// Brent's method against two classic roots: the fixed point of cos (the
// Dottie number 0.7390851332151607, OEIS A003957) and Wallis's cubic
// x³ − 2x − 5 = 0, root 2.0945514815423265 (the example Newton's method is
// traditionally shown on).
func TestBrentRoot(t *testing.T) {
	cases := []struct {
		name string
		f    func(float64) float64
		a, b float64
		want float64
	}{
		{"cos x = x", func(x float64) float64 { return math.Cos(x) - x }, 0, 1, 0.7390851332151607},
		{"Wallis cubic", func(x float64) float64 { return x*x*x - 2*x - 5 }, 2, 3, 2.0945514815423265},
		{"root at an end", func(x float64) float64 { return x - 1 }, 1, 2, 1},
	}
	for _, c := range cases {
		got := brentRoot(c.f, c.a, c.b, c.f(c.a), c.f(c.b), 1e-14)
		if math.Abs(got-c.want) > 1e-12 {
			t.Errorf("%s: %.16f, want %.16f", c.name, got, c.want)
		}
	}
}
