package profile

import (
	"time"

	"wattstage/curves"
)

// TrendSpec says where a trend log is and how its columns map to plant
// quantities. The zero value of every optional field works.
type TrendSpec struct {
	Path        string // CSV file, relative to the plant file's folder
	TimeColumn  string // header of the timestamp column; empty = the first column
	FlowColumn  string // header of the plant flow column; empty = the only header containing "flow"
	DPColumn    string // optional: differential pressure column
	PowerColumn string // optional: measured total pump power column, kW
	FlowUnit    string // "gpm", "m3/h" or "L/s"; empty = read from the flow column's header
	DPUnit      string // "psi", "kPa", "ft" or "m"; empty = read from the DP column's header
	TimeFormat  string // Go time layout, a pattern such as "YYYY-MM-DD hh:mm" (see TimeLayout), or "unix" for epoch seconds; empty tries the common ones

	// TimeZone is the IANA zone (e.g. "America/Chicago") of stamps that carry
	// no UTC offset. Empty reads such stamps as UTC wall clock, with no
	// daylight saving: a repeated local hour then shows as duplicate stamps
	// and a skipped one as a gap.
	TimeZone string
	// Density turns a DP given as a pressure (psi, kPa) into head of the
	// pumped fluid, kg/m³; 0 = curves.ReferenceDensity (998.2, water at 20 °C).
	Density float64
	// MaxFlow is the largest believable plant flow, m³/s; rows above it are
	// dropped as absurd. 0 = 3 × the 99th percentile of the positive flows.
	MaxFlow curves.Flow
	// Interval is the logging interval, at most 31 days; 0 = the median
	// step between stamps.
	Interval time.Duration
}

// Point is one usable row of a trend log. A point stands for the interval
// that starts at its stamp.
//
// The two flags come last, together, so that a point is 72 bytes, not 80
// (a million-row trend keeps a million points).
type Point struct {
	Time     time.Time    // the stamp, in the trend's zone
	Flow     curves.Flow  // plant flow, m³/s (≥ 0)
	DP       curves.Head  // differential pressure as head of the pumped fluid, m; valid when HasDP
	Power    curves.Power // measured pump power, W; valid when HasPower
	Hours    float64      // the interval the point represents, h: min(logging interval, step to the next point)
	Line     int          // line of the row in the file (1-based)
	HasDP    bool         // the row had a usable DP cell
	HasPower bool         // the row had a usable power cell
}

// Trend is a trend log read, checked and put in time order.
type Trend struct {
	Name     string         // the file name as given to ReadTrend
	Spec     TrendSpec      // the spec with inferred columns and units filled in
	Location *time.Location // zone of the stamps (UTC when the spec gives none)
	Points   []Point        // usable rows, strictly increasing in time
	Interval time.Duration  // logging interval (given, or the median step)
	Start    time.Time      // first point
	End      time.Time      // end of the last point's interval
	Hours    float64        // hours the points represent (sum of Point.Hours)
	Span     float64        // hours from Start to End
	Report   Report         // every row accounted for
	Warnings []Warning      // usable but questionable, in the order found: say them to the user
}

// Coverage is the fraction of the span the points represent (1 = no gaps).
func (t *Trend) Coverage() float64 {
	if t.Span <= 0 {
		return 0
	}
	return t.Hours / t.Span
}

// HasDP reports whether any point carries a DP.
func (t *Trend) HasDP() bool { return t.Report.WithDP > 0 }

// HasPower reports whether any point carries a measured power.
func (t *Trend) HasPower() bool { return t.Report.WithPower > 0 }

// Bin bins the trend's points by flow; see the package function Bin.
func (t *Trend) Bin(width curves.Flow) (*Binned, error) { return Bin(t.Points, width) }
