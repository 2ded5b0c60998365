package profile

import (
	"errors"
	"fmt"
)

// Classes of error that make a whole trend file unusable. A ParseError
// wraps one of them; test with errors.Is.
var (
	ErrEmpty         = errors.New("profile: file is empty")
	ErrBinary        = errors.New("profile: not a text file")
	ErrTooLarge      = errors.New("profile: file too large")
	ErrNoHeader      = errors.New("profile: no header line")
	ErrMissingColumn = errors.New("profile: missing column")
	ErrDupColumn     = errors.New("profile: column named twice")
	ErrNoRows        = errors.New("profile: no data rows")
	ErrNoUsableRows  = errors.New("profile: no usable rows")
	ErrMixedDelims   = errors.New("profile: mixed delimiters")
	ErrInterval      = errors.New("profile: cannot find the logging interval")
	ErrTimeFormat    = errors.New("profile: no timestamp in a known format")
	ErrNotRegular    = errors.New("profile: not a regular file")
	ErrTooManyRows   = errors.New("profile: too many rows")
	ErrStrayStamp    = errors.New("profile: a stamp far from the rest of the log")
	ErrImplausible   = errors.New("profile: flows do not fit the plant")
)

// Classes of error in a TrendSpec (not in the file). They come wrapped in a
// plain error naming the spec field, without a file position: the plant
// loader knows where in the plant file the spec came from.
var (
	ErrSpec     = errors.New("profile: trend spec")
	ErrBinWidth = errors.New("profile: bin width must be a positive finite flow")
)

// ParseError points into a trend file, in the manner of encoding/csv's
// ParseError: file, line and byte column (both 1-based; 0 when the error
// concerns the whole file or line) and the header of the column concerned.
type ParseError struct {
	File   string // name as given to ReadTrend
	Line   int    // 1-based line; 0 = the whole file
	Column int    // 1-based byte column; 0 = the whole line
	Field  string // header of the column concerned; empty when none
	Err    error  // wraps one of the Err… classes above
}

func (e *ParseError) Error() string {
	pos := e.File
	if e.Line > 0 {
		pos += fmt.Sprintf(":%d", e.Line)
		if e.Column > 0 {
			pos += fmt.Sprintf(":%d", e.Column)
		}
	}
	return pos + ": " + e.Err.Error()
}

func (e *ParseError) Unwrap() error { return e.Err }

func specError(format string, args ...any) error {
	return fmt.Errorf("%w: "+format, append([]any{ErrSpec}, args...)...)
}
