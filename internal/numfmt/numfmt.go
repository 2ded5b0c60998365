// Package numfmt writes numbers for people to read: a comma between groups
// of three digits (1,540; 122,665.0), the one way every table, message and
// workbook cell of the program groups digits.
package numfmt

import (
	"fmt"
	"math"
	"strings"
)

// Grouped writes v with dec decimals and a comma between groups of three
// digits of its whole part, e.g. Grouped(1540.26, 1) = "1,540.3"; a minus
// sign only where the rounded value is not zero. It is meant for finite
// numbers: NaN and ±Inf are written as Go writes them.
func Grouped(v float64, dec int) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return fmt.Sprint(v)
	}
	s := fmt.Sprintf("%.*f", dec, math.Abs(v))
	whole, frac, _ := strings.Cut(s, ".")
	var b strings.Builder
	if v < 0 && strings.Trim(s, "0.") != "" {
		b.WriteByte('-')
	}
	for i, d := range whole {
		if i > 0 && (len(whole)-i)%3 == 0 {
			b.WriteByte(',')
		}
		b.WriteRune(d)
	}
	if frac != "" {
		b.WriteString("." + frac)
	}
	return b.String()
}

// Int writes a count with a comma between groups of three digits.
func Int(n int) string { return Grouped(float64(n), 0) }
