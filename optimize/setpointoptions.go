package optimize

import (
	"fmt"
	"math"
	"time"
)

// SetpointOptions tune the derivation. The zero value takes every default.
type SetpointOptions struct {
	// Deadband is how far the stage-down flow sits below the stage-up flow,
	// as a fraction of the stage-up flow. 0 = DefaultDeadband (0.10).
	Deadband float64
	// SpeedMargin is the least difference, as a fraction of rated speed,
	// between the speed the units run at just after a stage change and the
	// speed that would call the reverse change. 0 = 0.03.
	SpeedMargin float64
	// CapacityMargin: where a stage runs out of capacity before its
	// crossover, stage up at this fraction below the flow where it runs out,
	// so that the stage-up delay does not leave the load short. 0 = 0.03.
	CapacityMargin float64
	// UpDelay and DownDelay are how long a stage-up or stage-down condition
	// must hold before the change. 0 = 5 min and 10 min.
	UpDelay, DownDelay time.Duration
	// CapacityDelay is the stage-up delay where the lower stage runs out of
	// capacity (its units near maximum speed, runout or motor limit) rather
	// than crossing over. 0 = 1 min.
	CapacityDelay time.Duration
	// Points is the number of flow intervals of the staging scan. 0 = 240.
	Points int
	// Signal is the staging signal asked for: "flow", "speed" or
	// "flow-and-speed"; "" = the most robust for the plant (chooseSignal).
	Signal string
}

// DefaultSetpointOptions are the starting values of a derived sequence. The
// delays are the trade's usual ones (stage up after about 5 min, or 1 min
// where the running units are at their limit, down after about 10 min), and
// the capacity margin is the usual offset of about 3 % below a stage
// boundary (common practice and ASHRAE Guideline 36-2021 as quoted in
// public implementation documentation, docs/sources.md §7); the deadband and speed
// margin are wattstage's starting values. All are to be adjusted on
// commissioning.
var DefaultSetpointOptions = SetpointOptions{
	Deadband: 0.10, SpeedMargin: 0.03, CapacityMargin: 0.03,
	UpDelay: 5 * time.Minute, DownDelay: 10 * time.Minute, CapacityDelay: time.Minute, Points: 240,
}

func fillSetpointOptions(o SetpointOptions) (SetpointOptions, []string, error) {
	def := DefaultSetpointOptions
	var used []string
	pick := func(v *float64, dv float64, what string) {
		if *v == 0 {
			*v = dv
			used = append(used, what)
		}
	}
	pick(&o.Deadband, def.Deadband, fmt.Sprintf("deadband %.0f %% of the stage-up flow (wattstage starting value)", 100*def.Deadband))
	pick(&o.SpeedMargin, def.SpeedMargin, fmt.Sprintf("speed margin %.0f %% of rated speed (wattstage starting value)", 100*def.SpeedMargin))
	pick(&o.CapacityMargin, def.CapacityMargin, fmt.Sprintf("capacity margin %.0f %% below the flow where a stage runs out (common practice)", 100*def.CapacityMargin))
	if o.UpDelay == 0 {
		o.UpDelay = def.UpDelay
		used = append(used, "stage-up delay 5 min (common practice)")
	}
	if o.DownDelay == 0 {
		o.DownDelay = def.DownDelay
		used = append(used, "stage-down delay 10 min (common practice)")
	}
	if o.CapacityDelay == 0 {
		o.CapacityDelay = def.CapacityDelay
		used = append(used, "stage-up delay 1 min where the running units are at their limit (common practice)")
	}
	if o.Points == 0 {
		o.Points = def.Points
	}
	switch {
	case o.Deadband < 0 || o.Deadband >= 0.5 || math.IsNaN(o.Deadband):
		return o, nil, fmt.Errorf("%w: deadband %g must be above 0 and below 0.5 of the stage-up flow", ErrSetpoints, o.Deadband)
	case o.SpeedMargin < 0 || o.SpeedMargin >= 0.5 || math.IsNaN(o.SpeedMargin):
		return o, nil, fmt.Errorf("%w: speed margin %g must be above 0 and below 0.5", ErrSetpoints, o.SpeedMargin)
	case o.CapacityMargin < 0 || o.CapacityMargin >= 0.5 || math.IsNaN(o.CapacityMargin):
		return o, nil, fmt.Errorf("%w: capacity margin %g must be above 0 and below 0.5", ErrSetpoints, o.CapacityMargin)
	case o.UpDelay < 0 || o.DownDelay < 0 || o.CapacityDelay < 0:
		return o, nil, fmt.Errorf("%w: delays must not be negative", ErrSetpoints)
	case o.Signal != "" && !validSignal(o.Signal):
		return o, nil, fmt.Errorf("%w: staging signal %q: give flow, speed or flow-and-speed", ErrSetpoints, o.Signal)
	case o.Points < 8:
		return o, nil, fmt.Errorf("%w: the scan needs at least 8 flow intervals", ErrSetpoints)
	}
	return o, used, nil
}
