package profile

import (
	"bytes"
	"fmt"
	"strings"
	"unicode/utf16"
	"unicode/utf8"
)

// MaxBytes is the largest trend file read (a year of one-minute rows with a
// few columns is about 30 MB).
const MaxBytes = 256 << 20

// magic numbers of files people save by mistake under a .csv name
var magics = []struct {
	prefix string
	what   string
}{
	{"PK\x03\x04", "a ZIP archive (an .xlsx workbook?): export the sheet as CSV"},
	{"\xd0\xcf\x11\xe0", "an old Excel/Office file: export the sheet as CSV"},
	{"\x1f\x8b", "gzip-compressed: decompress it first"},
	{"%PDF", "a PDF document"},
}

// decode turns the file's bytes into text: strips a UTF-8 byte-order mark,
// decodes UTF-16 with a byte-order mark (what spreadsheet "Unicode text"
// exports write), reads invalid UTF-8 as Latin-1, and rejects binary data.
// It returns a warning when it had to guess.
func decode(data []byte) (text, warning string, err error) {
	if len(data) == 0 {
		return "", "", ErrEmpty
	}
	for _, m := range magics {
		if bytes.HasPrefix(data, []byte(m.prefix)) {
			return "", "", fmt.Errorf("%w: the file is %s", ErrBinary, m.what)
		}
	}
	switch {
	case bytes.HasPrefix(data, []byte{0xEF, 0xBB, 0xBF}):
		data = data[3:]
	case bytes.HasPrefix(data, []byte{0xFF, 0xFE}), bytes.HasPrefix(data, []byte{0xFE, 0xFF}):
		s, err := decodeUTF16(data)
		if err != nil {
			return "", "", err
		}
		data = []byte(s)
		warning = "file is UTF-16 encoded; decoded it"
	}
	if i := bytes.IndexByte(data, 0); i >= 0 {
		return "", "", fmt.Errorf("%w: NUL byte at offset %d", ErrBinary, i)
	}
	if n := controlBytes(data); n > 0 {
		return "", "", fmt.Errorf("%w: %d control bytes in its first %d bytes", ErrBinary, n, min(len(data), sniffLen))
	}
	if !utf8.Valid(data) {
		data = latin1(data)
		warning = "file is not UTF-8; read it as Latin-1"
	}
	if strings.TrimSpace(string(data)) == "" {
		return "", "", fmt.Errorf("%w: only blank lines", ErrEmpty)
	}
	return string(data), warning, nil
}

const sniffLen = 8192

// controlBytes counts, in the first sniffLen bytes, control characters that
// never appear in a text CSV (anything below 0x20 other than tab, CR, LF,
// form feed), and returns the count when it is more than a stray one.
func controlBytes(data []byte) int {
	n := 0
	for _, c := range data[:min(len(data), sniffLen)] {
		if c < 0x20 && c != '\t' && c != '\n' && c != '\r' && c != '\f' {
			n++
		}
	}
	if n > 2 {
		return n
	}
	return 0
}

func decodeUTF16(data []byte) (string, error) {
	big := data[0] == 0xFE
	data = data[2:]
	if len(data)%2 != 0 {
		return "", fmt.Errorf("%w: UTF-16 text with an odd number of bytes", ErrBinary)
	}
	u := make([]uint16, len(data)/2)
	for i := range u {
		if big {
			u[i] = uint16(data[2*i])<<8 | uint16(data[2*i+1])
		} else {
			u[i] = uint16(data[2*i+1])<<8 | uint16(data[2*i])
		}
	}
	return string(utf16.Decode(u)), nil
}

func latin1(data []byte) []byte {
	var b bytes.Buffer
	b.Grow(len(data) + len(data)/8)
	for _, c := range data {
		b.WriteRune(rune(c))
	}
	return b.Bytes()
}

// splitLines splits text into lines without their CR/LF endings; a final
// line ending does not start another line. Old Mac files (CR only) work too.
func splitLines(text string) []string {
	sep := "\n"
	if !strings.Contains(text, "\n") && strings.Contains(text, "\r") {
		sep = "\r"
	}
	lines := strings.Split(text, sep)
	if len(lines) > 0 && lines[len(lines)-1] == "" {
		lines = lines[:len(lines)-1]
	}
	for i, l := range lines {
		lines[i] = strings.TrimSuffix(l, "\r")
	}
	return lines
}

// delimiters tried, in order of preference on a tie.
var delimiters = []byte{',', ';', '\t', '|'}

// splitFields splits one line on delim. A field that starts with a double
// quote runs to the matching quote ("" is a literal quote); an unclosed
// quote runs to the end of the line. Unquoted fields are trimmed of spaces.
// starts holds each field's 1-based byte column.
func splitFields(line string, delim byte) (fields []string, starts []int) {
	i := 0
	for {
		for i < len(line) && line[i] == ' ' {
			i++
		}
		starts = append(starts, i+1)
		if i < len(line) && line[i] == '"' {
			var b strings.Builder
			j := i + 1
			for j < len(line) {
				if line[j] == '"' {
					if j+1 < len(line) && line[j+1] == '"' {
						b.WriteByte('"')
						j += 2
						continue
					}
					j++
					break
				}
				b.WriteByte(line[j])
				j++
			}
			// anything between the closing quote and the delimiter is kept
			k := strings.IndexByte(line[j:], delim)
			if k < 0 {
				b.WriteString(strings.TrimSpace(line[j:]))
				fields = append(fields, b.String())
				return fields, starts
			}
			b.WriteString(strings.TrimSpace(line[j : j+k]))
			fields = append(fields, b.String())
			i = j + k + 1
			continue
		}
		k := strings.IndexByte(line[i:], delim)
		if k < 0 {
			fields = append(fields, strings.TrimSpace(line[i:]))
			return fields, starts
		}
		fields = append(fields, strings.TrimSpace(line[i:i+k]))
		i += k + 1
	}
}
