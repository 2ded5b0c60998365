package optimize

import (
	"time"

	"wattstage/curves"
	"wattstage/plant"
)

// Limits that set a staging value, beside the operating limits in types.go.
const (
	LimitCrossover Limit = "power crossover"
	LimitDeadband  Limit = "deadband"
	LimitHunting   Limit = "speed margin (no hunting)"
	LimitBand      Limit = "band of the stage below"
	LimitNextLow   Limit = "lowest flow of the next stage"
)

// Stage is one combination of running units in the sequence.
type Stage struct {
	Number  int   // 1 for the stage that runs at the lowest flow
	Counts  []int // running units per model
	Running int
	// Low and High are the plant flows the stage runs over: from the
	// stage-down flow into the stage below (the lowest plant flow for stage
	// 1) to its own stage-up flow (the plant capacity for the last stage).
	Low, High curves.Flow
	// LowLimit and HighLimit are the operating limits the stage sits on at
	// the ends of its range (minimum speed, plant minimum flow, …), if any.
	LowLimit, HighLimit Limit
	// LowSpeed and HighSpeed are the common speed at the ends of the range;
	// NaN when the stage has no unit on a drive.
	LowSpeed, HighSpeed float64
	Served              bool // every scanned flow of the range is served by this stage
}

// Threshold is one stage-change value, written the ways sequences state it.
type Threshold struct {
	Flow              curves.Flow  // plant (pumped) flow, m³/s
	PerUnit           curves.Flow  // flow per running unit before the change
	Design            float64      // Flow over the plant design flow
	Head              curves.Head  // header head before the change
	Power, PowerAfter curves.Power // input before and after the change at Flow
	Delay             time.Duration
	Limit             Limit // what sets the flow value
	// Speed is the speed form of the value: the common speed of the running
	// drive units just before the change; After is their speed at Flow just
	// after it (fractions of rated). NaN where no running unit is on a drive,
	// or (stage-down) where speed cannot serve as the signal.
	Speed, After float64
	// SpeedFlow is the plant flow at which Speed is reached, SpeedAfter the
	// speed just after a change made there, and SpeedLimit what sets Speed:
	// the same as Flow, After and Limit unless the speed margin lowered a
	// stage-down speed.
	SpeedFlow  curves.Flow
	SpeedAfter float64
	SpeedLimit Limit
}

// Option is one combination of running units at a flow with its input.
type Option struct {
	Counts []int
	Power  curves.Power
	Served bool
	Reason string // why it does not serve, if it does not
}

// Transition is the change between stage From and stage From+1.
type Transition struct {
	From, To     int   // stage numbers
	Lower, Upper []int // running units per model in the two stages
	Start        []int // units to start per model on the way up (stopped on the way down)
	Stop         []int // units to stop per model on the way up (started on the way down)
	// Crossover is the flow where the two stages draw equal input; 0 where
	// the lower stage runs out (or the upper cannot run) before they do.
	Crossover      curves.Flow
	CrossoverPower curves.Power
	Up, Down       Threshold
	// UpOptions are the combinations with the upper stage's count of units
	// at the stage-up flow and DownOptions those with the lower stage's count
	// at the stage-down flow, lowest input first: the reasoning for which
	// model is brought on next and which unit is dropped first. On a plant
	// of many combinations only the cheapest maxOptions are listed, and
	// UpOthers and DownOthers count the combinations left out.
	UpOptions, DownOptions []Option
	UpOthers, DownOthers   int
	Notes                  []string
	// Band is the flow range around the crossover where the two stages
	// draw within NearEqualTolerance of each other; nil without a crossover.
	Band *NearEqual
}

// Setpoints is a derived staging sequence.
type Setpoints struct {
	Plant       *plant.Plant    `json:"-"`
	Options     SetpointOptions // with the defaults filled in
	Defaults    []string        // options left at their default, in plain words
	Stages      []Stage
	Transitions []Transition
	Lowest      curves.Flow // lowest plant flow scanned (the plant minimum flow, if any)
	Capacity    curves.Flow // most plant flow served on the system curve
	OneOut      *UnitOutCheck
	Warnings    []string
	// Signal is the one signal the sequence stages on, and SignalWhy the
	// reason it was chosen (or that it was asked for).
	Signal    Basis
	SignalWhy string
}
