package plant

import (
	"errors"
	"fmt"
	"sort"
	"strings"
)

// ErrInvalid is the class of every problem found in a plant file:
// errors.Is(err, ErrInvalid) is true for an *Error and for an ErrorList.
var ErrInvalid = errors.New("plant: invalid plant file")

// Error is one problem in a plant file, pointing at the value (or, for a
// missing value, at the mapping that lacks it).
type Error struct {
	File   string // file name as given to Load or Parse
	Line   int    // 1-based; 0 when the problem is the file as a whole
	Column int    // 1-based; 0 when not known (YAML syntax errors give a line only)
	Path   string // field path, e.g. pumps[1].curve[3].head; empty for the whole file
	Msg    string // what is wrong, in the file's units
	Err    error  // underlying cause, if any (e.g. an fs error from Load); may be nil
}

// Error formats the problem as file:line:col: path: message.
func (e *Error) Error() string {
	var b strings.Builder
	b.WriteString(e.File)
	if e.Line > 0 {
		fmt.Fprintf(&b, ":%d", e.Line)
		if e.Column > 0 {
			fmt.Fprintf(&b, ":%d", e.Column)
		}
	}
	b.WriteString(": ")
	if e.Path != "" {
		b.WriteString(e.Path)
		b.WriteString(": ")
	}
	b.WriteString(e.Msg)
	return b.String()
}

// Is makes every *Error match ErrInvalid.
func (e *Error) Is(target error) bool { return target == ErrInvalid }

// Unwrap returns the underlying cause, if any.
func (e *Error) Unwrap() error { return e.Err }

// ErrorList is every problem found in one plant file, in file order.
type ErrorList []*Error

// Error writes one problem per line.
func (l ErrorList) Error() string {
	lines := make([]string, len(l))
	for i, e := range l {
		lines[i] = e.Error()
	}
	return strings.Join(lines, "\n")
}

// Is makes a non-empty ErrorList match ErrInvalid.
func (l ErrorList) Is(target error) bool { return target == ErrInvalid && len(l) > 0 }

// Unwrap returns the list's errors for errors.Is and errors.As.
func (l ErrorList) Unwrap() []error {
	out := make([]error, len(l))
	for i, e := range l {
		out[i] = e
	}
	return out
}

// sortByPosition orders the list by line, then column, keeping the order
// of problems at the same place.
func (l ErrorList) sortByPosition() {
	sort.SliceStable(l, func(i, j int) bool {
		if l[i].Line != l[j].Line {
			return l[i].Line < l[j].Line
		}
		return l[i].Column < l[j].Column
	})
}
