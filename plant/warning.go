package plant

import (
	"fmt"
	"strings"
)

// Warning is something in a plant file that is usable but questionable (a
// motor into its service factor at the design head, a bin above the design
// flow), positioned like an [Error]: at the value it is about.
type Warning struct {
	File    string // file name as given to Load or Parse
	Line    int    // 1-based; 0 when not known
	Column  int    // 1-based; 0 when not known
	Path    string // field path, e.g. profile.bins[3].flow
	Message string // what is questionable, in the file's units
}

// Origin says where the warning points: file:line:col: path, or file: path
// when the line is not known.
func (w Warning) Origin() string {
	var b strings.Builder
	b.WriteString(w.File)
	if w.Line > 0 {
		fmt.Fprintf(&b, ":%d", w.Line)
		if w.Column > 0 {
			fmt.Fprintf(&b, ":%d", w.Column)
		}
	}
	if w.Path != "" {
		b.WriteString(": ")
		b.WriteString(w.Path)
	}
	return b.String()
}

// String formats the warning as its origin and message, like an Error:
// file:line:col: path: message.
func (w Warning) String() string { return w.Origin() + ": " + w.Message }
