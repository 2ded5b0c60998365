package profile

import (
	"bytes"
	"cmp"
	"fmt"
	"io"
	"math"
	"os"
	"slices"
	"sort"
	"strconv"
	"strings"
	"time"
	_ "time/tzdata" // zones work on machines without a zoneinfo database

	"wattstage/curves"
	"wattstage/internal/numfmt"
)

// maxPreamble is how many non-blank lines before the header are searched
// for it (building-automation exports often start with a title block).
const maxPreamble = 50

// maxInterval is the longest logging interval accepted.
const maxInterval = 31 * 24 * time.Hour

// MaxRows is the most data lines a trend may have: two years of one-minute
// rows (1,054,080) and a little more. It bounds the time and memory of
// reading (with MaxBytes); a longer log can be resampled to a longer
// interval first. Solving every interval of such a log is issue 13's
// (the solver's own cost per interval), not bounded here.
const MaxRows = 1_100_000

// maxStampGap is the longest hole accepted between two stamps: a trend is
// one continuous record, and a stamp more than a year from its neighbour
// is a typing or export error (one stray row a century away), not data.
const maxStampGap = 366 * 24 * time.Hour

// ReadTrendFile opens path and reads it with ReadTrend. Only a regular
// file (or a link to one) is read: a named pipe, a device or a folder is
// refused before it is opened, so that the read cannot wait forever.
func ReadTrendFile(spec TrendSpec, path string) (*Trend, error) {
	st, err := os.Stat(path)
	if err != nil {
		return nil, err
	}
	if !st.Mode().IsRegular() {
		return nil, &ParseError{File: path, Err: fmt.Errorf("%w: it is %s; give the trend log itself (a pipe or a device could keep the read waiting forever)",
			ErrNotRegular, FileKind(st.Mode()))}
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	return readTrend(spec, f, path, st.Size())
}

// ReadTrend reads a trend log in CSV from r. name is used in errors and
// reports. It returns a ParseError when the file as a whole is unusable,
// an error wrapping ErrSpec when the spec is, and otherwise a Trend whose
// Report accounts for every row.
func ReadTrend(spec TrendSpec, r io.Reader, name string) (*Trend, error) {
	return readTrend(spec, r, name, 0)
}

// readTrend is ReadTrend with the file's size when known (0 if not), so
// that the bytes are read into one buffer of that size: io.ReadAll grows
// its buffer step by step, and the steps of a 30 MB log add up to several
// times its size in garbage at the start of the read.
func readTrend(spec TrendSpec, r io.Reader, name string, size int64) (*Trend, error) {
	p, err := newReader(spec, name)
	if err != nil {
		return nil, err
	}
	var buf bytes.Buffer
	if size > 0 && size <= MaxBytes {
		buf.Grow(int(size) + bytes.MinRead)
	}
	_, err = buf.ReadFrom(io.LimitReader(r, MaxBytes+1))
	data := buf.Bytes()
	if err != nil {
		return nil, p.fileErr(fmt.Errorf("profile: reading: %w", err))
	}
	if len(data) > MaxBytes {
		return nil, p.fileErr(fmt.Errorf("%w: more than %d MiB", ErrTooLarge, MaxBytes>>20))
	}
	text, warn, err := decode(data)
	if err != nil {
		return nil, p.fileErr(err)
	}
	if warn != "" {
		p.warn(0, "%s", warn)
	}
	return p.read(splitLines(text))
}

type reader struct {
	spec     TrendSpec
	name     string
	loc      *time.Location
	flowMul  float64 // m³/s per file unit
	dp       dpUnit
	density  float64
	warnings []Warning
	rep      Report

	delim          byte
	header         []string
	ti, fi, di, pi int // column indices; -1 when unmapped
	need           int // fields a row must have: up to the time and flow columns
	zoned          bool
	alt            byte // the first other delimiter a row split on
}

// FileKind names a file's type for a message ("a folder", "a named pipe
// (FIFO)", …): the plant loader and the trend reader word it alike.
func FileKind(m os.FileMode) string {
	switch {
	case m.IsDir():
		return "a folder"
	case m&os.ModeNamedPipe != 0:
		return "a named pipe (FIFO)"
	case m&os.ModeCharDevice != 0:
		return "a character device"
	case m&os.ModeDevice != 0:
		return "a block device"
	case m&os.ModeSocket != 0:
		return "a socket"
	}
	return "a special file"
}

func newReader(spec TrendSpec, name string) (*reader, error) {
	p := &reader{spec: spec, name: name, loc: time.UTC, density: spec.Density, di: -1, pi: -1}
	if strings.EqualFold(spec.TimeZone, "Local") {
		return nil, specError("time zone Local is whatever zone the computer is set to, so results would change from machine to machine: give the plant's IANA zone (e.g. America/Chicago) or UTC")
	}
	if spec.TimeZone != "" {
		loc, err := time.LoadLocation(spec.TimeZone)
		if err != nil {
			return nil, specError("unknown time zone %q", spec.TimeZone)
		}
		p.loc = loc
	}
	if spec.FlowUnit != "" {
		m, ok := flowUnits[unitKey(spec.FlowUnit)]
		if !ok {
			return nil, specError("unknown flow unit %q (want gpm, m3/h or L/s)", spec.FlowUnit)
		}
		p.flowMul = m
	}
	if spec.DPUnit != "" {
		u, ok := dpUnits[unitKey(spec.DPUnit)]
		if !ok {
			return nil, specError("unknown DP unit %q (want psi, kPa, ft or m)", spec.DPUnit)
		}
		p.dp = u
	}
	switch {
	case p.density == 0:
		p.density = curves.ReferenceDensity
	case !(p.density > 100 && p.density < 3000):
		return nil, specError("fluid density %g kg/m³ is not believable", spec.Density)
	}
	if math.IsNaN(float64(spec.MaxFlow)) || spec.MaxFlow < 0 {
		return nil, specError("maximum flow %g m³/s must be ≥ 0", float64(spec.MaxFlow))
	}
	if spec.Interval < 0 || spec.Interval > maxInterval {
		return nil, specError("interval %s must be 0 to 31 days", spec.Interval)
	}
	return p, nil
}

// warn records a warning about line (0 for the file as a whole).
func (p *reader) warn(line int, format string, args ...any) {
	p.warnings = append(p.warnings, Warning{File: p.name, Line: line, Message: fmt.Sprintf(format, args...)})
}

func (p *reader) fileErr(err error) error { return &ParseError{File: p.name, Err: err} }

func (p *reader) errAt(line, col int, field string, err error) error {
	return &ParseError{File: p.name, Line: line, Column: col, Field: field, Err: err}
}

// row is one data line being read. Only the cells of the mapped columns
// are kept (time, flow, DP, power; "" where the row has none), not every
// field; the instant is Unix nanoseconds (stamps are 1970–2199, inside
// int64's range), the keeping reasons a bit set, and rows are allocated
// together: a million-row log then costs about 120 bytes a row while it
// is read, not 170.
type row struct {
	cells    [4]string // cellTime, cellFlow, cellDP, cellPower
	ns       int64     // the instant, Unix nanoseconds; set by parseTimes
	flow     float64   // m³/s
	dp       float64   // m of fluid
	power    float64   // W
	drop     Reason    // dropping reason; -1 while the row is good
	line     int32     // line in the file (MaxRows bounds it)
	timeFrom int32     // column (1-based) where the time cell starts, for messages
	notes    uint32    // keeping reasons, bit 1<<Reason
	hasDP    bool
	hasPow   bool
}

// note records a keeping reason.
func (r *row) note(why Reason) { r.notes |= 1 << why }

// t is the row's instant.
func (r *row) t() time.Time { return time.Unix(0, r.ns) }

// lineNo is the row's line in the file.
func (r *row) lineNo() int { return int(r.line) }

// Indices of row.cells.
const (
	cellTime = iota
	cellFlow
	cellDP
	cellPower
)

// cell returns the row's cell of column i (a mapped column's index), ""
// when the row stops before it or i is unmapped.
func (p *reader) cell(r *row, i int) string {
	switch i {
	case -1:
		return ""
	case p.ti:
		return r.cells[cellTime]
	case p.fi:
		return r.cells[cellFlow]
	case p.di:
		return r.cells[cellDP]
	case p.pi:
		return r.cells[cellPower]
	}
	return ""
}

func (p *reader) read(lines []string) (*Trend, error) {
	p.rep.Lines = len(lines)
	if l := plantFileLine(lines); l > 0 {
		return nil, p.errAt(l, 1, "", fmt.Errorf("%w: the file is a plant file (YAML with pumps: and system:), not a CSV trend log", ErrNoHeader))
	}
	h, err := p.findHeader(lines)
	if err != nil {
		return nil, err
	}
	if err := p.mapColumns(lines[h], h+1); err != nil {
		return nil, err
	}
	if n := len(lines) - h - 1; n > MaxRows {
		return nil, p.errAt(h+2+MaxRows, 0, "", fmt.Errorf("%w: %d lines after the header, more than the %d accepted: resample the log to a longer interval or split it",
			ErrTooManyRows, n, MaxRows))
	}
	rows := p.splitRows(lines[h+1:], h+2)
	if len(rows) == 0 {
		return nil, p.errAt(h+1, 0, "", fmt.Errorf("%w after the header", ErrNoRows))
	}
	if err := p.parseTimes(rows); err != nil {
		return nil, err
	}
	p.parseValues(rows)
	p.dropAbsurd(rows)
	kept := p.dedupe(rows)
	p.tally(rows)
	if len(kept) == 0 {
		return nil, p.unusable(rows)
	}
	return p.build(kept)
}

// findHeader returns the index of the header line: the first of the first
// maxPreamble non-blank lines that names the flow column under some
// delimiter.
func (p *reader) findHeader(lines []string) (int, error) {
	first := -1
	seen := 0
	for i, l := range lines {
		if strings.TrimSpace(l) == "" {
			continue
		}
		if first < 0 {
			first = i
		}
		if seen++; seen > maxPreamble {
			break
		}
		best, bestN := byte(0), 0
		for _, d := range delimiters {
			f, _ := splitFields(l, d)
			if p.flowIndex(f) >= 0 && len(f) > bestN {
				best, bestN = d, len(f)
			}
		}
		if bestN > 0 {
			p.delim = best
			p.rep.HeaderLine = i + 1
			p.rep.Preamble = seen - 1
			if seen > 1 {
				p.warn(i+1, "skipped %d lines before the header on line %d", seen-1, i+1)
			}
			return i, nil
		}
	}
	if first < 0 {
		return 0, p.fileErr(fmt.Errorf("%w: only blank lines", ErrEmpty))
	}
	l := lines[first]
	d := likelyDelimiter(l)
	f, _ := splitFields(l, d)
	want := p.spec.FlowColumn
	if want == "" {
		want = `containing "flow"`
	} else {
		want = strconv.Quote(want)
	}
	switch {
	case strings.HasPrefix(strings.TrimSpace(l), "<"):
		return 0, p.errAt(first+1, 1, "", fmt.Errorf("%w: the file looks like HTML or XML, not CSV", ErrNoHeader))
	case looksLikeData(f):
		return 0, p.errAt(first+1, 1, "", fmt.Errorf("%w: line starts with data (%s), not a header naming the flow column %s",
			ErrNoHeader, quoteCut(l), want))
	}
	return 0, p.errAt(first+1, 0, p.spec.FlowColumn, fmt.Errorf("%w: no flow column %s in the header (it has: %s)",
		ErrMissingColumn, want, quoteList(f)))
}

// likelyDelimiter is the candidate delimiter that splits l into the most
// fields (',' on a tie).
func likelyDelimiter(l string) byte {
	best, bestN := delimiters[0], 0
	for _, d := range delimiters {
		if f, _ := splitFields(l, d); len(f) > bestN {
			best, bestN = d, len(f)
		}
	}
	return best
}

// plantFileLine returns the 1-based line of "pumps:" when the file's first
// lines hold the top-level keys pumps: and system: of a plant file, else 0.
func plantFileLine(lines []string) int {
	pumps, system := 0, false
	for i, l := range lines[:min(len(lines), 400)] {
		switch {
		case strings.HasPrefix(l, "pumps:"):
			pumps = i + 1
		case strings.HasPrefix(l, "system:"):
			system = true
		}
	}
	if system {
		return pumps
	}
	return 0
}

func looksLikeData(fields []string) bool {
	for _, f := range fields {
		if _, ok := number(f, ','); ok {
			return true
		}
		for _, lay := range layouts {
			if _, err := time.Parse(lay.layout, f); err == nil {
				return true
			}
		}
	}
	return false
}

func normHeader(s string) string { return strings.ToLower(strings.TrimSpace(s)) }

// flowIndex finds the flow column among header fields: by name when the
// spec gives one, else the only header containing "flow". -1 if none.
func (p *reader) flowIndex(header []string) int {
	if p.spec.FlowColumn != "" {
		return slices.IndexFunc(header, func(h string) bool { return normHeader(h) == normHeader(p.spec.FlowColumn) })
	}
	idx := -1
	for i, h := range header {
		if strings.Contains(normHeader(h), "flow") {
			if idx >= 0 {
				return -1
			}
			idx = i
		}
	}
	return idx
}

func (p *reader) mapColumns(line string, lineNo int) error {
	header, starts := splitFields(line, p.delim)
	p.header = header
	p.rep.Delimiter = p.delim
	find := func(name string) (int, error) {
		idx := -1
		for i, h := range header {
			if normHeader(h) != normHeader(name) {
				continue
			}
			if idx >= 0 {
				return -1, p.errAt(lineNo, starts[i], name, fmt.Errorf("%w: %q is column %d and column %d", ErrDupColumn, name, idx+1, i+1))
			}
			idx = i
		}
		if idx < 0 {
			return -1, p.errAt(lineNo, 0, name, fmt.Errorf("%w: no column %q in the header (it has: %s)", ErrMissingColumn, name, quoteList(header)))
		}
		return idx, nil
	}
	var err error
	if p.spec.FlowColumn == "" {
		p.fi = p.flowIndex(header)
		p.spec.FlowColumn = header[p.fi]
		p.warn(lineNo, "flow column not named; using %q", header[p.fi])
	}
	if p.fi, err = find(p.spec.FlowColumn); err != nil {
		return err
	}
	if p.spec.TimeColumn == "" {
		p.ti = 0
		if p.ti == p.fi {
			return p.errAt(lineNo, 0, "", fmt.Errorf("%w: no time column named and the first column is the flow", ErrMissingColumn))
		}
		p.spec.TimeColumn = header[0]
	} else if p.ti, err = find(p.spec.TimeColumn); err != nil {
		return err
	}
	if p.spec.DPColumn != "" {
		if p.di, err = find(p.spec.DPColumn); err != nil {
			return err
		}
	}
	if p.spec.PowerColumn != "" {
		if p.pi, err = find(p.spec.PowerColumn); err != nil {
			return err
		}
	}
	roles := []struct {
		name string
		i    int
	}{{"time", p.ti}, {"flow", p.fi}, {"DP", p.di}, {"power", p.pi}}
	for a := range roles {
		for b := a + 1; b < len(roles); b++ {
			if i := roles[a].i; i >= 0 && i == roles[b].i {
				return p.errAt(lineNo, starts[i], header[i], fmt.Errorf("%w: the %s and %s columns are both %q: each quantity needs its own column",
					ErrSpec, roles[a].name, roles[b].name, header[i]))
			}
		}
	}
	if p.flowMul == 0 {
		u := unitFromHeader(header[p.fi], flowUnits)
		if u == "" {
			return p.errAt(lineNo, starts[p.fi], header[p.fi], fmt.Errorf("%w: flow unit not given and not in the column name %q", ErrSpec, header[p.fi]))
		}
		p.flowMul = flowUnits[u]
		p.spec.FlowUnit = u
	}
	p.rep.FlowUnit, p.rep.flowMul = p.spec.FlowUnit, p.flowMul
	if p.di >= 0 && p.dp == (dpUnit{}) {
		u := unitFromHeader(header[p.di], dpUnits)
		if u == "" {
			return p.errAt(lineNo, starts[p.di], header[p.di], fmt.Errorf("%w: DP unit not given and not in the column name %q", ErrSpec, header[p.di]))
		}
		p.dp = dpUnits[u]
		p.spec.DPUnit = u
	}
	p.need = max(p.ti, p.fi) + 1 // a row may stop before its optional cells
	return nil
}

// splitRows splits the data lines into fields and drops rows whose field
// count is wrong. first is the line number of lines[0].
func (p *reader) splitRows(lines []string, first int) []*row {
	var rows []*row
	slab := make([]row, 0, len(lines)) // never grows: the rows' pointers stay valid
	for i, l := range lines {
		lineNo := first + i
		if strings.TrimSpace(l) == "" {
			p.rep.Blank++
			continue
		}
		f, s := splitFields(l, p.delim)
		if allEmpty(f) {
			p.rep.Blank++
			continue
		}
		slab = append(slab, row{line: int32(lineNo), drop: -1})
		r := &slab[len(slab)-1]
		for c, col := range [4]int{p.ti, p.fi, p.di, p.pi} {
			if col >= 0 && col < len(f) {
				r.cells[c] = f[col]
			}
		}
		if p.ti < len(s) {
			r.timeFrom = int32(s[p.ti])
		}
		rows = append(rows, r)
		switch {
		case len(f) < p.need:
			r.drop = TooFewFields
			for _, d := range delimiters {
				if d != p.delim {
					if g, _ := splitFields(l, d); len(g) >= p.need {
						r.drop = MixedDelimiter
						if p.alt == 0 {
							p.alt = d
						}
					}
				}
			}
		case len(f) > len(p.header) && !allEmpty(f[len(p.header):]):
			r.drop = TooManyFields
		case f[p.ti] == "":
			r.drop = BlankTime
		}
	}
	return rows
}

func allEmpty(f []string) bool {
	for _, s := range f {
		if s != "" {
			return false
		}
	}
	return true
}

// columnOf decides the number format of column i from the cells of the
// rows still good, and warns when some cells could be read either way or
// have leading zeros.
func (p *reader) columnOf(rows []*row, i int) numFormat {
	if i < 0 {
		return numFormat{decimal: '.'}
	}
	// The cells are visited where they lie, not gathered: a million-row
	// log would otherwise hold a copy of the column's strings and lines.
	zeros, zeroLine := 0, 0
	cells := func(yield func(string) bool) {
		for _, r := range rows {
			cell := p.cell(r, i)
			if r.drop >= 0 || cell == "" {
				continue
			}
			if leadingZero(cell) {
				if zeros == 0 {
					zeroLine = r.lineNo()
				}
				zeros++
			}
			if !yield(cell) {
				return
			}
		}
	}
	f, n, first := columnFormat(cells, p.delim)
	col := p.header[i]
	if n > 0 {
		line := 0
		for _, r := range rows {
			if r.drop < 0 && p.cell(r, i) == first {
				line = r.lineNo()
				break
			}
		}
		v, _ := f.parse(first)
		p.warn(line, "%d numbers in column %q such as %q could have a decimal or a thousands separator and no other cell tells: read %q as %s; if that is wrong, check the export's number format",
			n, col, first, first, strconv.FormatFloat(v, 'f', -1, 64))
	}
	if zeros > 0 {
		p.warn(zeroLine, "%d numbers in column %q have leading zeros (such as line %d's); read as decimal numbers, not octal", zeros, col, zeroLine)
	}
	return f
}

// parseValues converts the flow, DP and power cells of rows still good,
// each column in the number format its cells show as a whole.
func (p *reader) parseValues(rows []*row) {
	ff, df, pf := p.columnOf(rows, p.fi), p.columnOf(rows, p.di), p.columnOf(rows, p.pi)
	for _, r := range rows {
		if r.drop >= 0 {
			continue
		}
		cell := r.cells[cellFlow]
		v, ok := ff.parse(cell)
		switch {
		case cell == "":
			r.drop = BlankFlow
			continue
		case !ok:
			r.drop = BadFlow
			continue
		case v < 0:
			r.drop = NegativeFlow
			continue
		}
		r.flow = v * p.flowMul
		if c := r.cells[cellDP]; c != "" {
			v, ok := df.parse(c)
			switch {
			case !ok:
				r.note(BadDP)
			case v < 0:
				r.note(NegativeDP)
			default:
				r.dp, r.hasDP = float64(p.dp.head(v, p.density)), true
			}
		}
		if c := r.cells[cellPower]; c != "" {
			v, ok := pf.parse(c)
			switch {
			case !ok:
				r.note(BadPower)
			case v < 0:
				r.note(NegativePow)
			default:
				r.power, r.hasPow = v*curves.KW, true
			}
		}
	}
}

// number parses a numeric cell: a plain decimal, a decimal comma when the
// delimiter is not a comma ("12,5"), or thousands separators in a quoted
// cell ("1,234.5"). NaN, infinities and hex floats are not numbers here.
func number(s string, delim byte) (float64, bool) {
	if s == "" {
		return 0, false
	}
	for i := 0; i < len(s); i++ {
		c := s[i]
		if !(c >= '0' && c <= '9' || c == '.' || c == ',' || c == '-' || c == '+' || c == 'e' || c == 'E') {
			return 0, false
		}
	}
	if strings.Contains(s, ",") {
		switch {
		case delim != ',' && strings.Count(s, ",") == 1 && !strings.Contains(s, "."):
			s = strings.Replace(s, ",", ".", 1)
		case thousands(s):
			s = strings.ReplaceAll(s, ",", "")
		default:
			return 0, false
		}
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil || math.IsInf(v, 0) || math.IsNaN(v) {
		return 0, false
	}
	return v, true
}

// thousands reports whether s is digits grouped by commas in threes, with
// an optional sign and decimal part: "1,234" or "-12,345.6".
func thousands(s string) bool {
	s = strings.TrimLeft(s, "+-")
	if i := strings.IndexByte(s, '.'); i >= 0 {
		s = s[:i]
	}
	groups := strings.Split(s, ",")
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

// dropAbsurd drops flows above the believable maximum: the spec's, or by
// default 3 × the 99th percentile (nearest rank) of the positive flows, a
// rule of our own that leaves any real load profile alone and catches
// sensor spikes and unit slips (flows many times the plant's usual peak).
func (p *reader) dropAbsurd(rows []*row) {
	limit := float64(p.spec.MaxFlow)
	if limit == 0 {
		var pos []float64
		for _, r := range rows {
			if r.drop < 0 && r.flow > 0 {
				pos = append(pos, r.flow)
			}
		}
		if len(pos) == 0 {
			return
		}
		sort.Float64s(pos)
		rank := int(math.Ceil(0.99*float64(len(pos)))) - 1
		limit = 3 * pos[rank]
	}
	p.rep.FlowLimit = curves.Flow(limit)
	for _, r := range rows {
		if r.drop < 0 && r.flow > limit {
			r.drop = AbsurdFlow
		}
	}
}

// dedupe sorts the good rows by time, drops later rows at an instant already
// taken, and notes the kept rows that came out of order.
func (p *reader) dedupe(rows []*row) []*row {
	var good []*row
	for _, r := range rows {
		if r.drop < 0 {
			good = append(good, r)
		}
	}
	sorted := slices.Clone(good)
	slices.SortStableFunc(sorted, func(a, b *row) int { return cmp.Compare(a.ns, b.ns) })
	kept := sorted[:0:0]
	for _, r := range sorted {
		if n := len(kept); n > 0 && kept[n-1].ns == r.ns {
			r.drop = Duplicate
			continue
		}
		kept = append(kept, r)
	}
	var latest int64
	seen := false
	for i, r := range good {
		if r.drop >= 0 {
			continue
		}
		if i > 0 && r.ns < latest {
			r.note(OutOfOrder)
		}
		if !seen || r.ns > latest {
			latest, seen = r.ns, true
		}
	}
	return kept
}

// tally fills the report's counts from the rows' reasons.
func (p *reader) tally(rows []*row) {
	var issues [numReasons]Issue
	add := func(reason Reason, line int) {
		is := &issues[reason]
		is.Reason = reason
		is.Count++
		if len(is.Lines) < MaxLines {
			is.Lines = append(is.Lines, line)
		}
	}
	for _, r := range rows {
		p.rep.Rows++
		if r.drop >= 0 {
			p.rep.Dropped++
			add(r.drop, r.lineNo())
			continue
		}
		p.rep.Kept++
		if r.hasDP {
			p.rep.WithDP++
		}
		if r.hasPow {
			p.rep.WithPower++
		}
		for n := Reason(0); n < numReasons; n++ {
			if r.notes&(1<<n) != 0 {
				add(n, r.lineNo())
			}
		}
	}
	for _, is := range issues {
		if is.Count > 0 {
			p.rep.Issues = append(p.rep.Issues, is)
		}
	}
}

func (p *reader) issue(reason Reason) Issue {
	for _, is := range p.rep.Issues {
		if is.Reason == reason {
			return is
		}
	}
	return Issue{Reason: reason}
}

// unusable builds the error for a file whose rows were all dropped.
func (p *reader) unusable(rows []*row) error {
	r0 := rows[0]
	if n := p.rep.Count(MixedDelimiter); 2*n >= p.rep.Rows {
		return p.errAt(r0.lineNo(), 0, "", fmt.Errorf("%w: the header splits on %s but %d of %d rows split on %s (%s)",
			ErrMixedDelims, delimName(p.delim), n, p.rep.Rows, delimName(p.alt), lineList(p.issue(MixedDelimiter))))
	}
	msg := p.rep.Summary()
	if i := slices.IndexFunc(rows, func(r *row) bool { return r.drop == BadTime }); i >= 0 {
		msg += fmt.Sprintf("; the first bad timestamp %s does not fit the layout %q", quoteCut(rows[i].cells[cellTime]), p.rep.Layout)
	}
	return p.errAt(r0.lineNo(), 0, "", fmt.Errorf("%w: %s", ErrNoUsableRows, msg))
}

func delimName(d byte) string {
	switch d {
	case '\t':
		return "tabs"
	case ',':
		return "commas"
	case ';':
		return "semicolons"
	case '|':
		return "bars"
	}
	return strconv.QuoteRune(rune(d))
}

// build turns the kept rows (in time order) into the Trend: the interval,
// each point's weight, the gaps and the coverage.
func (p *reader) build(kept []*row) (*Trend, error) {
	if err := p.checkSpan(kept); err != nil {
		return nil, err
	}
	iv := p.spec.Interval
	if iv == 0 {
		if len(kept) < 2 {
			msg := "only one usable row; give the trend's interval"
			if p.rep.Dropped > 0 {
				msg += " (" + p.rep.Summary() + ")"
			}
			return nil, p.errAt(kept[0].lineNo(), 0, "", fmt.Errorf("%w: %s", ErrInterval, msg))
		}
		steps := make([]time.Duration, len(kept)-1)
		for i := range steps {
			steps[i] = time.Duration(kept[i+1].ns - kept[i].ns)
		}
		slices.Sort(steps)
		iv = steps[len(steps)/2]
		if len(steps)%2 == 0 {
			iv = (steps[len(steps)/2-1] + steps[len(steps)/2]) / 2
		}
		regular := 0
		for _, s := range steps {
			if math.Abs(float64(s-iv)) <= 0.01*float64(iv) {
				regular++
			}
		}
		if 2*regular < len(steps) {
			p.warn(0, "logging steps are irregular: %s of %s equal the median step %s", numfmt.Int(regular), numfmt.Int(len(steps)), iv)
		}
	}
	if iv > maxInterval {
		return nil, p.errAt(kept[0].lineNo(), 0, "", fmt.Errorf("%w: the median step %s is longer than %d days", ErrInterval, iv, maxInterval/(24*time.Hour)))
	}
	tr := &Trend{Name: p.name, Spec: p.spec, Location: p.loc, Interval: iv, Points: make([]Point, len(kept))}
	ivh := iv.Hours()
	for i, r := range kept {
		pt := Point{Time: r.t().In(p.loc), Flow: curves.Flow(r.flow), Line: r.lineNo(), Hours: ivh,
			DP: curves.Head(r.dp), HasDP: r.hasDP, Power: curves.Power(r.power), HasPower: r.hasPow}
		if i+1 < len(kept) {
			step := time.Duration(kept[i+1].ns - r.ns)
			pt.Hours = min(step, iv).Hours()
			if step > iv+iv/2 {
				p.addGap(r.t().Add(iv).In(p.loc), kept[i+1].t().In(p.loc))
			}
		}
		tr.Hours += pt.Hours
		tr.Points[i] = pt
	}
	tr.Start = tr.Points[0].Time
	tr.End = kept[len(kept)-1].t().Add(iv).In(p.loc)
	tr.Span = tr.End.Sub(tr.Start).Hours()
	p.finalWarnings(tr)
	tr.Report = p.rep
	tr.Warnings = p.warnings
	return tr, nil
}

// checkSpan refuses a log with a hole of more than maxStampGap between two
// stamps, pointing at the rows on the smaller side of the largest hole.
func (p *reader) checkSpan(kept []*row) error {
	gi := -1
	var gap time.Duration
	for i := 1; i < len(kept); i++ {
		if d := time.Duration(kept[i].ns - kept[i-1].ns); d > gap {
			gi, gap = i, d
		}
	}
	if gap <= maxStampGap {
		return nil
	}
	before, after := kept[:gi], kept[gi:]
	stray, rest := before, after
	if len(after) < len(before) {
		stray, rest = after, before
	}
	lines := make([]int, 0, min(len(stray), MaxLines))
	for _, r := range stray[:min(len(stray), MaxLines)] {
		lines = append(lines, r.lineNo())
	}
	slices.Sort(lines)
	day := "2006-01-02 15:04"
	return p.errAt(lines[0], 0, p.spec.TimeColumn, fmt.Errorf("%w: %s (%s) %s %.1f years from the rest of the log, which runs %s to %s; a trend is one continuous record: correct or remove %s",
		ErrStrayStamp, plural(len(stray), "stamp", "stamps"), lineWords(lines, len(stray)),
		map[bool]string{true: "lies", false: "lie"}[len(stray) == 1], gap.Hours()/(24*365.25),
		rest[0].t().In(p.loc).Format(day), rest[len(rest)-1].t().In(p.loc).Format(day), map[bool]string{true: "it", false: "them"}[len(stray) == 1]))
}

func plural(n int, one, many string) string {
	if n == 1 {
		return "1 " + one
	}
	return numfmt.Int(n) + " " + many
}

// lineWords writes "line 7" or "lines 7, 9 …".
func lineWords(lines []int, n int) string {
	q := make([]string, len(lines))
	for i, l := range lines {
		q[i] = strconv.Itoa(l)
	}
	s := "line " + q[0]
	if len(q) > 1 {
		s = "lines " + strings.Join(q, ", ")
	}
	if n > len(lines) {
		s += " …"
	}
	return s
}

func (p *reader) addGap(from, to time.Time) {
	g := Gap{From: from, To: to, Missing: to.Sub(from)}
	p.rep.Gaps++
	p.rep.MissingHours += g.Missing.Hours()
	p.rep.LongestGap = max(p.rep.LongestGap, g.Missing)
	if len(p.rep.FirstGaps) < MaxGaps {
		p.rep.FirstGaps = append(p.rep.FirstGaps, g)
	}
}

func (p *reader) finalWarnings(tr *Trend) {
	if p.rep.Dropped > 0 {
		p.warn(0, "%s of %s rows dropped: %s", numfmt.Int(p.rep.Dropped), numfmt.Int(p.rep.Rows), p.rep.Summary())
	}
	if n := p.rep.Count(Duplicate); n > 0 && p.spec.TimeZone == "" && !p.zoned {
		p.warn(p.rep.LinesOf(Duplicate)[0], "%d duplicate stamps: if the log is local time with daylight saving, give the trend's time zone", n)
	}
	if c := tr.Coverage(); c < 0.9 {
		p.warn(0, "rows cover %.1f %% of the span (%.1f of %.1f h)", 100*c, tr.Hours, tr.Span)
	}
}

func quoteCut(s string) string {
	const n = 40
	if r := []rune(s); len(r) > n {
		s = string(r[:n]) + "…"
	}
	return strconv.Quote(s)
}

func quoteList(f []string) string {
	const n = 12
	q := make([]string, 0, min(len(f), n))
	for i, s := range f {
		if i == n {
			q = append(q, fmt.Sprintf("… %d more", len(f)-n))
			break
		}
		q = append(q, quoteCut(s))
	}
	return strings.Join(q, ", ")
}
