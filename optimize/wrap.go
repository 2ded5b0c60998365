package optimize

import (
	"strings"
	"unicode/utf8"
)

// wrap breaks text into lines of at most width runes at spaces, keeping a
// unit ("%", "gpm", "min", …) on the line of its number.
func wrap(s string, width int) string {
	var words []string
	for _, w := range strings.Fields(s) {
		if n := len(words); n > 0 && (isUnitWord(w) || strings.HasSuffix(words[n-1], " ×")) {
			words[n-1] += " " + w
			continue
		}
		words = append(words, w)
	}
	var b strings.Builder
	n := 0
	for i, w := range words {
		l := utf8.RuneCountInString(w)
		if i > 0 {
			if n+1+l > width {
				b.WriteByte('\n')
				n = 0
			} else {
				b.WriteByte(' ')
				n++
			}
		}
		b.WriteString(w)
		n += l
	}
	return b.String()
}

func isUnitWord(w string) bool {
	switch strings.TrimRight(w, ".,;:)") {
	case "%", "gpm", "m³/h", "L/s", "ft", "m", "min", "kW", "hp", "×":
		return true
	}
	return false
}
