package profile

import (
	"strings"
	"testing"
	"time"
)

func TestTimeLayout(t *testing.T) {
	// Each pattern with a stamp written in it and the instant it means
	// (the stamps are written here by hand, as an export shows them).
	cases := []struct {
		name, format, layout, stamp string
		want                        time.Time
	}{
		{"ISO-like", "YYYY-MM-DD hh:mm", "2006-01-02 15:04", "2025-03-09 14:05", time.Date(2025, 3, 9, 14, 5, 0, 0, time.UTC)},
		{"US with AM/PM", "MM/DD/YYYY h:mm AM", "01/02/2006 3:04 PM", "03/09/2025 2:05 PM", time.Date(2025, 3, 9, 14, 5, 0, 0, time.UTC)},
		{"US unpadded month and day", "M/D/YYYY h:mm tt", "1/2/2006 3:04 PM", "3/9/2025 12:30 AM", time.Date(2025, 3, 9, 0, 30, 0, 0, time.UTC)},
		{"European with seconds", "DD.MM.YYYY HH:mm:ss", "02.01.2006 15:04:05", "09.03.2025 07:05:59", time.Date(2025, 3, 9, 7, 5, 59, 0, time.UTC)},
		{"month name", "D-MMM-YYYY hh:mm", "2-Jan-2006 15:04", "9-Mar-2025 23:00", time.Date(2025, 3, 9, 23, 0, 0, 0, time.UTC)},
		{"ISO T and fraction", "YYYY-MM-DDThh:mm:ss.fff", "2006-01-02T15:04:05.000", "2025-03-09T14:05:06.250", time.Date(2025, 3, 9, 14, 5, 6, 250e6, time.UTC)},
		{"lower-case am/pm", "YY/MM/DD hh:mm am/pm", "06/01/02 03:04 pm", "25/03/09 02:05 pm", time.Date(2025, 3, 9, 14, 5, 0, 0, time.UTC)},
		{"Go layout kept", "2006-01-02 15:04", "2006-01-02 15:04", "2025-03-09 14:05", time.Date(2025, 3, 9, 14, 5, 0, 0, time.UTC)},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			got, err := TimeLayout(c.format)
			if err != nil {
				t.Fatal(err)
			}
			if got != c.layout {
				t.Errorf("TimeLayout(%q) = %q, want %q", c.format, got, c.layout)
			}
			at, err := time.Parse(got, c.stamp)
			if err != nil {
				t.Fatalf("%q does not read %q: %v", got, c.stamp, err)
			}
			if !at.Equal(c.want) {
				t.Errorf("%q read %q as %v, want %v", got, c.stamp, at, c.want)
			}
		})
	}
	// The last two: a day given twice (Go's parser keeps the last), and a
	// one-letter lower-case day right after a one-letter second (found by
	// FuzzTimeLayout: "DDMMYYYYHHmmZsd" read 23 Nov 17:45:00 back as 3 Nov
	// 17:45:02).
	for _, bad := range []string{"hh:mm", "YYYY-QQ", "DD/MM/YYYY hh:mm xyz", "DD/MM/YYYY hh:mm d", "YYYY-MM-DD hh:mm:sd"} {
		if l, err := TimeLayout(bad); err == nil {
			t.Errorf("TimeLayout(%q) = %q, want an error", bad, l)
		}
	}
	if l, err := TimeLayout("unix"); err != nil || l != "unix" {
		t.Errorf("TimeLayout(unix) = %q, %v", l, err)
	}
}

// FuzzTimeLayout: no panic; a pattern that is accepted formats a time and
// reads it back to the same instant when it has every field down to the
// minute.
func FuzzTimeLayout(f *testing.F) {
	for _, s := range []string{"YYYY-MM-DD hh:mm", "MM/DD/YYYY h:mm AM", "DD.MM.YYYY HH:mm:ss", "D-MMM-YYYY", "tt", "AM/PM", "YYYYMMDDhhmm"} {
		f.Add(s)
	}
	at := time.Date(2025, 11, 23, 17, 45, 0, 0, time.UTC)
	f.Fuzz(func(t *testing.T, format string) {
		l, err := TimeLayout(format)
		if err != nil || strings.ContainsAny(format, "0123456789") || format == "unix" {
			return
		}
		full := strings.Contains(format, "YYYY") && strings.Contains(format, "MM") && strings.Contains(format, "DD") &&
			strings.Contains(format, "mm") && strings.Contains(strings.ToLower(format), "hh")
		if !full {
			return
		}
		back, err := time.Parse(l, at.Format(l))
		if err == nil && !back.Equal(at) {
			t.Errorf("%q → %q: %v read back as %v", format, l, at, back)
		}
	})
}
