package profile

import (
	"math"
	"slices"
	"testing"
	"time"

	"wattstage/curves"
)

// The example trend of the invented chilled-water plant, written by
// examples/gentrend with its faults placed on purpose.
const exampleFile = "../examples/chilled-water-trend.csv"

var exampleSpec = TrendSpec{
	TimeColumn:  "timestamp",
	FlowColumn:  "plant_flow_gpm",
	DPColumn:    "loop_dp_psi",
	PowerColumn: "pump_kw",
	FlowUnit:    "gpm",
	DPUnit:      "psi",
	TimeZone:    "America/Chicago",
}

func TestExampleTrend(t *testing.T) {
	tr, err := ReadTrendFile(exampleSpec, exampleFile)
	if err != nil {
		t.Fatal(err)
	}
	rep := tr.Report
	// 8760 hours of 2025 less 33 h of logger gaps plus one duplicated row;
	// the faults and their lines are those gentrend writes.
	checks := []struct {
		reason Reason
		lines  []int
	}{
		{BlankFlow, []int{513}},     // 2025-01-22 07:00
		{BadFlow, []int{5863}},      // "#N/A" on 2025-09-03 13:00
		{AbsurdFlow, []int{4857}},   // 27150 gpm on 2025-07-22 15:00
		{Duplicate, []int{3844}},    // 2025-06-10 10:00 written twice
		{RepeatedHour, []int{7291}}, // second 01:00 on 2025-11-02
		{BadDP, []int{8270}},        // "---" on 2025-12-12 20:00
	}
	for _, c := range checks {
		if got := rep.LinesOf(c.reason); !slices.Equal(got, c.lines) {
			t.Errorf("%s: lines %v, want %v", c.reason, got, c.lines)
		}
	}
	if rep.Rows != 8728 || rep.Kept != 8724 || len(rep.Issues) != len(checks) || rep.Blank != 1 {
		t.Errorf("rows %d kept %d issues %+v blank %d", rep.Rows, rep.Kept, rep.Issues, rep.Blank)
	}
	// 4 logger gaps (6 + 2 + 24 + 1 h) and the 3 dropped rows (1 h each)
	if rep.Gaps != 7 || rep.MissingHours != 36 || rep.LongestGap != 24*time.Hour {
		t.Errorf("gaps %d missing %v longest %v", rep.Gaps, rep.MissingHours, rep.LongestGap)
	}
	if tr.Hours != 8724 || tr.Span != 8760 || tr.Interval != time.Hour {
		t.Errorf("hours %v span %v interval %v", tr.Hours, tr.Span, tr.Interval)
	}
	// every kept row has an invented meter reading but the 2 meter dropouts
	if !tr.Start.Equal(time.Date(2025, 1, 1, 6, 0, 0, 0, time.UTC)) || rep.WithPower != rep.Kept-2 || !tr.HasDP() {
		t.Errorf("start %v with power %d of %d DP %v", tr.Start, rep.WithPower, rep.Kept, tr.HasDP())
	}
	// the invented plant runs between 25 % and 95 % of its 2700 gpm design
	for _, p := range tr.Points {
		if g := float64(p.Flow) / curves.GPM; g < 0.25*2700-1e-9 || g > 0.95*2700+1e-9 {
			t.Fatalf("line %d: %v gpm outside the generator's range", p.Line, g)
		}
	}
	var sum float64
	for _, p := range tr.Points {
		sum += p.Hours
	}
	if math.Abs(sum-tr.Hours) > 1e-9 {
		t.Errorf("point hours sum to %v, trend says %v", sum, tr.Hours)
	}
}

func BenchmarkReadTrendYear(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		if _, err := ReadTrendFile(exampleSpec, exampleFile); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkBinYear(b *testing.B) {
	tr, err := ReadTrendFile(exampleSpec, exampleFile)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if _, err := tr.Bin(100 * curves.GPM); err != nil {
			b.Fatal(err)
		}
	}
}
