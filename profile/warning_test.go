package profile

import (
	"strings"
	"testing"
	"time"
)

// TestWarningOrigins checks that each warning names the file and, where it
// is about one line, the first line that showed it.
func TestWarningOrigins(t *testing.T) {
	cases := []struct {
		name  string
		spec  TrendSpec
		input string
		line  int
		want  string // the start of the message
	}{
		{"dates read month/day: the first stamp's line",
			TrendSpec{FlowColumn: "flow", FlowUnit: "gpm"},
			"Date,flow\n\n03/04/2025 10:00,1\n03/04/2025 11:00,2\n",
			3, `dates such as "03/04/2025 10:00" read as month/day`},
		{"dates read month/day after a dropped first row",
			TrendSpec{FlowColumn: "flow", FlowUnit: "gpm"},
			"Date,flow\n,1\n03/04/2025 10:00,1\n03/04/2025 11:00,2\n03/04/2025 12:00,3\n",
			3, `dates such as "03/04/2025 10:00" read as month/day`},
		{"lines before the header: the header line",
			TrendSpec{FlowColumn: "flow", FlowUnit: "gpm"},
			"Plant trend export\nsite: north\ntime,flow\n2025-05-01 00:00,1\n2025-05-01 01:00,2\n",
			3, "skipped 2 lines before the header on line 3"},
		{"flow column guessed: the header line",
			TrendSpec{FlowUnit: "gpm"},
			"Exported by the BAS\ntime,CHW flow\n2025-05-01 00:00,1\n2025-05-01 01:00,2\n",
			2, `flow column not named; using "CHW flow"`},
		{"duplicate stamps: the first duplicate",
			TrendSpec{FlowColumn: "flow", FlowUnit: "gpm"},
			"time,flow\n2025-05-01 00:00,1\n2025-05-01 01:00,2\n2025-05-01 01:00,2\n2025-05-01 02:00,3\n2025-05-01 02:00,3\n2025-05-01 03:00,4\n",
			4, "2 duplicate stamps"},
		{"irregular steps: the file",
			TrendSpec{FlowColumn: "flow", FlowUnit: "gpm"},
			"time,flow\n2025-05-01 00:00,1\n2025-05-01 00:10,1\n2025-05-01 00:25,1\n2025-05-01 00:45,1\n2025-05-01 01:10,1\n",
			0, "logging steps are irregular"},
		{"low coverage: the file",
			TrendSpec{FlowColumn: "flow", FlowUnit: "gpm", Interval: time.Hour},
			"time,flow\n2025-05-01 00:00,1\n2025-05-01 10:00,1\n",
			0, "rows cover 18.2 % of the span"},
		{"Latin-1: the file",
			TrendSpec{FlowColumn: "flow", FlowUnit: "gpm"},
			"time,flow,note\n2025-05-01 00:00,1,caf\xe9\n2025-05-01 01:00,2,\n",
			0, "file is not UTF-8"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			tr, err := ReadTrend(c.spec, strings.NewReader(c.input), "log.csv")
			if err != nil {
				t.Fatal(err)
			}
			var found []Warning
			for _, w := range tr.Warnings {
				if w.File != "log.csv" {
					t.Errorf("warning %q names file %q, want log.csv", w, w.File)
				}
				if strings.HasPrefix(w.Message, c.want) {
					found = append(found, w)
				}
			}
			if len(found) != 1 {
				t.Fatalf("%d warnings starting %q in %q, want 1", len(found), c.want, tr.Warnings)
			}
			if found[0].Line != c.line {
				t.Errorf("warning %q at line %d, want %d", found[0], found[0].Line, c.line)
			}
		})
	}
}

// TestWarningOriginFile: a warning from a file read by path names the path.
func TestWarningOriginFile(t *testing.T) {
	spec := messySpec
	spec.TimeZone = ""
	tr, err := ReadTrendFile(spec, "testdata/messy.csv")
	if err != nil {
		t.Fatal(err)
	}
	for _, w := range tr.Warnings {
		if strings.HasPrefix(w.Message, "3 duplicate stamps") {
			if got, want := w.String(), "testdata/messy.csv:24: "+w.Message; got != want {
				t.Errorf("String() = %q, want %q", got, want)
			}
			return
		}
	}
	t.Errorf("no duplicate-stamp warning in %q", tr.Warnings)
}

func TestWarningFormat(t *testing.T) {
	cases := []struct {
		w              Warning
		origin, string string
	}{
		{Warning{File: "t.csv", Line: 7, Message: "m"}, "t.csv:7", "t.csv:7: m"},
		{Warning{File: "t.csv", Message: "m"}, "t.csv", "t.csv: m"},
	}
	for _, c := range cases {
		if got := c.w.Origin(); got != c.origin {
			t.Errorf("Origin() = %q, want %q", got, c.origin)
		}
		if got := c.w.String(); got != c.string {
			t.Errorf("String() = %q, want %q", got, c.string)
		}
	}
}
