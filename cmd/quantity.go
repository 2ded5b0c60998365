package cmd

import (
	"fmt"
	"math"
	"regexp"
	"strconv"
	"strings"
	"time"

	"github.com/spf13/pflag"

	"wattstage/curves"
)

// Quantities on the command line. Every flag that takes a quantity
// accepts a unit suffix or a percentage, and has a range; a value out of
// range is a usage error (exit 2) that names the flag. The ranges are in
// each flag's help and in the README.

// flowArg is a flow as typed: a number with an optional unit ("1800",
// "1800gpm", "114 L/s", "410m3/h") or a percentage ("60%") of a base flow
// known only once the plant is loaded.
type flowArg struct {
	Value float64 // as typed, > 0
	Unit  string  // "" (the plant's flow unit), "%", "gpm", "m³/h" or "L/s"
}

// flowUnits are the flow suffixes every flow flag accepts, whatever the
// plant's unit system (they are unambiguous), with m³/s per unit.
var flowUnits = []struct {
	name  string
	per   float64
	names []string // accepted spellings, compared without case
}{
	{"gpm", curves.GPM, []string{"gpm", "usgpm"}},
	{"m³/h", curves.M3PerH, []string{"m³/h", "m3/h", "m3/hr", "cmh"}},
	{"L/s", curves.LPerS, []string{"l/s", "lps"}},
}

var numberSuffix = regexp.MustCompile(`^([-+]?(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)(?:[eE][-+]?[0-9]+)?)\s*(.*)$`)

// parseFlowArg reads a flow flag's value. It refuses what is not a finite
// number above zero with a known unit, naming the flag.
func parseFlowArg(flag, s string) (flowArg, error) {
	v, unit, err := splitNumber(flag, s)
	if err != nil {
		return flowArg{}, err
	}
	if !(v > 0) {
		return flowArg{}, usageError{fmt.Errorf("--%s %s: give a flow above zero", flag, s)}
	}
	switch {
	case unit == "" || unit == "%":
		return flowArg{Value: v, Unit: unit}, nil
	}
	for _, u := range flowUnits {
		for _, n := range u.names {
			if strings.EqualFold(unit, n) {
				return flowArg{Value: v, Unit: u.name}, nil
			}
		}
	}
	return flowArg{}, usageError{fmt.Errorf("--%s %s: unknown flow unit %q (give gpm, m3/h or L/s, or a percentage such as 60%%)", flag, s, unit)}
}

// splitNumber reads a finite number and what follows it.
func splitNumber(flag, s string) (float64, string, error) {
	t := strings.TrimSpace(s)
	if strings.ContainsAny(t, ",'") {
		// 1,800 or 1,5: a thousands separator or a decimal comma; refuse
		// rather than guess.
		return 0, "", usageError{fmt.Errorf("--%s %q: write the number without separators, with a decimal point (1800, 1.5)", flag, s)}
	}
	m := numberSuffix.FindStringSubmatch(t)
	if m == nil {
		return 0, "", usageError{fmt.Errorf("--%s %q: not a number", flag, s)}
	}
	v, err := strconv.ParseFloat(m[1], 64)
	if err != nil || math.IsInf(v, 0) || math.IsNaN(v) {
		return 0, "", usageError{fmt.Errorf("--%s %q: not a finite number", flag, s)}
	}
	return v, strings.TrimSpace(m[2]), nil
}

// SI converts the flow to m³/s: a bare number in the plant's flow unit, a
// percentage of base.
func (f flowArg) SI(u curves.UnitSystem, base curves.Flow) curves.Flow {
	switch f.Unit {
	case "":
		return u.FlowIn(f.Value)
	case "%":
		return curves.Flow(f.Value / 100 * float64(base))
	}
	for _, x := range flowUnits {
		if x.name == f.Unit {
			return curves.Flow(f.Value * x.per)
		}
	}
	panic("cmd: flowArg with unit " + f.Unit) // parseFlowArg sets only known units
}

// flowRange resolves a flow flag against the plant and checks it lies in
// [lo, hi] fractions of the base flow, naming the flag and the range in
// the plant's unit otherwise.
func flowRange(flag, s string, u curves.UnitSystem, base curves.Flow, lo, hi float64, of string) (curves.Flow, error) {
	f, err := parseFlowArg(flag, s)
	if err != nil {
		return 0, err
	}
	q := f.SI(u, base)
	if !(q > 0) || float64(q) < lo*float64(base)*(1-1e-12) || float64(q) > hi*float64(base)*(1+1e-12) {
		from := "from " + u.FormatFlow(curves.Flow(lo*float64(base))) + " (" + pctText(lo) + ")"
		if lo == 0 {
			from = "above 0"
		}
		return 0, usageError{fmt.Errorf("--%s %s: give a flow %s to %s (%s of %s %s)", flag, s, from,
			u.FormatFlow(curves.Flow(hi*float64(base))), pctText(hi), of, u.FormatFlow(base))}
	}
	return q, nil
}

func pctText(f float64) string { return strconv.FormatFloat(100*f, 'f', -1, 64) + " %" }

// fractionValue is a pflag.Value for a fraction typed as 0.15 or 15%,
// within (lo, hi) exclusive of 0 when positive is set.
type fractionValue struct {
	dst    *float64
	lo, hi float64 // inclusive bounds as fractions
}

var _ pflag.Value = (*fractionValue)(nil)

func (f *fractionValue) String() string {
	if f.dst == nil || *f.dst == 0 {
		return ""
	}
	return strconv.FormatFloat(*f.dst, 'g', -1, 64)
}

func (f *fractionValue) Type() string { return "fraction" }

// Set reads "0.15" or "15%"; out of [lo, hi] is an error (pflag names the
// flag in front of it).
func (f *fractionValue) Set(s string) error {
	v, unit, err := splitNumber("", s)
	if err != nil {
		return fmt.Errorf("not a finite number")
	}
	switch unit {
	case "%":
		v /= 100
	case "":
		if v > 1 {
			return fmt.Errorf("%s is not a fraction: write %s%% for a percentage", s, s)
		}
	default:
		return fmt.Errorf("unknown unit %q: give a fraction (0.15) or a percentage (15%%)", unit)
	}
	if v < f.lo || v > f.hi {
		return fmt.Errorf("give %s to %s (a fraction or a percentage)", pctText(f.lo), pctText(f.hi))
	}
	*f.dst = v
	return nil
}

// checkDuration checks a duration flag that was given: from lo to hi.
func checkDuration(flag string, d, lo, hi time.Duration) error {
	if d < lo || d > hi {
		return usageError{fmt.Errorf("--%s %s: give a delay from %s to %s (leave the flag out for the default)", flag, d, lo, hi)}
	}
	return nil
}
