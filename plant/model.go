package plant

import (
	"wattstage/curves"
	"wattstage/econ"
	"wattstage/profile"
)

// Plant is one pump group as understood from its file: every number in SI.
type Plant struct {
	Name        string
	Description string            // free text from the file; may be empty
	Source      string            // path of the plant file
	Units       curves.UnitSystem // how the file was read and how reports are written
	Fluid       curves.Fluid
	Models      []Model // pump models, each with a count of identical units

	System     curves.System // required head vs flow through the load
	DesignFlow curves.Flow   // m³/s
	DesignHead curves.Head   // m
	MinFlow    curves.Flow   // plant minimum flow held by a bypass, m³/s; 0 = none
	// BypassAtLoopEnd places the bypass that holds MinFlow at the far end of
	// the loop: below the minimum flow the pumped flow crosses the whole
	// loop, and the pumps work against the head the system needs at the
	// pumped flow. False (the default): the bypass is at the plant, the loop
	// carries only the load flow, and the head is the system's need at the
	// load flow.
	BypassAtLoopEnd bool

	Profile  Profile
	Tariff   econ.Tariff
	Retrofit econ.Retrofit
	// HasRetrofit is true when the file has a retrofit section (Retrofit is
	// the zero value otherwise).
	HasRetrofit bool
	Sequence    *Sequence // the sequence the plant runs today; nil when not given
	// Suction is where the pumps draw from, for the NPSH check; nil when
	// the file has no suction section.
	Suction  *Suction
	DPSensor string // where the differential-pressure sensor is, in the file's words; "" = not given

	// Defaults lists, in plain words, every value the loader filled in because
	// the file did not give it (e.g. "pumps[0].motor.full_load_efficiency:
	// 93.6 % from 10 CFR 431.25 Table 5").
	Defaults []string

	// Warnings lists what is usable but questionable (a motor into its
	// service factor at design, a unit that cannot reach the design head,
	// a bin above the design flow), for the user to see, in the order they
	// were found, each at the value it is about.
	Warnings []Warning
}

// Model is one pump model of which Count identical units are installed.
type Model struct {
	Name string
	// Count is the number of identical units the plan may run: installed
	// less those in standby.
	Count int
	// Standby is the number of further installed units held in standby:
	// never planned, brought in when a duty unit fails. 0 = none.
	Standby int
	// Tags name the installed units (Count+Standby of them), in the order
	// the file gives; nil = the model's name and a number (Model.Tag).
	Tags       []string
	RatedSpeed float64 // rpm
	Pump       *curves.Pump
	MinSpeed   float64     // fraction of rated speed
	MaxSpeed   float64     // fraction of rated speed; may exceed 1
	MinFlow    curves.Flow // minimum continuous stable flow at rated speed, m³/s
	Runout     curves.Flow // largest allowed flow at rated speed, m³/s
	Motor      curves.Motor
	Drive      curves.Drive // curves.FixedSpeed{} for an across-the-line unit
	BranchK    float64      // per-unit branch loss coefficient, m per (m³/s)²; 0 = none
	// DriveBypass is true when each unit's drive has a bypass contactor, so
	// the unit may run across the line at rated speed where that draws
	// less (near full speed the drive's own losses can exceed what speed
	// control saves). False in the zero value.
	DriveBypass bool
	// NPSHr is the NPSH the pump requires against flow at rated speed, from
	// the datasheet; nil when the file gives none (no NPSH check).
	NPSHr *curves.NPSHCurve
}

// Suction is the suction side of the group, shared by every unit: the
// conditions of NPSH available and the margin the check asks for.
type Suction struct {
	// Suction holds the absolute pressure at the reference level, its
	// static head above the impeller eye, the suction loss at a plant flow,
	// and the fluid's vapour pressure and density, SI.
	curves.Suction
	// Margin is the NPSHa/NPSHr ratio the check asks for at every
	// operating point; DefaultNPSHMargin when the file is silent.
	Margin float64
	// Basis says in plain words where the absolute pressure comes from
	// (the standard atmosphere at an altitude, or a closed system's
	// pressure), for the reports.
	Basis string
}

// Variable reports whether the model's units run on a variable-speed drive.
func (m *Model) Variable() bool { return m.Drive.Variable() }

// Profile is the load: flow bins with hours, or a trend.
type Profile struct {
	Bins  []Bin
	Trend *profile.TrendSpec // nil when the file gives bins only
	// AnnualHours is the hours a year the profile stands for: the period's
	// energy is scaled to a year by AnnualHours over the hours it covers.
	// 0 = the default: the bins' own hours (they are hours a year, the
	// plant off for the rest), or 8,760 h for a trend.
	AnnualHours float64
}

// Bin is a load-profile bin: a flow through the load and the hours a year at it.
type Bin struct {
	Flow  curves.Flow // m³/s through the load
	Hours float64     // h/yr
}

// Sequence is how the plant runs today, in one of two forms: common-speed
// staging on speed thresholds (StageUpSpeed > 0), or a number of units
// running by plant-flow band (Bands; a fixed number always running is one
// band), at fixed speed or on their drives.
type Sequence struct {
	StageUpSpeed      float64 // fraction of rated: add a unit when the speed stays above this; 0 = not this form
	StageDownSpeed    float64 // fraction of rated: drop a unit when the speed stays below this
	StageUpDelayMin   float64 // minutes the condition must hold; 0 = none
	StageDownDelayMin float64 // minutes

	// Bands are the units running by plant flow, in increasing flow; the
	// last band has no upper flow. Empty in the speed-threshold form.
	Bands []SequenceBand
	// FixedSpeed is true when the units run across the line today (a
	// throttled plant before a drive retrofit) in the band form.
	FixedSpeed bool
}

// SequenceBand is one band of the current sequence: Running units run while
// the plant flow is below UpTo.
type SequenceBand struct {
	UpTo    curves.Flow // m³/s; 0 = no upper flow (the last band)
	Running int
}

// ByBands reports whether the sequence gives units by flow band.
func (s *Sequence) ByBands() bool { return len(s.Bands) > 0 }

// RunningAt is the number of units the band form runs at a plant flow.
func (s *Sequence) RunningAt(q curves.Flow) int {
	for _, b := range s.Bands {
		if b.UpTo == 0 || q < b.UpTo {
			return b.Running
		}
	}
	return s.Bands[len(s.Bands)-1].Running
}

// RequiredHead is the head the pumps must make at a load flow: the
// system's need at the load flow, or, with the bypass at the loop's far end
// (BypassAtLoopEnd), at the pumped flow max(load, MinFlow).
func (p *Plant) RequiredHead(load curves.Flow) curves.Head {
	if p.BypassAtLoopEnd && p.MinFlow > load {
		return p.System.Required(p.MinFlow)
	}
	return p.System.Required(load)
}
