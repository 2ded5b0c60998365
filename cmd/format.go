package cmd

import (
	"encoding/json"
	"fmt"
	"io"
	"strings"
	"text/tabwriter"
	"unicode/utf8"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/study"
)

// table writes aligned columns: the first column (names) left-aligned, the
// rest (numbers) right-aligned. The first row is the header: unless the
// output asked for wide tables (--wide), each header cell is wrapped onto
// as many lines as it takes to be no wider than its column's widest value
// (or its own longest word), the unit in parentheses kept whole, so that
// the tables fit 120 columns.
type table struct {
	out  io.Writer
	rows [][]string
	wide bool // one-line headers, as wide as they need
}

func newTable(out io.Writer) *table {
	w, ok := out.(wideWriter)
	return &table{out: out, wide: ok && w.wide}
}

// wideWriter marks the output of a run with --wide.
type wideWriter struct {
	io.Writer
	wide bool
}

func (t *table) row(cells ...string) { t.rows = append(t.rows, cells) }

func (t *table) flush() {
	rows := t.rows
	if !t.wide && len(rows) > 1 {
		rows = append(wrapHeader(rows[0], rows[1:]), rows[1:]...)
	}
	w := 0
	for _, r := range rows {
		if len(r) > 0 {
			w = max(w, utf8.RuneCountInString(r[0]))
		}
	}
	tw := tabwriter.NewWriter(t.out, 0, 0, 2, ' ', tabwriter.AlignRight)
	for _, r := range rows {
		cells := append([]string(nil), r...)
		if len(cells) > 0 {
			cells[0] = cells[0] + strings.Repeat(" ", w-utf8.RuneCountInString(cells[0]))
		}
		fmt.Fprintln(tw, strings.Join(cells, "\t")+"\t")
	}
	tw.Flush()
	t.rows = nil
}

// wrapHeader wraps each header cell to the width of its column's widest
// value, at least its longest word ("(unit)" counts as one word), and
// returns the header as lines aligned at the bottom.
func wrapHeader(head []string, body [][]string) [][]string {
	cols := make([][]string, len(head))
	n := 1
	for c, h := range head {
		width := 0
		for _, r := range body {
			if c < len(r) {
				width = max(width, utf8.RuneCountInString(r[c]))
			}
		}
		words := headerWords(h)
		for _, wd := range words {
			width = max(width, utf8.RuneCountInString(wd))
		}
		var lines []string
		for _, wd := range words {
			if k := len(lines) - 1; k >= 0 && utf8.RuneCountInString(lines[k])+1+utf8.RuneCountInString(wd) <= width {
				lines[k] += " " + wd
				continue
			}
			lines = append(lines, wd)
		}
		if len(lines) == 0 {
			lines = []string{""}
		}
		cols[c] = lines
		n = max(n, len(lines))
	}
	out := make([][]string, n)
	for i := range out {
		out[i] = make([]string, len(head))
		for c, lines := range cols {
			if k := i - (n - len(lines)); k >= 0 {
				out[i][c] = lines[k]
			}
		}
	}
	return out
}

// headerWords splits a header into words, keeping a parenthesised unit
// such as "(t CO₂e/yr)" whole; leading spaces stay on the first word.
func headerWords(h string) []string {
	lead := h[:len(h)-len(strings.TrimLeft(h, " "))]
	var words []string
	for _, f := range strings.Fields(h) {
		if k := len(words) - 1; k >= 0 && strings.HasPrefix(words[k], "(") && !strings.HasSuffix(words[k], ")") {
			words[k] += " " + f
			continue
		}
		words = append(words, f)
	}
	if len(words) > 0 {
		words[0] = lead + words[0]
	}
	return words
}

// writeSetpointTables lays out the staging table's cells (stages, then
// changes) with the table helper, so they fit 120 columns like the rest.
func writeSetpointTables(out io.Writer, sp *optimize.Setpoints) {
	stages, changes := sp.TextTables()
	for i, rows := range [][][]string{stages, changes} {
		if i > 0 {
			fmt.Fprintln(out)
		}
		t := newTable(out)
		for _, r := range rows {
			t.row(r...)
		}
		t.flush()
	}
}

// heading writes a section title underlined.
func heading(out io.Writer, title string) {
	fmt.Fprintf(out, "\n%s\n%s\n", title, strings.Repeat("─", len([]rune(title))))
}

func pct(v float64) string { return fmt.Sprintf("%.1f", 100*v) }

func kw(p curves.Power) string { return study.GroupedDec(float64(p)/curves.KW, 2) }

func num(v float64, prec int) string { return fmt.Sprintf("%.*f", prec, v) }

// flowOut writes a flow in display units without the unit.
func flowOut(u curves.UnitSystem, q curves.Flow) string {
	return study.GroupedDec(u.FlowOut(q), 1)
}

func headOut(u curves.UnitSystem, h curves.Head) string {
	return study.GroupedDec(u.HeadOut(h), 1)
}

// writeJSON writes v as indented JSON.
func writeJSON(out io.Writer, v any) error {
	enc := json.NewEncoder(out)
	enc.SetIndent("", "  ")
	return enc.Encode(v)
}

// writeCautions prints the study's one copy of the cautions wherever
// results could be acted on, each wrapped to 90 columns.
func writeCautions(out io.Writer) {
	heading(out, "Cautions")
	for _, c := range study.Cautions {
		fmt.Fprintln(out, wrapText(c, 90, "- ", "  "))
	}
}

// wrapText wraps s at width columns, the first line after first, the rest
// after rest.
func wrapText(s string, width int, first, rest string) string {
	var b strings.Builder
	line := first
	for _, w := range strings.Fields(s) {
		if utf8.RuneCountInString(line)+1+utf8.RuneCountInString(w) > width && strings.TrimSpace(line) != "" && line != first {
			b.WriteString(strings.TrimRight(line, " ") + "\n")
			line = rest
		}
		if line != first && line != rest {
			line += " "
		}
		line += w
	}
	b.WriteString(line)
	return b.String()
}
