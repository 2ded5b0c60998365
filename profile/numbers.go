package profile

import (
	"iter"
	"math"
	"strconv"
	"strings"
)

// numFormat is how a column writes its numbers: the decimal separator and
// the thousands separator (0 when the column groups no thousands).
type numFormat struct {
	decimal byte // '.' or ','
	group   byte // ',' or '.', or 0
}

// columnFormat decides a column's number format from all its cells, not
// cell by cell, so that "1.700,0" in a European export is 1700 and not
// 1.7. The evidence, cell by cell:
//
//   - both '.' and ',' in a cell: the last one is the decimal separator
//     ("1.700,0", "1,700.0");
//   - a separator twice or more: it groups thousands ("1.700.000");
//   - one separator followed by other than three digits: it is the decimal
//     separator ("12,5", "1.75").
//
// A cell like "1.700" or "1,700" (one separator, three digits after) could
// be either and is no evidence. When the cells disagree, the format most of
// them show wins and the others are not numbers (their rows are counted
// as bad). With no evidence at all a comma in a comma-delimited file (it
// must be quoted) groups thousands, as spreadsheets quote "1,234"; a comma
// in a file delimited otherwise is a decimal comma; a point is a decimal
// point. ambiguous counts the cells that could be read either way under
// the chosen format and whose reading depends on it.
func columnFormat(cells iter.Seq[string], delim byte) (f numFormat, ambiguous int, first string) {
	var commaDec, pointDec int
	for cell := range cells {
		s := strings.TrimLeft(cell, "+-")
		nd, nc := strings.Count(s, "."), strings.Count(s, ",")
		switch {
		case nd+nc == 0:
		case nd > 0 && nc > 0:
			if strings.LastIndexByte(s, ',') > strings.LastIndexByte(s, '.') {
				commaDec++
			} else {
				pointDec++
			}
		case nd > 1:
			commaDec++
		case nc > 1:
			pointDec++
		case digitsAfter(s, sepOf(nd)) != 3 || mantissaExp(s):
			if nd == 1 {
				pointDec++
			} else {
				commaDec++
			}
		default:
			if ambiguous == 0 {
				first = cell
			}
			ambiguous++
		}
	}
	switch {
	case commaDec > pointDec:
		return numFormat{decimal: ',', group: '.'}, 0, ""
	case pointDec > 0:
		return numFormat{decimal: '.', group: ','}, 0, ""
	case delim != ',' && strings.Contains(first, ","):
		return numFormat{decimal: ',', group: '.'}, ambiguous, first
	}
	return numFormat{decimal: '.', group: ','}, ambiguous, first
}

// digitsAfter counts the digits after the first sep in s, up to an
// exponent; -1 when sep is not in s.
func digitsAfter(s string, sep byte) int {
	i := strings.IndexByte(s, sep)
	if i < 0 {
		return -1
	}
	n := 0
	for _, c := range []byte(s[i+1:]) {
		if c < '0' || c > '9' {
			break
		}
		n++
	}
	return n
}

// sepOf is the separator a cell with one separator holds: a point when it
// has one, else a comma.
func sepOf(points int) byte {
	if points == 1 {
		return '.'
	}
	return ','
}

func mantissaExp(s string) bool { return strings.ContainsAny(s, "eE") }

// parse reads a cell in the format: thousands separators between groups
// of three digits, then the decimal separator. NaN, infinities, hex
// floats and malformed groups are not numbers.
func (f numFormat) parse(s string) (float64, bool) {
	if s == "" {
		return 0, false
	}
	for i := 0; i < len(s); i++ {
		c := s[i]
		if !(c >= '0' && c <= '9' || c == '.' || c == ',' || c == '-' || c == '+' || c == 'e' || c == 'E') {
			return 0, false
		}
	}
	if f.group != 0 && strings.IndexByte(s, f.group) >= 0 {
		if !grouped(s, f.group, f.decimal) {
			return 0, false
		}
		s = strings.ReplaceAll(s, string(f.group), "")
	}
	if f.decimal == ',' {
		if strings.Count(s, ",") > 1 || strings.IndexByte(s, '.') >= 0 {
			return 0, false
		}
		s = strings.Replace(s, ",", ".", 1)
	} else if strings.IndexByte(s, ',') >= 0 {
		return 0, false
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil || math.IsInf(v, 0) || math.IsNaN(v) {
		return 0, false
	}
	return v, true
}

// grouped reports whether the integer part of s is digits grouped in
// threes by group, with an optional sign: "1,234" or "-12.345,6".
func grouped(s string, group, decimal byte) bool {
	s = strings.TrimLeft(s, "+-")
	if i := strings.IndexByte(s, decimal); i >= 0 {
		s = s[:i]
	}
	groups := strings.Split(s, string(group))
	if len(groups[0]) < 1 || len(groups[0]) > 3 {
		return false
	}
	for _, g := range groups {
		for i := 0; i < len(g); i++ {
			if g[i] < '0' || g[i] > '9' {
				return false
			}
		}
	}
	for _, g := range groups[1:] {
		if len(g) != 3 {
			return false
		}
	}
	return true
}

// leadingZero reports whether s is a whole number written with leading
// zeros ("0600"): read as decimal here (600), never as octal.
func leadingZero(s string) bool {
	s = strings.TrimLeft(s, "+-")
	if len(s) < 2 || s[0] != '0' {
		return false
	}
	for i := 1; i < len(s); i++ {
		if s[i] < '0' || s[i] > '9' {
			return false
		}
	}
	return true
}
