package profile

import (
	"fmt"
	"strings"
	"unicode"
)

// TimeLayout turns a trend's time_format into a Go time layout. Three
// forms are accepted:
//
//   - "unix": seconds since 1970-01-01 UTC, kept as is;
//   - a pattern as practitioners write it (spreadsheets, building
//     automation exports), without digits: "YYYY-MM-DD hh:mm",
//     "MM/DD/YYYY h:mm AM", "DD.MM.YYYY HH:mm:ss", "D-MMM-YYYY hh:mm";
//   - a Go layout written with the reference time Mon Jan 2 15:04:05 2006
//     ("2006-01-02 15:04"), recognised by its digits and kept as is.
//
// Pattern fields: YYYY (year), YY (two-digit year), MM (month, 01–12), M
// (month, 1–12), MMM (Jan), MMMM (January), DD (day, 01–31), D (day,
// 1–31), hh or HH (hour; 01–12 with an AM/PM field, else 00–23), h or H
// (hour without a leading zero), mm (minute), ss (second), AM, PM, AM/PM
// or tt (the AM/PM marker, either case), and fff after ss. (an upper-case MM
// is always the month, a lower-case mm always the minute). Any other
// character except a letter is kept as a separator; T and Z stand for
// themselves, as in ISO 8601 stamps.
func TimeLayout(format string) (string, error) {
	if format == unixLayout || strings.ContainsAny(format, "0123456789") {
		return format, nil
	}
	ampm := false
	for _, m := range ampmMarkers {
		if strings.Contains(format, m.pattern) {
			ampm = true
		}
	}
	var b strings.Builder
	rs := []rune(format)
	// A one-letter number field (D, M, h, H, m, s) has one or two digits, so
	// next to another number field with no separator the stamp cannot be
	// read one way only ("sHH" as 515: 5 s and 15 h, or 51 s and 5 h).
	prevNumber, prevVariable := false, false
	seen := map[string]bool{} // the fields given, by what they mean
	for i := 0; i < len(rs); {
		if m, ok := ampmAt(rs[i:]); ok {
			b.WriteString(m.layout)
			i += len([]rune(m.pattern))
			prevNumber, prevVariable = false, false
			continue
		}
		r := rs[i]
		if !unicode.IsLetter(r) {
			b.WriteRune(r)
			i++
			prevNumber, prevVariable = false, false
			continue
		}
		n := 1
		for i+n < len(rs) && rs[i+n] == r {
			n++
		}
		tok := string(rs[i : i+n])
		lay, err := fieldLayout(tok, ampm)
		if err != nil {
			return "", fmt.Errorf("profile: time_format %q: %w", format, err)
		}
		if what := fieldMeaning(r); what != "" {
			if seen[what] {
				// Go's parser would keep the last and drop the first.
				return "", fmt.Errorf("profile: time_format %q gives the %s twice", format, what)
			}
			seen[what] = true
		}
		number := strings.ContainsRune("YyMDdhHmsf", r) && !(r == 'M' && n >= 3)
		variable := number && n == 1
		if number && (prevVariable || variable && prevNumber) {
			return "", fmt.Errorf("profile: time_format %q: a one-letter field next to another number needs a separator (write %s%s or put a character between them)",
				format, tok, tok)
		}
		prevNumber, prevVariable = number, variable
		b.WriteString(lay)
		i += n
	}
	layout := b.String()
	if !strings.Contains(layout, "2006") && !strings.Contains(layout, "06") {
		return "", fmt.Errorf("profile: time_format %q has no year (YYYY or YY)", format)
	}
	return layout, nil
}

// fieldMeaning is what a pattern letter's field gives ("" for T, Z and
// the AM/PM marker's letters, which fieldLayout rules on).
func fieldMeaning(r rune) string {
	switch r {
	case 'Y', 'y':
		return "year"
	case 'M':
		return "month"
	case 'D', 'd':
		return "day"
	case 'h', 'H':
		return "hour"
	case 'm':
		return "minute"
	case 's':
		return "second"
	case 'f':
		return "fraction of a second"
	}
	return ""
}

// ampmMarkers are the spellings of the AM/PM field, longest first.
var ampmMarkers = []struct{ pattern, layout string }{
	{"AM/PM", "PM"}, {"am/pm", "pm"}, {"AM", "PM"}, {"PM", "PM"}, {"am", "pm"}, {"pm", "pm"}, {"tt", "PM"},
}

func ampmAt(rs []rune) (struct{ pattern, layout string }, bool) {
	s := string(rs)
	for _, m := range ampmMarkers {
		if strings.HasPrefix(s, m.pattern) {
			// "am" inside a word is not a marker; none of the fields
			// is a word, so a marker is followed by a non-letter.
			rest := []rune(s[len(m.pattern):])
			if len(rest) == 0 || !unicode.IsLetter(rest[0]) {
				return m, true
			}
		}
	}
	return struct{ pattern, layout string }{}, false
}

// fieldLayout is the Go layout of one run of a pattern letter.
func fieldLayout(tok string, ampm bool) (string, error) {
	switch tok {
	case "YYYY", "yyyy":
		return "2006", nil
	case "YY", "yy":
		return "06", nil
	case "MMMM":
		return "January", nil
	case "MMM":
		return "Jan", nil
	case "MM":
		return "01", nil
	case "M":
		return "1", nil
	case "DD", "dd":
		return "02", nil
	case "D", "d":
		return "2", nil
	case "hh", "HH":
		if ampm {
			return "03", nil
		}
		return "15", nil
	case "h", "H":
		if ampm {
			return "3", nil
		}
		return "15", nil
	case "mm":
		return "04", nil
	case "m":
		return "4", nil
	case "ss":
		return "05", nil
	case "s":
		return "5", nil
	case "f", "ff", "fff", "ffffff", "fffffffff":
		return strings.Repeat("0", len(tok)), nil
	case "T", "Z":
		return tok, nil
	}
	return "", fmt.Errorf("unknown field %q (fields: YYYY YY MM M MMM DD D hh h HH H mm ss AM/PM fff)", tok)
}
