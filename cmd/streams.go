package cmd

import (
	"fmt"
	"io"
	"unicode/utf8"
)

// safeWriter is what every command writes its text through. It escapes the
// control characters a terminal would act on — C0 (ESC, BEL, NUL, …), DEL
// and C1 (U+0080–U+009F) — as \u00XX, so a name carrying an escape
// sequence or an OSC title cannot reach the terminal raw; line feed and tab
// pass, and carriage return where keepCR is set (stderr's progress line).
// The \u00XX form is also a valid escape inside a JSON string, so JSON
// output stays valid. It remembers the first write error, after which it
// writes nothing more: Main turns that error into exit 1, so output to a
// full device or a closed pipe does not end in success.
type safeWriter struct {
	w      io.Writer
	keepCR bool
	err    error  // first write error
	held   []byte // an incomplete UTF-8 sequence at the end of the last write
	buf    []byte
}

func newSafeWriter(w io.Writer, keepCR bool) *safeWriter { return &safeWriter{w: w, keepCR: keepCR} }

func (s *safeWriter) Write(p []byte) (int, error) {
	if s.err != nil {
		return 0, s.err
	}
	n := len(p)
	if len(s.held) > 0 {
		p = append(s.held, p...)
		s.held = nil
	}
	s.buf = s.buf[:0]
	for i := 0; i < len(p); {
		c := p[i]
		if c < utf8.RuneSelf {
			if c < 0x20 && c != '\n' && c != '\t' && !(c == '\r' && s.keepCR) || c == 0x7f {
				s.buf = fmt.Appendf(s.buf, `\u%04x`, c)
			} else {
				s.buf = append(s.buf, c)
			}
			i++
			continue
		}
		if !utf8.FullRune(p[i:]) {
			s.held = append([]byte(nil), p[i:]...)
			break
		}
		r, size := utf8.DecodeRune(p[i:])
		if r >= 0x80 && r <= 0x9f && size == 2 {
			s.buf = fmt.Appendf(s.buf, `\u%04x`, r)
		} else {
			s.buf = append(s.buf, p[i:i+size]...)
		}
		i += size
	}
	if _, err := s.w.Write(s.buf); err != nil {
		s.err = err
		return 0, err
	}
	return n, nil
}

// flush writes a held incomplete sequence as it is and returns the first
// write error.
func (s *safeWriter) flush() error {
	if len(s.held) > 0 && s.err == nil {
		if _, err := s.w.Write(s.held); err != nil {
			s.err = err
		}
		s.held = nil
	}
	return s.err
}
