package cmd

import (
	"encoding/json"
	"fmt"
	"io"
	"strings"
	"text/tabwriter"
	"unicode/utf8"

	"wattstage/curves"
	"wattstage/study"
)

// table writes aligned columns: the first column (names) left-aligned, the
// rest (numbers) right-aligned.
type table struct {
	out  io.Writer
	rows [][]string
}

func newTable(out io.Writer) *table { return &table{out: out} }

func (t *table) row(cells ...string) { t.rows = append(t.rows, cells) }

func (t *table) flush() {
	w := 0
	for _, r := range t.rows {
		if len(r) > 0 {
			w = max(w, utf8.RuneCountInString(r[0]))
		}
	}
	tw := tabwriter.NewWriter(t.out, 0, 0, 2, ' ', tabwriter.AlignRight)
	for _, r := range t.rows {
		cells := append([]string(nil), r...)
		if len(cells) > 0 {
			cells[0] = cells[0] + strings.Repeat(" ", w-utf8.RuneCountInString(cells[0]))
		}
		fmt.Fprintln(tw, strings.Join(cells, "\t")+"\t")
	}
	tw.Flush()
	t.rows = nil
}

// heading writes a section title underlined.
func heading(out io.Writer, title string) {
	fmt.Fprintf(out, "\n%s\n%s\n", title, strings.Repeat("─", len([]rune(title))))
}

func pct(v float64) string { return fmt.Sprintf("%.1f", 100*v) }

func kw(p curves.Power) string { return fmt.Sprintf("%.2f", float64(p)/curves.KW) }

func num(v float64, prec int) string { return fmt.Sprintf("%.*f", prec, v) }

// flowOut writes a flow in display units without the unit.
func flowOut(u curves.UnitSystem, q curves.Flow) string {
	return fmt.Sprintf("%.1f", u.FlowOut(q))
}

func headOut(u curves.UnitSystem, h curves.Head) string {
	return fmt.Sprintf("%.1f", u.HeadOut(h))
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
