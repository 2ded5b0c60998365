package profile

import (
	"errors"
	"math"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
	"unicode/utf16"

	"wattstage/curves"
	"wattstage/internal/golden"
)

// Issue 15, classes 1, 8 and 9 on the trend reader: number formats decided
// from the whole column, the stamps a building-automation export really
// writes, non-regular files and the row limit.

// TestColumnNumberFormats: each column's numbers are read in the format
// its cells show as a whole. Flows in gpm; want in gpm.
func TestColumnNumberFormats(t *testing.T) {
	cases := []struct {
		name  string
		delim string
		cells []string
		want  []float64 // NaN: the row is dropped as a non-numeric flow
		warns string    // in a warning, "" for none
	}{
		// The fault as reported: "1.700,0" was read as 1.7.
		{"European with thousands", ";", []string{"1.700,0", "950,5", "2.310,4"}, []float64{1700, 950.5, 2310.4}, ""},
		{"European, a decimal comma alone shows it", ";", []string{"1.700", "950,5"}, []float64{1700, 950.5}, ""},
		{"US with thousands, quoted", ",", []string{`"1,700.0"`, "950.5", `"2,310.4"`}, []float64{1700, 950.5, 2310.4}, ""},
		{"plain decimals", ",", []string{"1700.0", "950.5"}, []float64{1700, 950.5}, ""},
		{"points grouping thousands twice", ";", []string{"1.700.000", "950"}, []float64{1700000, 950}, ""},
		{"a cell against the column's format is not a number", ";", []string{"1.700,0", "2.310,4", "950.5"}, []float64{1700, 2310.4, math.NaN()}, ""},
		{"ambiguous alone: a point is a decimal point, said", ";", []string{"1.700", "2.310"}, []float64{1.7, 2.31}, `such as "1.700" could have a decimal or a thousands separator`},
		{"ambiguous alone in a comma file: thousands, said", ",", []string{`"1,700"`, `"2,310"`}, []float64{1700, 2310}, `read "1,700" as 1700`},
		// The fault as reported: "0600" must not be octal (384).
		{"leading zeros are decimal, said", ",", []string{"0600", "0950", "1000"}, []float64{600, 950, 1000}, "leading zeros"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			var b strings.Builder
			b.WriteString("timestamp" + c.delim + "plant_flow_gpm\n")
			for i, v := range c.cells {
				b.WriteString(time.Date(2025, 7, 1, i, 0, 0, 0, time.UTC).Format("2006-01-02 15:04") + c.delim + v + "\n")
			}
			tr, err := ReadTrend(TrendSpec{Interval: time.Hour}, strings.NewReader(b.String()), "t.csv")
			if err != nil {
				t.Fatal(err)
			}
			byLine := map[int]float64{}
			for _, p := range tr.Points {
				byLine[p.Line] = float64(p.Flow) / curves.GPM
			}
			for i, w := range c.want {
				got, ok := byLine[i+2]
				switch {
				case math.IsNaN(w) && ok:
					t.Errorf("cell %q read as %g, want it refused", c.cells[i], got)
				case !math.IsNaN(w) && (!ok || math.Abs(got-w) > 1e-9*w):
					t.Errorf("cell %q read as %g (kept %v), want %g", c.cells[i], got, ok, w)
				}
			}
			var all []string
			for _, w := range tr.Warnings {
				all = append(all, w.Message)
			}
			msgs := strings.Join(all, "\n")
			if c.warns != "" && !strings.Contains(msgs, c.warns) {
				t.Errorf("no warning saying %q in:\n%s", c.warns, msgs)
			}
			if c.warns == "" && strings.Contains(msgs, "separator") {
				t.Errorf("unexpected warning:\n%s", msgs)
			}
		})
	}
}

// TestExportStampFormats: stamps as building-automation exports write
// them are read, each to the instant it means.
func TestExportStampFormats(t *testing.T) {
	want := time.Date(2025, 7, 1, 14, 0, 0, 0, time.UTC)
	cases := []struct {
		name   string
		stamps [2]string
		spec   TrendSpec
		warns  string
	}{
		// 45839 is 2025-07-01 in the 1900 date system (serial 25569 is
		// 1970-01-01, from memory; 25569 + 20270 days = 45839);
		// 14:00 is 14/24 = 0.58333… of a day.
		{"spreadsheet serial dates", [2]string{"45839.583333333336", "45839.625"}, TrendSpec{}, "spreadsheet serial dates"},
		{"spreadsheet serial dates, named", [2]string{"45839.583333333336", "45839.625"}, TrendSpec{TimeFormat: "excel"}, ""},
		// 1751378400 s = 2025-07-01 14:00 UTC (date -u -d @1751378400).
		{"milliseconds since 1970", [2]string{"1751378400000", "1751382000000"}, TrendSpec{}, "milliseconds since 1970"},
		{"seconds since 1970", [2]string{"1751378400", "1751382000"}, TrendSpec{}, "seconds since 1970"},
		{"ISO with an offset and no seconds", [2]string{"2025-07-01T16:00+02:00", "2025-07-01T17:00+02:00"}, TrendSpec{}, ""},
		{"ISO with a space, an offset and no seconds", [2]string{"2025-07-01 09:00-05:00", "2025-07-01 10:00-05:00"}, TrendSpec{}, ""},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			csv := "timestamp,plant_flow_gpm\n" + c.stamps[0] + ",900\n" + c.stamps[1] + ",950\n"
			tr, err := ReadTrend(c.spec, strings.NewReader(csv), "t.csv")
			if err != nil {
				t.Fatal(err)
			}
			if len(tr.Points) != 2 || !tr.Points[0].Time.Equal(want) || tr.Interval != time.Hour {
				t.Fatalf("points %v, interval %v; want the first at %v, hourly", tr.Points, tr.Interval, want)
			}
			found := false
			for _, w := range tr.Warnings {
				found = found || strings.Contains(w.Message, c.warns)
			}
			if c.warns != "" && !found {
				t.Errorf("no warning saying %q: %v", c.warns, tr.Warnings)
			}
		})
	}
}

// TestUTF16WithBOM: a spreadsheet's "Unicode text" export (UTF-16 little
// endian with a byte-order mark, tab-delimited) is read.
func TestUTF16WithBOM(t *testing.T) {
	text := "timestamp\tplant_flow_gpm\r\n2025-07-01 14:00\t900,5\r\n2025-07-01 15:00\t950\r\n"
	u := utf16.Encode([]rune(text))
	b := []byte{0xFF, 0xFE}
	for _, c := range u {
		b = append(b, byte(c), byte(c>>8))
	}
	tr, err := ReadTrend(TrendSpec{}, strings.NewReader(string(b)), "t.txt")
	if err != nil {
		t.Fatal(err)
	}
	if len(tr.Points) != 2 || math.Abs(float64(tr.Points[0].Flow)/curves.GPM-900.5) > 1e-9 {
		t.Fatalf("points %+v", tr.Points)
	}
}

func TestTimeZoneLocalRefused(t *testing.T) {
	_, err := ReadTrend(TrendSpec{TimeZone: "Local"}, strings.NewReader("timestamp,flow_gpm\n"), "t.csv")
	if !errors.Is(err, ErrSpec) || !strings.Contains(err.Error(), "IANA zone") {
		t.Fatalf("err = %v", err)
	}
}

// TestNonRegularTrendRefused: the fault as reported — a named pipe as the
// trend waited forever for a writer. It is refused before it is opened
// (were it opened, this test would hang until go test's timeout).
func TestNonRegularTrendRefused(t *testing.T) {
	fifo := filepath.Join(t.TempDir(), "trend.csv")
	if err := syscall.Mkfifo(fifo, 0o644); err != nil {
		t.Skip("no named pipes here:", err)
	}
	for _, path := range []string{fifo, os.DevNull} {
		_, err := ReadTrendFile(TrendSpec{}, path)
		if !errors.Is(err, ErrNotRegular) {
			t.Errorf("%s: err = %v, want ErrNotRegular", path, err)
		}
	}
}

// TestTooManyRows: a trend longer than MaxRows is refused before its rows
// are split, pointing at the first line past the limit. The golden message
// sits in the bad-trend corpus beside the committed cases; the file itself
// is generated (tens of MB).
func TestTooManyRows(t *testing.T) {
	var b strings.Builder
	b.WriteString("timestamp,plant_flow_gpm,loop_dp_psi,pump_kw\n")
	row := "2025-07-01 14:00,900,12,20\n"
	b.Grow(len(row) * (MaxRows + 1))
	for range MaxRows + 1 {
		b.WriteString(row)
	}
	shown := "testdata/invalid/trends/too-many-rows.csv"
	_, err := ReadTrend(corpusSpec, strings.NewReader(b.String()), shown)
	if !errors.Is(err, ErrTooManyRows) {
		t.Fatalf("err = %v", err)
	}
	golden.Check(t, filepath.Join(corpusDir, "too-many-rows.golden"), err.Error()+"\n", *update, "go test ./profile -run TestTooManyRows -update")
}

// TestPlausible: a trend's flows against the plant, the faults as
// reported: all-zero flows, flows in gal/h or L/s under a gpm header, flows
// all below the plant minimum flow. The plant: design 3000 gpm, capacity
// 4200 gpm, minimum 600 gpm (as the shipped chilled-water trend example).
func TestPlausible(t *testing.T) {
	e := Expect{DesignFlow: 3000 * curves.GPM, Capacity: 4200 * curves.GPM, MinFlow: 600 * curves.GPM}
	cases := []struct {
		name   string
		flows  []float64 // gpm as read
		refuse string    // in the error; "" = accepted
		warns  string    // in a warning
	}{
		{"a real profile", []float64{800, 1200, 1500, 2100, 2600, 1900, 1000}, "", ""},
		{"all zero", []float64{0, 0, 0, 0}, "every flow", ""},
		// 1500 gpm logged as gal/h: 90000.
		{"gal/h under a gpm header", []float64{48000, 72000, 90000, 126000, 156000}, "would fit in gal/h", ""},
		// 1500 gpm logged as L/s: 94.6; median 3.2 % of design.
		{"L/s under a gpm header", []float64{50.5, 75.7, 94.6, 132.5, 164.0}, "", "would fit in L/s"},
		{"everything below the plant minimum", []float64{100, 200, 300, 400, 500}, "", "below the plant minimum flow"},
		{"mostly off", []float64{0, 0, 0, 0, 1500, 1800}, "", "zero flow"},
		{"a tiny fraction of design", []float64{5, 6, 7, 8}, "0.23 % of the design flow", ""},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			tr := &Trend{Name: "t.csv", Spec: TrendSpec{FlowColumn: "plant_flow_gpm", FlowUnit: "gpm"}}
			for _, q := range c.flows {
				tr.Points = append(tr.Points, Point{Flow: curves.Flow(q * curves.GPM), Hours: 1})
			}
			err := tr.Plausible(e)
			if c.refuse != "" {
				if !errors.Is(err, ErrImplausible) || !strings.Contains(err.Error(), c.refuse) {
					t.Fatalf("err = %v, want a refusal saying %q", err, c.refuse)
				}
				return
			}
			if err != nil {
				t.Fatalf("refused: %v", err)
			}
			var all []string
			for _, w := range tr.Warnings {
				all = append(all, w.Message)
			}
			if got := strings.Join(all, "\n"); c.warns == "" && got != "" || !strings.Contains(got, c.warns) {
				t.Errorf("warnings %q, want one saying %q", got, c.warns)
			}
		})
	}
}
