package profile

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"
	"time"
)

// layout is a timestamp layout tried when the spec gives none.
type layout struct {
	layout string
	zoned  bool   // the stamp carries its UTC offset
	twin   string // the same layout with day and month swapped, if any
}

// layouts are tried in this order; the one that parses the most stamps of
// the file wins, the earlier on a tie (so "01/02/2025" reads as month/day,
// with a warning when the file cannot tell).
var layouts = []layout{
	{layout: time.RFC3339, zoned: true},
	{layout: "2006-01-02 15:04:05Z07:00", zoned: true},
	{layout: "2006-01-02 15:04:05 -0700", zoned: true},
	{layout: "2006-01-02T15:04Z07:00", zoned: true},
	{layout: "2006-01-02 15:04Z07:00", zoned: true},
	{layout: "2006-01-02 15:04 -0700", zoned: true},
	{layout: "2006-01-02T15:04:05"},
	{layout: "2006-01-02T15:04"},
	{layout: "2006-01-02 15:04:05"},
	{layout: "2006-01-02 15:04"},
	{layout: "2006/01/02 15:04:05"},
	{layout: "2006/01/02 15:04"},
	{layout: "1/2/2006 15:04:05", twin: "2/1/2006 15:04:05"},
	{layout: "1/2/2006 15:04", twin: "2/1/2006 15:04"},
	{layout: "1/2/2006 3:04:05 PM", twin: "2/1/2006 3:04:05 PM"},
	{layout: "1/2/2006 3:04 PM", twin: "2/1/2006 3:04 PM"},
	{layout: "2/1/2006 15:04:05", twin: "1/2/2006 15:04:05"},
	{layout: "2/1/2006 15:04", twin: "1/2/2006 15:04"},
	{layout: "2/1/2006 3:04:05 PM", twin: "1/2/2006 3:04:05 PM"},
	{layout: "2/1/2006 3:04 PM", twin: "1/2/2006 3:04 PM"},
	{layout: "02.01.2006 15:04:05"},
	{layout: "02.01.2006 15:04"},
	{layout: "2-Jan-2006 15:04:05"},
	{layout: "2-Jan-2006 15:04"},
	{layout: "2006-01-02"},
}

// Stamps outside these years are bad: no trend log comes from there, and
// the span of a file stays within what time.Duration holds (292 years).
const minYear, maxYear = 1970, 2199

// The TimeFormats for numeric stamps: seconds or milliseconds since
// 1970-01-01 UTC, and spreadsheet serial dates (days since 1899-12-30 —
// the 1900 date system, whose serial 25569 is 1970-01-01; from memory —
// with the time of day as the fraction), which are wall-clock times like
// a written date.
const (
	unixLayout   = "unix"
	unixMSLayout = "unix_ms"
	excelLayout  = "excel"
)

// excelEpoch is the day a spreadsheet serial date counts from.
var excelEpoch = time.Date(1899, 12, 30, 0, 0, 0, 0, time.UTC)

func isZoned(l string) bool {
	return l == unixLayout || l == unixMSLayout || strings.Contains(l, "Z07") || strings.Contains(l, "-07")
}

func parseStamp(layout, s string) (time.Time, error) {
	switch layout {
	case unixLayout, unixMSLayout:
		v, err := strconv.ParseFloat(s, 64)
		if layout == unixMSLayout {
			v /= 1000
		}
		if err != nil || !(v > -1e12 && v < 1e12) {
			return time.Time{}, fmt.Errorf("not seconds since 1970")
		}
		sec := math.Floor(v)
		return time.Unix(int64(sec), int64(math.Round((v-sec)*1e6))*1000).UTC(), nil
	case excelLayout:
		v, err := strconv.ParseFloat(s, 64)
		if err != nil || !(v >= 1 && v < 1e6) {
			return time.Time{}, fmt.Errorf("not a serial date")
		}
		// To the nearest millisecond: a serial time of day is a binary
		// fraction of a day (an hour is 1/24) and never exact.
		ms := math.Round(v * 86400e3)
		return excelEpoch.Add(time.Duration(ms) * time.Millisecond), nil
	}
	return time.Parse(layout, s)
}

// numericLayout recognises stamps that are all numbers and returns the
// numeric format their size shows, or "": from 10⁸ to 10¹¹ seconds since
// 1970 (1973–5138), from 10¹¹ to 10¹⁴ milliseconds (1973–5138), from
// 20000 to 110000 a serial date (1954–2201).
func numericLayout(stamps []string) string {
	if len(stamps) == 0 {
		return ""
	}
	var lo, hi float64 = math.Inf(1), math.Inf(-1)
	for _, s := range stamps {
		v, err := strconv.ParseFloat(s, 64)
		if err != nil || strings.ContainsAny(s, "eEnNiI") {
			return ""
		}
		lo, hi = min(lo, v), max(hi, v)
	}
	switch {
	case lo >= 1e8 && hi < 1e11:
		return unixLayout
	case lo >= 1e11 && hi < 1e14:
		return unixMSLayout
	case lo >= 20000 && hi < 110000:
		return excelLayout
	}
	return ""
}

// chooseLayout picks the timestamp layout: the spec's, or the candidate
// that parses the most stamps.
func (p *reader) chooseLayout(rows []*row) string {
	if p.spec.TimeFormat != "" {
		if l, err := TimeLayout(p.spec.TimeFormat); err == nil {
			return l
		}
		return p.spec.TimeFormat
	}
	// Count on the first stamps, then only the layouts that fit at least
	// half as many as the best of them count over the whole file (a full
	// count matters: day/month order may show only on the 13th).
	var stamps []string
	for _, r := range rows {
		if r.drop < 0 {
			stamps = append(stamps, r.cells[cellTime])
		}
	}
	const probe = 100
	counts := make([]int, len(layouts))
	for _, s := range stamps[:min(probe, len(stamps))] {
		for i, l := range layouts {
			if _, err := time.Parse(l.layout, s); err == nil {
				counts[i]++
			}
		}
	}
	top := slices.Max(counts)
	if len(stamps) > probe {
		for i, l := range layouts {
			if top > 0 && 2*counts[i] < top {
				continue // a layout that missed most of the first stamps
			}
			for _, s := range stamps[probe:] {
				if _, err := time.Parse(l.layout, s); err == nil {
					counts[i]++
				}
			}
		}
	}
	best := 0
	for i, c := range counts {
		if c > counts[best] {
			best = i
		}
	}
	if counts[best] == 0 {
		lay := numericLayout(stamps)
		if lay != "" {
			r := firstStamp(rows)
			what := map[string]string{unixLayout: "seconds since 1970-01-01 UTC", unixMSLayout: "milliseconds since 1970-01-01 UTC",
				excelLayout: "spreadsheet serial dates (days since 1899-12-30, wall-clock time)"}[lay]
			t, _ := parseStamp(lay, r.cells[cellTime])
			p.warn(r.lineNo(), "numeric stamps such as %q read as %s (%s); give time_format %s to say so, or another if that is wrong",
				r.cells[cellTime], what, t.Format("2006-01-02 15:04:05"), lay)
		}
		return lay
	}
	if tw := layouts[best].twin; tw != "" {
		for i, l := range layouts {
			if l.layout == tw && counts[i] == counts[best] {
				r := firstStamp(rows)
				p.warn(r.lineNo(), "dates such as %q read as %s; give the trend's time format if that is wrong",
					r.cells[cellTime], dayOrder(layouts[best].layout))
			}
		}
	}
	return layouts[best].layout
}

func dayOrder(l string) string {
	if strings.HasPrefix(l, "1/2") {
		return "month/day"
	}
	return "day/month"
}

// firstStamp returns the first row not yet dropped: the one whose stamp
// stands for the file's. There is one whenever a layout was counted.
func firstStamp(rows []*row) *row {
	for _, r := range rows {
		if r.drop < 0 {
			return r
		}
	}
	return nil
}

// parseTimes gives every good row its instant. Stamps with an offset are
// exact instants. Stamps without one are wall-clock times in the spec's
// zone: a wall time skipped by a spring-forward change drops the row; a wall
// time that occurs twice (fall back) is read as the earlier instant the
// first time it appears in the file and as the later one the second time.
func (p *reader) parseTimes(rows []*row) error {
	lay := p.chooseLayout(rows)
	if lay == "" {
		r := rows[0]
		for _, q := range rows {
			if q.drop < 0 {
				r = q
				break
			}
		}
		if r.drop < 0 {
			hint := `give the trend's time_format: a Go layout written with the reference time (e.g. "2006-01-02 15:04"), or unix, unix_ms or excel for numbers`
			if _, err := strconv.ParseFloat(r.cells[cellTime], 64); err == nil {
				hint = "the numbers are not seconds (10⁸–10¹¹) or milliseconds (10¹¹–10¹⁴) since 1970, nor spreadsheet serial dates (20000–110000): " +
					"export the stamps as dates, or give time_format unix, unix_ms or excel if one of them is meant"
			}
			return p.errAt(r.lineNo(), int(r.timeFrom), p.spec.TimeColumn, fmt.Errorf("%w: %s in column %q; %s",
				ErrTimeFormat, quoteCut(r.cells[cellTime]), p.spec.TimeColumn, hint))
		}
		return nil // every row already dropped for another reason
	}
	p.rep.Layout = lay
	p.zoned = isZoned(lay)
	seen := map[time.Time]int{}
	for _, r := range rows {
		if r.drop >= 0 {
			continue
		}
		t, err := parseStamp(lay, r.cells[cellTime])
		if err != nil || t.Year() < minYear || t.Year() > maxYear {
			r.drop = BadTime
			continue
		}
		if p.zoned || p.loc == time.UTC {
			r.ns = t.UnixNano()
			continue
		}
		early, late, ok := localInstants(t, p.loc)
		if !ok {
			r.drop = MissingLocal
			continue
		}
		r.ns = early.UnixNano()
		if !early.Equal(late) {
			k := seen[t]
			seen[t]++
			if k >= 1 {
				r.ns = late.UnixNano()
			}
			if k == 1 {
				r.note(RepeatedHour)
			}
		}
	}
	return nil
}

// localInstants returns the earliest and latest instants whose wall clock in
// loc reads as w's (UTC) fields; ok is false when no instant does (a time
// skipped by daylight saving). Transitions of up to two hours are handled.
func localInstants(w time.Time, loc *time.Location) (early, late time.Time, ok bool) {
	t := time.Date(w.Year(), w.Month(), w.Day(), w.Hour(), w.Minute(), w.Second(), w.Nanosecond(), loc)
	same := func(u time.Time) bool {
		y, mo, d := u.Date()
		h, mi, s := u.Clock()
		return y == w.Year() && mo == w.Month() && d == w.Day() && h == w.Hour() && mi == w.Minute() && s == w.Second() && u.Nanosecond() == w.Nanosecond()
	}
	if !same(t) {
		return time.Time{}, time.Time{}, false
	}
	early, late = t, t
	for _, d := range []time.Duration{-2 * time.Hour, -time.Hour, -30 * time.Minute, 30 * time.Minute, time.Hour, 2 * time.Hour} {
		if u := t.Add(d); same(u) {
			if u.Before(early) {
				early = u
			}
			if u.After(late) {
				late = u
			}
		}
	}
	return early, late, true
}
