package cmd

import (
	"encoding/json"
	"fmt"
	"io"
	"strings"
	"text/tabwriter"
	"unicode/utf8"

	"wattstage/curves"
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

// cautions are printed wherever results could be acted on (DOMAIN §9).
var cautions = []string{
	"Results are planning estimates from datasheet curves and default motor/drive losses.",
	"Confirm minimum flow, minimum speed, NPSH (cavitation), motor cooling at low speed and",
	"resonance with the pump, motor and drive manufacturers, and the chiller/boiler minimum",
	"flow with its manufacturer, before changing a sequence. Sequences and retrofits are the",
	"responsibility of a licensed engineer under local codes.",
}

func writeCautions(out io.Writer) {
	heading(out, "Cautions")
	for _, c := range cautions {
		fmt.Fprintln(out, c)
	}
}
