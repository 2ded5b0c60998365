package profile

import (
	"fmt"
	"io"
	"strings"
	"text/tabwriter"
	"time"

	"wattstage/curves"
	"wattstage/internal/numfmt"
)

// Reason says what was wrong with a row. Rows with a dropping reason are not
// used; rows with a keeping reason are used with the fix the reason names.
type Reason int

// Dropping reasons: the row is not used. Each dropped row has exactly one,
// the first found in this order.
const (
	TooFewFields   Reason = iota // too few fields to reach the time and flow columns
	TooManyFields                // non-empty fields beyond the header's
	MixedDelimiter               // the row splits on another delimiter than the header
	BlankTime                    // empty timestamp cell
	BadTime                      // timestamp not in the file's format
	MissingLocal                 // local time skipped by a daylight-saving change
	BlankFlow                    // empty flow cell
	BadFlow                      // flow not a finite number
	NegativeFlow                 // flow below zero
	AbsurdFlow                   // flow above the believable maximum
	Duplicate                    // same instant as an earlier row (the earlier is kept)

	// Keeping reasons: the row is used.
	OutOfOrder   // stamp earlier than a previous row's: sorted into place
	RepeatedHour // second pass of a local hour repeated by daylight saving: read as the later (standard-time) instant
	BadDP        // DP cell not a finite number: the point has no DP
	NegativeDP   // DP below zero: the point has no DP
	BadPower     // power cell not a finite number: the point has no power
	NegativePow  // power below zero: the point has no power

	numReasons
)

var reasonText = [numReasons]string{
	TooFewFields:   "too few fields",
	TooManyFields:  "too many fields",
	MixedDelimiter: "other delimiter than the header",
	BlankTime:      "blank timestamp",
	BadTime:        "bad timestamp",
	MissingLocal:   "local time skipped by daylight saving",
	BlankFlow:      "blank flow",
	BadFlow:        "non-numeric flow",
	NegativeFlow:   "negative flow",
	AbsurdFlow:     "absurd flow",
	Duplicate:      "duplicate timestamp",
	OutOfOrder:     "out of order (sorted)",
	RepeatedHour:   "repeated local hour (read as standard time)",
	BadDP:          "non-numeric DP (ignored)",
	NegativeDP:     "negative DP (ignored)",
	BadPower:       "non-numeric power (ignored)",
	NegativePow:    "negative power (ignored)",
}

func (r Reason) String() string {
	if r < 0 || r >= numReasons {
		return fmt.Sprintf("Reason(%d)", int(r))
	}
	return reasonText[r]
}

// Drops reports whether rows with this reason are left out.
func (r Reason) Drops() bool { return r < OutOfOrder }

// MaxLines is how many line numbers an Issue keeps.
const MaxLines = 10

// Issue counts the rows with one reason and keeps the first MaxLines of
// their line numbers, in increasing order.
type Issue struct {
	Reason Reason
	Count  int
	Lines  []int
}

// Gap is a stretch with no rows: from the end of one point's logging
// interval to the next point.
type Gap struct {
	From    time.Time
	To      time.Time
	Missing time.Duration
}

// MaxGaps is how many gaps a Report lists.
const MaxGaps = 10

// Report accounts for every line of a trend file.
type Report struct {
	Lines      int     // lines in the file
	HeaderLine int     // line of the header
	Preamble   int     // non-blank lines before the header (skipped)
	Blank      int     // blank lines after the header (skipped; not rows)
	Rows       int     // data rows: Kept + Dropped
	Kept       int     // rows used as points
	Dropped    int     // rows left out, each with one dropping reason
	Issues     []Issue // non-zero reasons, in Reason order
	WithDP     int     // points with a DP
	WithPower  int     // points with a measured power

	Delimiter byte        // field delimiter found in the header
	Layout    string      // timestamp layout used
	FlowLimit curves.Flow // flows above this were dropped as absurd, m³/s
	FlowUnit  string      // the file's flow unit, for messages
	flowMul   float64     // m³/s per FlowUnit

	Gaps         int           // stretches with no rows
	MissingHours float64       // hours in those gaps
	FirstGaps    []Gap         // the first MaxGaps of them
	LongestGap   time.Duration // the longest
}

// Count returns the number of rows with the reason.
func (r *Report) Count(reason Reason) int {
	for _, is := range r.Issues {
		if is.Reason == reason {
			return is.Count
		}
	}
	return 0
}

// LinesOf returns the first line numbers of rows with the reason.
func (r *Report) LinesOf(reason Reason) []int {
	for _, is := range r.Issues {
		if is.Reason == reason {
			return is.Lines
		}
	}
	return nil
}

// Summary is one line: rows kept, dropped and the dropping reasons.
func (r *Report) Summary() string {
	var parts []string
	for _, is := range r.Issues {
		if !is.Reason.Drops() {
			continue
		}
		detail := lineList(is)
		if is.Reason == AbsurdFlow && r.flowMul > 0 {
			detail = fmt.Sprintf("above %.4g %s; %s", float64(r.FlowLimit)/r.flowMul, r.FlowUnit, detail)
		}
		parts = append(parts, fmt.Sprintf("%d %s (%s)", is.Count, is.Reason, detail))
	}
	s := fmt.Sprintf("%s rows, %s kept, %s dropped", numfmt.Int(r.Rows), numfmt.Int(r.Kept), numfmt.Int(r.Dropped))
	if len(parts) > 0 {
		s += ": " + strings.Join(parts, "; ")
	}
	return s
}

func lineList(is Issue) string {
	var b strings.Builder
	if len(is.Lines) == 1 {
		b.WriteString("line ")
	} else {
		b.WriteString("lines ")
	}
	for i, l := range is.Lines {
		if i > 0 {
			b.WriteString(", ")
		}
		fmt.Fprint(&b, l)
	}
	if is.Count > len(is.Lines) {
		fmt.Fprintf(&b, ", … %d more", is.Count-len(is.Lines))
	}
	return b.String()
}

// WriteTo writes the report as an aligned table.
func (r *Report) WriteTo(w io.Writer) (int64, error) {
	cw := &countWriter{w: w}
	tw := tabwriter.NewWriter(cw, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "rows\t%d\n", r.Rows)
	fmt.Fprintf(tw, "kept\t%d\n", r.Kept)
	fmt.Fprintf(tw, "dropped\t%d\n", r.Dropped)
	if r.Blank > 0 {
		fmt.Fprintf(tw, "blank lines skipped\t%d\n", r.Blank)
	}
	if r.Preamble > 0 {
		fmt.Fprintf(tw, "lines before the header\t%d\n", r.Preamble)
	}
	for _, is := range r.Issues {
		what := "dropped"
		if !is.Reason.Drops() {
			what = "kept"
		}
		fmt.Fprintf(tw, "  %s\t%d\t%s, %s\n", is.Reason, is.Count, what, lineList(is))
	}
	if r.Gaps > 0 {
		fmt.Fprintf(tw, "gaps\t%d\t%.2f h missing, longest %s\n", r.Gaps, r.MissingHours, r.LongestGap)
	}
	err := tw.Flush()
	return cw.n, err
}

type countWriter struct {
	w io.Writer
	n int64
}

func (c *countWriter) Write(p []byte) (int, error) {
	n, err := c.w.Write(p)
	c.n += int64(n)
	return n, err
}
