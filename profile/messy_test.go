package profile

import (
	"math"
	"slices"
	"testing"
	"time"

	"wattstage/curves"
)

// messySpec maps testdata/messy.csv, a file made for this test with one or
// more rows of every reason (see the comments in TestMessyFile). Column
// names differ in case from the header on purpose, and units are left to be
// read from the headers.
var messySpec = TrendSpec{
	TimeColumn:  "timestamp",
	FlowColumn:  "plant flow (gpm)",
	DPColumn:    "Loop DP (psi)",
	PowerColumn: "Pump kW",
	TimeZone:    "America/Chicago",
	MaxFlow:     5000 * curves.GPM,
}

func TestMessyFile(t *testing.T) {
	tr, err := ReadTrendFile(messySpec, "testdata/messy.csv")
	if err != nil {
		t.Fatal(err)
	}
	rep := tr.Report
	// Every count below was worked out by hand from the file.
	want := []struct {
		reason Reason
		lines  []int
	}{
		{TooFewFields, []int{10}},   // a stamp and nothing else
		{TooManyFields, []int{12}},  // a fifth, non-empty field
		{MixedDelimiter, []int{11}}, // semicolons in a comma file
		{BlankTime, []int{13}},      // ",1080,…"
		{BadTime, []int{14}},        // "2025-03-09 8am"
		{MissingLocal, []int{7}},    // 02:00 on 9 March 2025 does not exist in Chicago (spring forward)
		{BlankFlow, []int{15}},      // empty flow
		{BadFlow, []int{16}},        // "OFFLINE"
		{NegativeFlow, []int{17}},   // -5 gpm
		{AbsurdFlow, []int{27}},     // 99999 gpm > MaxFlow 5000 gpm
		{Duplicate, []int{24, 31}},  // a repeated row, and a third 01:00 on 2 November
		{OutOfOrder, []int{26}},     // 17:00 after 18:00, kept and sorted
		{RepeatedHour, []int{30}},   // second 01:00 on 2 November (fall back): standard time
		{BadDP, []int{20}},          // "abc"
		{NegativeDP, []int{21}},     // -1.0 psi
		{BadPower, []int{22}},       // "n/a"
		{NegativePow, []int{23}},    // -3 kW
	}
	for _, w := range want {
		if got := rep.LinesOf(w.reason); !slices.Equal(got, w.lines) || rep.Count(w.reason) != len(w.lines) {
			t.Errorf("%s: count %d lines %v, want %v", w.reason, rep.Count(w.reason), got, w.lines)
		}
	}
	if len(rep.Issues) != len(want) {
		t.Errorf("%d reasons reported, want %d: %+v", len(rep.Issues), len(want), rep.Issues)
	}
	counts := []struct {
		name      string
		got, want int
	}{
		{"lines", rep.Lines, 34},
		{"header line", rep.HeaderLine, 4},
		{"preamble", rep.Preamble, 2},     // title and site lines
		{"blank", rep.Blank, 3},           // lines 19, 33 and ",,," on 34
		{"rows", rep.Rows, 27},            // lines 5–18 and 20–32
		{"kept", rep.Kept, 15},            // 11 in March, 4 in November
		{"dropped", rep.Dropped, 12},      // one per dropping line above
		{"with DP", rep.WithDP, 13},       // kept less lines 20, 21
		{"with power", rep.WithPower, 12}, // kept less lines 22, 23 and 32 (no power field)
		{"gaps", rep.Gaps, 2},             // 04:00→12:00 and March→November
		{"points", len(tr.Points), 15},
	}
	for _, c := range counts {
		if c.got != c.want {
			t.Errorf("%s = %d, want %d", c.name, c.got, c.want)
		}
	}
	if rep.Dropped+rep.Kept != rep.Rows {
		t.Errorf("kept %d + dropped %d ≠ rows %d", rep.Kept, rep.Dropped, rep.Rows)
	}
	if rep.Layout != "2006-01-02 15:04" || rep.Delimiter != ',' || tr.Interval != time.Hour {
		t.Errorf("layout %q delimiter %q interval %v", rep.Layout, rep.Delimiter, tr.Interval)
	}
	if tr.Spec.FlowUnit != "gpm" || tr.Spec.DPUnit != "psi" {
		t.Errorf("units read from the headers: %q %q", tr.Spec.FlowUnit, tr.Spec.DPUnit)
	}
	// Gaps: 04:00 → 12:00 CDT misses 7 h; 19:00 CDT 9 March → 00:00 CDT
	// 2 November misses 238 days less 19 h = 5693 h (hand computed).
	if rep.MissingHours != 5700 || rep.LongestGap != 5693*time.Hour {
		t.Errorf("missing %v h, longest %v", rep.MissingHours, rep.LongestGap)
	}
	// Every point stands for one hour; the span runs from 00:00 CST 9 March
	// (06:00 UTC) to 03:00 CST 2 November (09:00 UTC): 238 days + 3 h.
	if tr.Hours != 15 || tr.Span != 238*24+3 || math.Abs(tr.Coverage()-15.0/5715) > 1e-15 {
		t.Errorf("hours %v span %v coverage %v", tr.Hours, tr.Span, tr.Coverage())
	}
	utc := func(p Point) string { return p.Time.UTC().Format("01-02 15:04") }
	var got []string
	for _, p := range tr.Points {
		got = append(got, utc(p))
	}
	// 01:00 CST is 07:00 UTC; 03:00 CDT (after the skipped hour) is 08:00
	// UTC; the two 01:00 on 2 November are 06:00 (CDT) and 07:00 (CST).
	wantUTC := []string{"03-09 06:00", "03-09 07:00", "03-09 08:00", "03-09 09:00", "03-09 17:00", "03-09 18:00",
		"03-09 19:00", "03-09 20:00", "03-09 21:00", "03-09 22:00", "03-09 23:00",
		"11-02 05:00", "11-02 06:00", "11-02 07:00", "11-02 08:00"}
	if !slices.Equal(got, wantUTC) {
		t.Errorf("instants (UTC)\n got %v\nwant %v", got, wantUTC)
	}
	p := tr.Points
	// the quoted "1,040.5" read with its thousands separator
	if p[3].Line != 9 || math.Abs(float64(p[3].Flow)-1040.5*curves.GPM) > 1e-15 {
		t.Errorf("line 9 flow %v m³/s", p[3].Flow)
	}
	// 12.0 psi as head of water at 998.2 kg/m³: 2.31 ft per psi (common
	// practice, [P] in docs/sources.md §1) gives 12 × 2.31 / 0.99823 ft = 8.464 m; the
	// exact SI conversion gives 8.452 m. Tolerance 0.2 %: the 2.31 is rounded.
	if h := float64(p[0].DP); !p[0].HasDP || math.Abs(h-12*2.31/(998.2/999.972)*curves.Foot) > 0.002*h {
		t.Errorf("12 psi = %v m", h)
	}
	// power: 30.5 kW as W; the point on line 32 has no power field
	if !p[0].HasPower || p[0].Power != 30.5e3 || p[14].Line != 32 || p[14].HasPower {
		t.Errorf("power %v %v; last point %+v", p[0].HasPower, p[0].Power, p[14])
	}
	// the out-of-order row sits in time order; the points still hold their lines
	if p[9].Line != 26 || p[10].Line != 25 {
		t.Errorf("sorted lines %d %d", p[9].Line, p[10].Line)
	}
	if tr.Location.String() != "America/Chicago" || p[0].Time.Location() != tr.Location {
		t.Errorf("points not in the trend's zone: %v", p[0].Time.Location())
	}
}

// TestMessyWithoutZone reads the same file as UTC wall clock: 02:00 on
// 9 March is then an ordinary stamp, and the second and third 01:00 on
// 2 November are duplicates, with a warning to give the zone.
func TestMessyWithoutZone(t *testing.T) {
	spec := messySpec
	spec.TimeZone = ""
	tr, err := ReadTrendFile(spec, "testdata/messy.csv")
	if err != nil {
		t.Fatal(err)
	}
	rep := tr.Report
	if rep.Count(MissingLocal) != 0 || rep.Count(RepeatedHour) != 0 || !slices.Equal(rep.LinesOf(Duplicate), []int{24, 30, 31}) || rep.Kept != 15 {
		t.Errorf("missing local %d repeated %d duplicates %v kept %d", rep.Count(MissingLocal), rep.Count(RepeatedHour), rep.LinesOf(Duplicate), rep.Kept)
	}
	if !slices.ContainsFunc(tr.Warnings, func(w Warning) bool {
		return w.Message == "3 duplicate stamps: if the log is local time with daylight saving, give the trend's time zone"
	}) {
		t.Errorf("warnings %q", tr.Warnings)
	}
}
