package profile

import (
	"bytes"
	"errors"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"wattstage/curves"
)

// fuzzSpecs are the specs each fuzz input is read with: every column
// mapped, in a zone with daylight saving; and everything inferred.
var fuzzSpecs = []TrendSpec{
	{TimeColumn: "timestamp", FlowColumn: "plant_flow_gpm", DPColumn: "loop_dp_psi", PowerColumn: "pump_kw",
		FlowUnit: "gpm", DPUnit: "psi", TimeZone: "America/Chicago"},
	{},
}

// FuzzReadTrend checks that ReadTrend never panics, that an unusable file
// is a *ParseError, and that a usable one keeps its invariants: every row
// accounted for once, points strictly in time order with positive weights,
// flows finite and within the limit, line numbers inside the file, the
// points' hours no more than the span; that binning conserves hours; and
// that writing the points back out and reading them again gives the same
// points (a round trip in the manner of encoding/csv's fuzz test).
func FuzzReadTrend(f *testing.F) {
	for _, glob := range []string{"../testdata/invalid/trends/*.csv", "testdata/*.csv"} {
		files, _ := filepath.Glob(glob)
		for _, name := range files {
			if b, err := os.ReadFile(name); err == nil {
				f.Add(b)
			}
		}
	}
	f.Add([]byte("timestamp,plant_flow_gpm\n2025-11-02 01:00,5\n2025-11-02 01:00,6\n2025-11-02 01:30,7\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		for _, spec := range fuzzSpecs {
			tr, err := ReadTrend(spec, bytes.NewReader(data), "fuzz.csv")
			if err != nil {
				var pe *ParseError
				if !errors.As(err, &pe) || pe.File != "fuzz.csv" || !strings.HasPrefix(err.Error(), "fuzz.csv") {
					t.Fatalf("error %T %q is not a ParseError naming the file", err, err)
				}
				continue
			}
			checkTrend(t, tr)
			roundTrip(t, tr)
		}
	})
}

func checkTrend(t *testing.T, tr *Trend) {
	t.Helper()
	rep := tr.Report
	if rep.Kept != len(tr.Points) || rep.Kept+rep.Dropped != rep.Rows || rep.Kept == 0 {
		t.Fatalf("kept %d, dropped %d, rows %d, points %d", rep.Kept, rep.Dropped, rep.Rows, len(tr.Points))
	}
	dropped := 0
	for _, is := range rep.Issues {
		if is.Reason.Drops() {
			dropped += is.Count
		}
		if is.Count <= 0 || len(is.Lines) > min(is.Count, MaxLines) {
			t.Fatalf("issue %+v", is)
		}
		for i, l := range is.Lines {
			if l <= rep.HeaderLine || l > rep.Lines || i > 0 && l <= is.Lines[i-1] {
				t.Fatalf("issue %s line %d outside (%d, %d] or unsorted: %v", is.Reason, l, rep.HeaderLine, rep.Lines, is.Lines)
			}
		}
	}
	if dropped != rep.Dropped {
		t.Fatalf("dropping reasons count %d rows, report says %d", dropped, rep.Dropped)
	}
	if rep.Rows+rep.Blank+rep.HeaderLine > rep.Lines {
		t.Fatalf("rows %d + blank %d + header line %d > %d lines", rep.Rows, rep.Blank, rep.HeaderLine, rep.Lines)
	}
	ivh := tr.Interval.Hours()
	if !(ivh > 0) {
		t.Fatalf("interval %v", tr.Interval)
	}
	var hours float64
	for i, p := range tr.Points {
		if i > 0 && !p.Time.After(tr.Points[i-1].Time) {
			t.Fatalf("points %d and %d not in strict time order: %v, %v", i-1, i, tr.Points[i-1].Time, p.Time)
		}
		q := float64(p.Flow)
		if math.IsNaN(q) || math.IsInf(q, 0) || q < 0 || rep.FlowLimit > 0 && p.Flow > rep.FlowLimit {
			t.Fatalf("line %d flow %v (limit %v)", p.Line, q, rep.FlowLimit)
		}
		if p.HasDP && (math.IsNaN(float64(p.DP)) || math.IsInf(float64(p.DP), 0) || p.DP < 0) {
			t.Fatalf("line %d DP %v", p.Line, p.DP)
		}
		if p.HasPower && (math.IsNaN(float64(p.Power)) || math.IsInf(float64(p.Power), 0) || p.Power < 0) {
			t.Fatalf("line %d power %v", p.Line, p.Power)
		}
		if !(p.Hours > 0) || p.Hours > ivh*(1+1e-12) {
			t.Fatalf("line %d weighs %v h with a %v h interval", p.Line, p.Hours, ivh)
		}
		if p.Line <= rep.HeaderLine || p.Line > rep.Lines {
			t.Fatalf("point line %d outside the data", p.Line)
		}
		hours += p.Hours
	}
	if math.Abs(hours-tr.Hours) > 1e-9*max(1, hours) || tr.Hours > tr.Span*(1+1e-12) {
		t.Fatalf("hours %v (sum %v) span %v", tr.Hours, hours, tr.Span)
	}
	maxQ := float64(tr.Points[0].Flow)
	for _, p := range tr.Points {
		maxQ = max(maxQ, float64(p.Flow))
	}
	if maxQ > 0 {
		b, err := tr.Bin(curves.Flow(maxQ / 7))
		if err != nil {
			t.Fatalf("bin: %v", err)
		}
		var h float64
		n := 0
		for _, fb := range b.Bins {
			h += fb.Hours
			n += fb.Count
		}
		if n != len(tr.Points) || math.Abs(h-tr.Hours) > 1e-9*max(1, h) {
			t.Fatalf("bins hold %d points %v h; trend %d points %v h", n, h, len(tr.Points), tr.Hours)
		}
	}
}

// roundTrip writes the points as RFC 3339 stamps and SI numbers and reads
// them back.
func roundTrip(t *testing.T, tr *Trend) {
	t.Helper()
	var b strings.Builder
	b.WriteString("time,flow m3/h,dp m,kw\n")
	g := func(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
	for _, p := range tr.Points {
		dp, kw := "", ""
		if p.HasDP {
			dp = g(float64(p.DP))
		}
		if p.HasPower {
			kw = g(float64(p.Power) / curves.KW)
		}
		fmt.Fprintf(&b, "%s,%s,%s,%s\n", p.Time.Format(time.RFC3339Nano), g(float64(p.Flow)/curves.M3PerH), dp, kw)
	}
	spec := TrendSpec{TimeColumn: "time", FlowColumn: "flow m3/h", DPColumn: "dp m", PowerColumn: "kw",
		FlowUnit: "m3/h", DPUnit: "m", TimeFormat: time.RFC3339Nano, Interval: tr.Interval, MaxFlow: math.MaxFloat64}
	back, err := ReadTrend(spec, strings.NewReader(b.String()), "back.csv")
	if err != nil {
		t.Fatalf("round trip: %v\n%s", err, b.String())
	}
	if len(back.Points) != len(tr.Points) || back.Report.Dropped != 0 {
		t.Fatalf("round trip: %d points, %s", len(back.Points), back.Report.Summary())
	}
	rel := func(a, b float64) bool { return math.Abs(a-b) <= 1e-12*max(math.Abs(a), math.Abs(b)) }
	for i, p := range tr.Points {
		q := back.Points[i]
		if !q.Time.Equal(p.Time) || !rel(float64(q.Flow), float64(p.Flow)) || q.HasDP != p.HasDP || q.HasPower != p.HasPower ||
			p.HasDP && !rel(float64(q.DP), float64(p.DP)) || p.HasPower && !rel(float64(q.Power), float64(p.Power)) ||
			math.Abs(q.Hours-p.Hours) > 1e-12 {
			t.Fatalf("round trip point %d: %+v, was %+v", i, q, p)
		}
	}
}
