package profile

import (
	"bytes"
	"errors"
	"math"
	"slices"
	"strconv"
	"strings"
	"testing"
	"time"
	"unicode/utf16"

	"wattstage/curves"
)

// utf16LE encodes s as UTF-16 little-endian with a byte-order mark, as a
// spreadsheet's "Unicode text" export writes it.
func utf16LE(s string) []byte {
	b := []byte{0xFF, 0xFE}
	for _, u := range utf16.Encode([]rune(s)) {
		b = append(b, byte(u), byte(u>>8))
	}
	return b
}

func TestReadTrendFormats(t *testing.T) {
	gpm := func(v float64) curves.Flow { return curves.Flow(v * curves.GPM) }
	cases := []struct {
		name     string
		spec     TrendSpec
		input    []byte
		flows    []curves.Flow // expected flows in time order (relative tolerance 1e-12)
		interval time.Duration
		warning  string // a warning that must be present ("" = none expected)
		check    func(t *testing.T, tr *Trend)
	}{
		{
			name:     "semicolons and decimal commas",
			spec:     TrendSpec{FlowColumn: "plant_flow_gpm", FlowUnit: "gpm"},
			input:    []byte("timestamp;plant_flow_gpm\n2025-05-01 00:00;1200,5\n2025-05-01 01:00;1300,0\n"),
			flows:    []curves.Flow{gpm(1200.5), gpm(1300)},
			interval: time.Hour,
			check: func(t *testing.T, tr *Trend) {
				if tr.Report.Delimiter != ';' {
					t.Errorf("delimiter %q", tr.Report.Delimiter)
				}
			},
		},
		{
			name:     "UTF-16 tab-separated with CRLF",
			spec:     TrendSpec{FlowColumn: "Flow", FlowUnit: "L/s"},
			input:    utf16LE("Time\tFlow\r\n2025-05-01 00:00\t50.5\r\n2025-05-01 00:15\t51\r\n"),
			flows:    []curves.Flow{50.5 * curves.LPerS, 51 * curves.LPerS},
			interval: 15 * time.Minute,
			warning:  "file is UTF-16 encoded; decoded it",
		},
		{
			name: "Latin-1 header with m³/h",
			spec: TrendSpec{FlowColumn: "Durchfluss m³/h"},
			// "³" is byte 0xB3 in Latin-1
			input:    []byte("Zeit;Durchfluss m\xb3/h\n01.05.2025 00:00;120\n01.05.2025 01:00;125\n"),
			flows:    []curves.Flow{120 * curves.M3PerH, 125 * curves.M3PerH},
			interval: time.Hour,
			warning:  "file is not UTF-8; read it as Latin-1",
		},
		{
			name: "RFC 3339 offsets across fall back",
			spec: TrendSpec{FlowColumn: "flow", FlowUnit: "gpm", TimeZone: "America/Chicago"},
			input: []byte("time,flow\n2025-11-02T00:00:00-05:00,10\n2025-11-02T01:00:00-05:00,11\n" +
				"2025-11-02T01:00:00-06:00,12\n2025-11-02T02:00:00-06:00,13\n"),
			flows:    []curves.Flow{gpm(10), gpm(11), gpm(12), gpm(13)},
			interval: time.Hour,
			check: func(t *testing.T, tr *Trend) {
				if len(tr.Report.Issues) != 0 || tr.Report.Gaps != 0 {
					t.Errorf("offsets make the repeated hour exact; issues %+v gaps %d", tr.Report.Issues, tr.Report.Gaps)
				}
				if h := tr.Points[2].Time.Hour(); h != 1 || tr.Points[2].Time.Location().String() != "America/Chicago" {
					t.Errorf("third point at local hour %d in %v", h, tr.Points[2].Time.Location())
				}
			},
		},
		{
			name:     "epoch seconds",
			spec:     TrendSpec{FlowColumn: "flow", FlowUnit: "gpm", TimeFormat: "unix"},
			input:    []byte("t,flow\n1746057600,100\n1746058500,110\n1746059400,120\n"),
			flows:    []curves.Flow{gpm(100), gpm(110), gpm(120)},
			interval: 15 * time.Minute,
			check: func(t *testing.T, tr *Trend) {
				// 1746057600 s is 2025-05-01 00:00 UTC
				if !tr.Start.Equal(time.Date(2025, 5, 1, 0, 0, 0, 0, time.UTC)) {
					t.Errorf("start %v", tr.Start)
				}
			},
		},
		{
			name:     "US month/day with AM/PM",
			spec:     TrendSpec{FlowColumn: "flow", FlowUnit: "gpm"},
			input:    []byte("Date,flow\n12/31/2024 11:00 PM,90\n1/1/2025 12:00 AM,91\n1/1/2025 1:00 AM,92\n"),
			flows:    []curves.Flow{gpm(90), gpm(91), gpm(92)},
			interval: time.Hour,
		},
		{
			name:     "day/month ambiguous: read month/day with a warning",
			spec:     TrendSpec{FlowColumn: "flow", FlowUnit: "gpm"},
			input:    []byte("Date,flow\n03/04/2025 10:00,1\n03/04/2025 11:00,2\n"),
			flows:    []curves.Flow{gpm(1), gpm(2)},
			interval: time.Hour,
			warning:  `dates such as "03/04/2025 10:00" read as month/day; give the trend's time format if that is wrong`,
			check: func(t *testing.T, tr *Trend) {
				if tr.Start.Month() != time.March {
					t.Errorf("start %v", tr.Start)
				}
			},
		},
		{
			name:     "day/month told apart by a day above 12",
			spec:     TrendSpec{FlowColumn: "flow", FlowUnit: "gpm"},
			input:    []byte("Date,flow\n12/04/2025 23:00,1\n13/04/2025 00:00,2\n"),
			flows:    []curves.Flow{gpm(1), gpm(2)},
			interval: time.Hour,
			check: func(t *testing.T, tr *Trend) {
				if tr.Report.Layout != "2/1/2006 15:04" || tr.Start.Month() != time.April || len(tr.Warnings) != 0 {
					t.Errorf("layout %q start %v warnings %q", tr.Report.Layout, tr.Start, tr.Warnings)
				}
			},
		},
		{
			name:     "flow column and unit found from the header",
			spec:     TrendSpec{},
			input:    []byte("Stamp,CHW Flow (L/s),Outside air\n2025-05-01 00:00,40,20\n2025-05-01 01:00,42,21\n"),
			flows:    []curves.Flow{40 * curves.LPerS, 42 * curves.LPerS},
			interval: time.Hour,
			warning:  `flow column not named; using "CHW Flow (L/s)"`,
			check: func(t *testing.T, tr *Trend) {
				if tr.Spec.TimeColumn != "Stamp" || tr.Spec.FlowUnit != "l/s" {
					t.Errorf("spec %+v", tr.Spec)
				}
			},
		},
		{
			name:     "title block before the header",
			spec:     TrendSpec{FlowColumn: "flow", FlowUnit: "gpm"},
			input:    []byte("Trend report\nExported by the front end\n\ntime,flow\n2025-05-01 00:00,1\n2025-05-01 01:00,2\n"),
			flows:    []curves.Flow{gpm(1), gpm(2)},
			interval: time.Hour,
			warning:  "skipped 2 lines before the header on line 4",
		},
		{
			name:     "quoted fields with commas and trailing delimiters",
			spec:     TrendSpec{FlowColumn: "flow", FlowUnit: "gpm"},
			input:    []byte("\"time\",\"flow\",\n\"2025-05-01 00:00\",\"1,200\",\n\"2025-05-01 01:00\",\"1,250.5\",,\n"),
			flows:    []curves.Flow{gpm(1200), gpm(1250.5)},
			interval: time.Hour,
		},
		{
			name:     "old Mac line endings and zero flow",
			spec:     TrendSpec{FlowColumn: "flow", FlowUnit: "gpm"},
			input:    []byte("time,flow\r2025-05-01 00:00,0\r2025-05-01 01:00,0\r2025-05-01 02:00,5\r"),
			flows:    []curves.Flow{0, 0, gpm(5)},
			interval: time.Hour,
		},
		{
			name:     "irregular steps",
			spec:     TrendSpec{FlowColumn: "flow", FlowUnit: "gpm"},
			input:    []byte("time,flow\n2025-05-01 00:00,1\n2025-05-01 00:10,1\n2025-05-01 00:25,1\n2025-05-01 00:45,1\n2025-05-01 01:10,1\n"),
			flows:    []curves.Flow{gpm(1), gpm(1), gpm(1), gpm(1), gpm(1)},
			interval: 17*time.Minute + 30*time.Second, // median of 10, 15, 20, 25 min
			warning:  "logging steps are irregular: 0 of 4 equal the median step 17m30s",
			check: func(t *testing.T, tr *Trend) {
				// each point weighs min(step, interval): 10, 15, 17.5, 17.5, 17.5 min
				want := []float64{10, 15, 17.5, 17.5, 17.5}
				for i, p := range tr.Points {
					if math.Abs(p.Hours*60-want[i]) > 1e-9 {
						t.Errorf("point %d weighs %v min, want %v", i, p.Hours*60, want[i])
					}
				}
			},
		},
		{
			name:     "one row with a given interval",
			spec:     TrendSpec{FlowColumn: "flow", FlowUnit: "gpm", Interval: time.Hour},
			input:    []byte("time,flow\n2025-05-01 00:00,7\n"),
			flows:    []curves.Flow{gpm(7)},
			interval: time.Hour,
		},
		{
			name:     "DP in kPa, ft and m",
			spec:     TrendSpec{FlowColumn: "flow", FlowUnit: "gpm", DPColumn: "dp", DPUnit: "kPa", Density: 1000},
			input:    []byte("time,flow,dp\n2025-05-01 00:00,1,98.0665\n2025-05-01 01:00,1,9.80665\n"),
			flows:    []curves.Flow{gpm(1), gpm(1)},
			interval: time.Hour,
			check: func(t *testing.T, tr *Trend) {
				// 98.0665 kPa of water at 1000 kg/m³ is 10 m exactly (p = ρ g h
				// with standard gravity, CGPM)
				if math.Abs(float64(tr.Points[0].DP)-10) > 1e-12 || math.Abs(float64(tr.Points[1].DP)-1) > 1e-12 {
					t.Errorf("DP %v %v m", tr.Points[0].DP, tr.Points[1].DP)
				}
			},
		},
		{
			name:     "DP in feet from the header",
			spec:     TrendSpec{FlowColumn: "flow", FlowUnit: "gpm", DPColumn: "DP ft"},
			input:    []byte("time,flow,DP ft\n2025-05-01 00:00,1,10\n2025-05-01 01:00,1,\n"),
			flows:    []curves.Flow{gpm(1), gpm(1)},
			interval: time.Hour,
			check: func(t *testing.T, tr *Trend) {
				// 1 ft = 0.3048 m exactly (NIST SP 811); an empty DP cell is no DP
				if math.Abs(float64(tr.Points[0].DP)-3.048) > 1e-12 || tr.Points[1].HasDP || len(tr.Report.Issues) != 0 {
					t.Errorf("points %+v issues %+v", tr.Points, tr.Report.Issues)
				}
			},
		},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			tr, err := ReadTrend(c.spec, bytes.NewReader(c.input), "in.csv")
			if err != nil {
				t.Fatal(err)
			}
			var flows []curves.Flow
			for _, p := range tr.Points {
				flows = append(flows, p.Flow)
			}
			if len(flows) != len(c.flows) {
				t.Fatalf("flows %v, want %v", flows, c.flows)
			}
			for i := range flows {
				if math.Abs(float64(flows[i]-c.flows[i])) > 1e-12*math.Abs(float64(c.flows[i])) {
					t.Errorf("flow %d = %v, want %v", i, flows[i], c.flows[i])
				}
			}
			if tr.Interval != c.interval {
				t.Errorf("interval %v, want %v", tr.Interval, c.interval)
			}
			switch {
			case c.warning == "" && len(tr.Warnings) > 0:
				t.Errorf("unexpected warnings %q", tr.Warnings)
			case c.warning != "" && !slices.ContainsFunc(tr.Warnings, func(w Warning) bool { return w.Message == c.warning }):
				t.Errorf("warnings %q lack %q", tr.Warnings, c.warning)
			}
			if c.check != nil {
				c.check(t, tr)
			}
		})
	}
}

func TestDefaultFlowLimit(t *testing.T) {
	// 200 hourly rows of 1000–1199 gpm and one of 100 000 gpm. The spike is
	// among the 201 positive flows, so the nearest rank of the 99th
	// percentile is ceil(0.99 × 201) = 199: the 199th smallest, 1198 gpm;
	// the limit is 3 × 1198 gpm (hand computed).
	var b strings.Builder
	b.WriteString("time,flow\n")
	start := time.Date(2025, 5, 1, 0, 0, 0, 0, time.UTC)
	for i := range 201 {
		v := 1000 + i
		if i == 200 {
			v = 100000
		}
		b.WriteString(start.Add(time.Duration(i)*time.Hour).Format("2006-01-02 15:04") + "," + strconv.Itoa(v) + "\n")
	}
	tr, err := ReadTrend(TrendSpec{FlowColumn: "flow", FlowUnit: "gpm"}, strings.NewReader(b.String()), "in.csv")
	if err != nil {
		t.Fatal(err)
	}
	if got := tr.Report.LinesOf(AbsurdFlow); !slices.Equal(got, []int{202}) {
		t.Errorf("absurd rows %v, want line 202", got)
	}
	if lim := float64(tr.Report.FlowLimit) / curves.GPM; math.Abs(lim-3*1198) > 1e-9 {
		t.Errorf("limit %v gpm, want %v", lim, 3*1198)
	}
}

func TestSpecErrors(t *testing.T) {
	cases := []struct {
		name string
		spec TrendSpec
		want string
	}{
		{"zone", TrendSpec{TimeZone: "Nowhere/Special"}, `unknown time zone "Nowhere/Special"`},
		{"flow unit", TrendSpec{FlowUnit: "cfs"}, `unknown flow unit "cfs"`},
		{"DP unit", TrendSpec{DPUnit: "bar"}, `unknown DP unit "bar"`},
		{"density", TrendSpec{Density: 1.2}, "fluid density 1.2 kg/m³"},
		{"max flow", TrendSpec{MaxFlow: -1}, "maximum flow -1 m³/s"},
		{"interval", TrendSpec{Interval: -time.Minute}, "interval -1m0s"},
		{"long interval", TrendSpec{Interval: 32 * 24 * time.Hour}, "interval 768h0m0s must be 0 to 31 days"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := ReadTrend(c.spec, strings.NewReader("time,flow\n"), "in.csv")
			if !errors.Is(err, ErrSpec) || !strings.Contains(err.Error(), c.want) {
				t.Errorf("err = %v, want ErrSpec containing %q", err, c.want)
			}
		})
	}
}

func TestParseErrorFields(t *testing.T) {
	_, err := ReadTrend(corpusSpec, strings.NewReader("timestamp,plant_flow_gpm,pump_kw\n"), "x.csv")
	var pe *ParseError
	if !errors.As(err, &pe) || !errors.Is(err, ErrMissingColumn) || pe.File != "x.csv" || pe.Line != 1 || pe.Field != "loop_dp_psi" {
		t.Fatalf("err = %#v", err)
	}
	_, err = ReadTrend(corpusSpec, strings.NewReader("timestamp,plant_flow_gpm\nnever,1\n"), "x.csv")
	if !errors.As(err, &pe) || !errors.Is(err, ErrMissingColumn) {
		t.Fatalf("err = %v", err)
	}
	_, err = ReadTrend(TrendSpec{TimeColumn: "a", FlowColumn: "a", FlowUnit: "gpm"}, strings.NewReader("a,b\n2025-05-01 00:00,1\n"), "x.csv")
	if !errors.As(err, &pe) || !errors.Is(err, ErrSpec) || pe.Field != "a" {
		t.Fatalf("time and flow on one column: err = %v", err)
	}
	// one good row and one bad: without an interval the file is unusable,
	// and the error points at the good row
	spec := TrendSpec{FlowColumn: "flow", FlowUnit: "gpm"}
	_, err = ReadTrend(spec, strings.NewReader("time,flow\n2025-05-01 00:00,1\n   nonsense,2\n"), "x.csv")
	if !errors.As(err, &pe) || !errors.Is(err, ErrInterval) || pe.Line != 2 {
		t.Fatalf("err = %v", err)
	}
}

func TestNumber(t *testing.T) {
	cases := []struct {
		in    string
		delim byte
		want  float64
		ok    bool
	}{
		{"12.5", ',', 12.5, true},
		{"-3", ',', -3, true},
		{"1e3", ',', 1000, true},
		{"12,5", ';', 12.5, true},
		{"12,5", '\t', 12.5, true},
		{"12,5", ',', 0, false}, // a comma in a comma file is only a thousands separator
		{"1,234", ',', 1234, true},
		{"1,234,567.25", ';', 1234567.25, true},
		{"12,34", ',', 0, false},
		{"1234,567", ',', 0, false},
		{"NaN", ',', 0, false},
		{"Inf", ',', 0, false},
		{"0x1p4", ',', 0, false},
		{"1_000", ',', 0, false},
		{"", ',', 0, false},
		{"#N/A", ',', 0, false},
		{"1e400", ',', 0, false},
	}
	for _, c := range cases {
		got, ok := number(c.in, c.delim)
		if ok != c.ok || got != c.want {
			t.Errorf("number(%q, %q) = %v, %v; want %v, %v", c.in, c.delim, got, ok, c.want, c.ok)
		}
	}
}

func TestSplitFields(t *testing.T) {
	cases := []struct {
		line   string
		fields []string
		starts []int
	}{
		{"a,b,c", []string{"a", "b", "c"}, []int{1, 3, 5}},
		{" a , b ,", []string{"a", "b", ""}, []int{2, 6, 9}},
		{`"x, y",2`, []string{"x, y", "2"}, []int{1, 8}},
		{`"say ""hi""",3`, []string{`say "hi"`, "3"}, []int{1, 14}},
		{`"open,1`, []string{"open,1"}, []int{1}},
		{`"a"b,c`, []string{"ab", "c"}, []int{1, 6}},
		{"", []string{""}, []int{1}},
	}
	for _, c := range cases {
		f, s := splitFields(c.line, ',')
		if !slices.Equal(f, c.fields) || !slices.Equal(s, c.starts) {
			t.Errorf("splitFields(%q) = %q %v, want %q %v", c.line, f, s, c.fields, c.starts)
		}
	}
}

func TestLocalInstants(t *testing.T) {
	chicago, _ := time.LoadLocation("America/Chicago")
	wall := func(s string) time.Time { w, _ := time.Parse("2006-01-02 15:04", s); return w }
	// US rules since 2007 (Energy Policy Act 2005), in the IANA database:
	// 2025 springs forward 9 March 02:00 and falls back 2 November 02:00.
	cases := []struct {
		wall        string
		ok          bool
		early, late string // UTC
	}{
		{"2025-03-09 01:59", true, "07:59", "07:59"},
		{"2025-03-09 02:00", false, "", ""},
		{"2025-03-09 02:59", false, "", ""},
		{"2025-03-09 03:00", true, "08:00", "08:00"},
		{"2025-11-02 00:59", true, "05:59", "05:59"},
		{"2025-11-02 01:00", true, "06:00", "07:00"},
		{"2025-11-02 01:59", true, "06:59", "07:59"},
		{"2025-11-02 02:00", true, "08:00", "08:00"},
	}
	for _, c := range cases {
		e, l, ok := localInstants(wall(c.wall), chicago)
		if ok != c.ok || ok && (e.UTC().Format("15:04") != c.early || l.UTC().Format("15:04") != c.late) {
			t.Errorf("%s: %v %v %v, want %v %s %s", c.wall, e.UTC(), l.UTC(), ok, c.ok, c.early, c.late)
		}
	}
	// Lord Howe Island changes by 30 minutes.
	lh, err := time.LoadLocation("Australia/Lord_Howe")
	if err != nil {
		t.Fatal(err)
	}
	if e, l, ok := localInstants(wall("2025-04-06 01:45"), lh); !ok || l.Sub(e) != 30*time.Minute {
		t.Errorf("Lord Howe fall back: %v %v %v", e, l, ok)
	}
}
