package study

import (
	"errors"
	"fmt"
	"path/filepath"
	"runtime/debug"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
	"wattstage/profile"
)

// ErrBinWidth is returned by Prepare for a bin width it cannot use.
var ErrBinWidth = errors.New("study: bin width")

// Input is a plant with its load profile read: the steps a study solves.
type Input struct {
	Plant *plant.Plant
	// Trend is the trend log the profile names; nil for a bin profile.
	Trend *profile.Trend
	// Binned is the trend binned by flow when the study solves bins
	// instead of every interval (Prepare's binWidth); nil otherwise.
	Binned *profile.Binned
	// Steps are what every strategy is run over: the plant's bins, the
	// trend's intervals in time order, or the trend's bins.
	Steps []optimize.Step
}

// Prepare reads the plant's profile into steps. With a trend and a
// positive binWidth the trend is binned by flow at that width and the bins
// are solved; with a bin profile binWidth must be 0.
func Prepare(p *plant.Plant, binWidth curves.Flow) (*Input, error) {
	in := &Input{Plant: p}
	if p.Profile.Trend == nil {
		if binWidth != 0 {
			return nil, fmt.Errorf("%w: the plant's profile is already binned", ErrBinWidth)
		}
		in.Steps = optimize.StepsFromBins(p.Profile.Bins)
		return in, nil
	}
	spec := *p.Profile.Trend
	if !filepath.IsAbs(spec.Path) {
		spec.Path = filepath.Join(filepath.Dir(p.Source), spec.Path)
	}
	tr, err := profile.ReadTrendFile(spec, spec.Path)
	if err != nil {
		return nil, err
	}
	if err := tr.Plausible(p.TrendExpect()); err != nil {
		return nil, err
	}
	if len(tr.Points) > KeepStatesUpTo {
		// Reading a long log leaves its text and a record per line (more
		// than the points kept) as garbage; hand it back to the system now,
		// once, rather than let the study's allocations pile on top of it
		// until the collector's pacing catches up (issue 13: the peak RSS
		// of a 1,000,000-row trend was the read's garbage plus the study's).
		debug.FreeOSMemory()
	}
	in.Trend = tr
	if binWidth == 0 {
		in.Steps = optimize.StepsFromTrend(tr.Points)
		return in, nil
	}
	if !(binWidth > 0) {
		return nil, fmt.Errorf("%w: %g m³/s is not a positive flow", ErrBinWidth, float64(binWidth))
	}
	b, err := tr.Bin(binWidth)
	if err != nil {
		return nil, err
	}
	in.Binned = b
	in.Steps = optimize.StepsFromBinned(b)
	return in, nil
}
