package numfmt

import (
	"math"
	"testing"
)

func TestGrouped(t *testing.T) {
	for _, tc := range []struct {
		v    float64
		dec  int
		want string
	}{
		{0, 0, "0"},
		{999, 0, "999"},
		{1000, 0, "1,000"},
		{1540.26, 1, "1,540.3"},
		{122665, 0, "122,665"},
		{1234567.891, 2, "1,234,567.89"},
		{-123, 0, "-123"},
		{-1234, 0, "-1,234"},
		{-0.004, 2, "0.00"}, // rounds to zero: no sign
		{math.Inf(1), 0, "+Inf"},
	} {
		if got := Grouped(tc.v, tc.dec); got != tc.want {
			t.Errorf("Grouped(%v, %d) = %q, want %q", tc.v, tc.dec, got, tc.want)
		}
	}
	if got := Int(8728); got != "8,728" {
		t.Errorf("Int(8728) = %q", got)
	}
}
