package cmd

import (
	"fmt"
	"io"
	"strconv"
	"strings"

	"wattstage/curves"
	"wattstage/plant"
	"wattstage/profile"
	"wattstage/study"
)

// writeProfileBlock writes a trend's bins as the profile: block of a plant
// file: each bin at its hours-weighted mean flow, its hours brought to a
// year as plan brings the trend (× 8,760 h over the hours covered), the
// hours at zero flow left out (the plant off). Flows are in the plant's
// unit with pl, else in the trend's (L/s with its suffix, for an SI file).
func writeProfileBlock(out io.Writer, tr *profile.Trend, b *profile.Binned, pl *plant.Plant) error {
	units, suffix := curves.SI, ""
	switch {
	case pl != nil:
		units = pl.Units
	case strings.EqualFold(tr.Spec.FlowUnit, "gpm"):
		units = curves.US
	case strings.EqualFold(tr.Spec.FlowUnit, "L/s"):
		suffix = " L/s"
	}
	toFlow := func(q curves.Flow) float64 { return units.FlowOut(q) }
	if suffix != "" {
		toFlow = func(q curves.Flow) float64 { return float64(q) / curves.LPerS }
	}
	if !(b.Hours > 0) {
		return badInputf("%s: the trend covers no hours: no profile to write", tr.Name)
	}
	factor := curves.HoursPY / b.Hours
	var lines []string
	var off, total float64
	for _, fb := range b.Bins {
		if fb.High == 0 {
			off += fb.Hours
			continue
		}
		h := fb.Hours * factor
		total += h
		lines = append(lines, fmt.Sprintf("    - {flow: %s%s, hours: %s}", decimal(toFlow(fb.MeanFlow), 1), suffix, decimal(h, 1)))
	}
	if len(lines) == 0 {
		return badInputf("%s: every interval has zero flow: no profile to write", tr.Name)
	}
	fmt.Fprintf(out, "# From %s: %s h covered from %s to %s, binned by %s %s; each bin at its mean flow.\n",
		tr.Name, study.Grouped(b.Hours), tr.Start.Format("2006-01-02 15:04"), tr.End.Format("2006-01-02 15:04"),
		decimal(toFlow(b.Width), 4), strings.TrimSpace(flowName(units, suffix)))
	fmt.Fprintf(out, "# Hours brought to a year: × %s (8,760 h ÷ %s h covered)", decimal(factor, 4), study.Grouped(b.Hours))
	if off > 0 {
		fmt.Fprintf(out, "; %s h at zero flow left out (the plant off)", decimal(off*factor, 1))
	}
	fmt.Fprintf(out, ".\n# Flows in %s: for a plant file with units: %s. Replace the file's profile: with this block.\n",
		strings.TrimSpace(flowName(units, suffix)), units)
	fmt.Fprintln(out, "profile:")
	fmt.Fprintf(out, "  bins:                          # %s h a year in all\n", study.Grouped(total))
	for _, l := range lines {
		fmt.Fprintln(out, l)
	}
	return nil
}

func flowName(u curves.UnitSystem, suffix string) string {
	if suffix != "" {
		return suffix
	}
	return u.FlowUnit()
}

// decimal writes v with at most prec decimals and no trailing zeros.
func decimal(v float64, prec int) string {
	s := strconv.FormatFloat(v, 'f', prec, 64)
	if strings.Contains(s, ".") {
		s = strings.TrimRight(strings.TrimRight(s, "0"), ".")
	}
	return s
}
