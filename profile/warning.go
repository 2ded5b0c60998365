package profile

import "strconv"

// Warning is something in a trend log that is usable but questionable:
// dates that could be read either way, a flow column guessed from the
// header, rows dropped, gaps.
type Warning struct {
	File    string // the file name as given to ReadTrend
	Line    int    // 1-based line the warning is about (the first that showed it); 0 when it is about the file as a whole
	Message string
}

// Origin says where the warning points: file:line, or file when no single
// line applies.
func (w Warning) Origin() string {
	if w.Line > 0 {
		return w.File + ":" + strconv.Itoa(w.Line)
	}
	return w.File
}

// String formats the warning as its origin and message, like a
// ParseError: file:line: message.
func (w Warning) String() string { return w.Origin() + ": " + w.Message }
