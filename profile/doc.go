// Package profile reads the load a pump group serves: a trend log of plant
// flow (and optionally differential pressure and measured pump power) in
// CSV, checked row by row, and bins it by flow.
//
// # The trend file
//
// A trend log is a CSV export from a building automation system or a
// logger:
//
//	timestamp,plant_flow_gpm,loop_dp_psi,pump_kw
//	2025-07-01 14:00,2310.4,12.1,41.7
//	2025-07-01 15:00,2288.0,12.0,
//
// A [TrendSpec] names the columns and their units. The header is the first
// line (of the first 50 non-blank ones) that names the flow column; lines
// before it are skipped and counted. The delimiter is the one of comma,
// semicolon, tab or bar that splits the header into the most fields; with a
// A UTF-8 byte-order mark is skipped, UTF-16 with a byte-order mark is
// decoded, other invalid UTF-8 is read as Latin-1, and binary files (NUL or
// control bytes, ZIP/xlsx, old Excel, gzip, PDF) are refused, as is a plant
// file given where a trend belongs. Only regular files are read (a named
// pipe or a device is refused before it is opened), of at most [MaxBytes]
// bytes and [MaxRows] data lines.
//
// # Numbers
//
// Each numeric column's format is decided from all its cells: a cell with
// both separators ("1.700,0", "1,700.0") shows that the last is the
// decimal one, a separator used twice groups thousands, and one followed by
// other than three digits is decimal. A cell against the column's format
// is not a number (its row is counted). When no cell tells ("1.700" alone)
// a point is decimal and a comma groups thousands in a comma-delimited file
// (spreadsheets quote "1,234") or is decimal otherwise, with a warning.
// Leading zeros ("0600") are decimal, with a warning, never octal.
//
// Timestamps follow the spec's Go layout, or else the common layout that
// parses the most of the file's stamps (RFC 3339, ISO 8601 with a space or
// T, year/month/day, US month/day/year with 24-hour or AM/PM clock,
// day/month/year, day.month.year, 2-Jan-2006, or dates alone; ISO stamps
// with an offset may leave out the seconds). Stamps that are all numbers
// are read by their size, with a warning saying how: seconds (10⁸–10¹¹) or
// milliseconds (10¹¹–10¹⁴) since 1970 UTC, or spreadsheet serial dates
// (20000–110000 days since 1899-12-30, wall-clock time); the TimeFormats
// "unix", "unix_ms" and "excel" say so explicitly. When
// month/day and day/month fit the file equally, month/day is taken and a
// warning says so. Stamps before 1970 or after 2199 are bad timestamps,
// and a log with more than a year between two stamps (one stray row a
// century away) is refused, naming the rows. The TimeZone "Local" is
// refused: results would depend on the machine.
//
// # Against the plant
//
// [Trend.Plausible] checks the flows against what the plant says: every
// flow zero, or a median many times the pumps' capacity or a tiny fraction
// of the design flow, is refused (naming a unit the numbers would fit);
// a low median, top flows above capacity, flows all below the plant
// minimum flow and a log mostly at zero flow are warned of.
//
// # Messy rows
//
// Nothing is dropped silently. Each data row is kept or dropped, and the
// [Report] counts the rows by [Reason] with their first line numbers:
// too few or too many fields, another delimiter than the header's, blank or
// unparseable timestamps, local times skipped by daylight saving, blank,
// non-numeric or negative flows, absurd flows (above the spec's MaxFlow or,
// by default, 3 × the 99th percentile of the positive flows), and duplicate
// stamps (the first in the file is kept). Rows out of time order are sorted
// into place and counted. Blank lines are skipped and counted; they are not
// rows. An empty DP or power cell is normal (the point just has none); a
// non-numeric or negative one is ignored and counted, and the row is kept.
//
// A file that is unusable as a whole (empty, binary, no header, a mapped
// column missing or named twice, no rows, no usable rows, mixed delimiters
// throughout, no timestamp in a known format) gives a [*ParseError] with the
// file, line and byte column and the column's header, wrapping one of the
// Err… classes.
//
// # Time zones and daylight saving
//
// A stamp with a UTC offset is an exact instant. A stamp without one is
// wall-clock time in the spec's TimeZone (an IANA name such as
// "America/Chicago"):
//
//   - in the spring-forward change the skipped local hour does not exist:
//     such a stamp is dropped as MissingLocal, and the day simply has 23
//     hours (no gap);
//   - in the fall-back change the repeated local hour occurs twice: the
//     first row with that stamp is the earlier instant (daylight time), the
//     second the later (standard time), counted as RepeatedHour; a third is
//     a duplicate.
//
// With no TimeZone, stamps without an offset are read as UTC wall clock:
// no daylight saving, so a repeated hour shows as a duplicate (dropped) and
// a skipped one as a one-hour gap, and a warning suggests giving the zone.
// Points keep the trend's zone, so time-of-use pricing sees local hours.
//
// # Weights, gaps and coverage
//
// The logging interval is the spec's or the median step between stamps.
// A point stands for the interval starting at its stamp: its weight is the
// smaller of the interval and the step to the next point. A step longer
// than 1.5 intervals is a gap. Coverage is the hours the points represent
// over the span from the first stamp to the end of the last interval.
//
// # Binning
//
// [Bin] groups points into flow bins of a chosen width with hours, counts,
// mean DP and mean measured power; zero-flow points (plant off) get a bin of
// their own. Evaluating the plant at each bin's centre instead of at each
// point's flow makes a binning error: [Binned].CubeError estimates it for a
// cube-law power, and [Binned.Compare] gives it exactly for any power
// function, so a point-by-point annual total and a binned one can be set
// side by side.
package profile
