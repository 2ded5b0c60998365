package cmd

import (
	"encoding/json"
	"fmt"
	"io"
	"strings"
	"text/tabwriter"

	"wattstage/curves"
)

// table writes aligned columns; numbers are right-aligned by padding.
type table struct {
	w *tabwriter.Writer
}

func newTable(out io.Writer) *table {
	return &table{w: tabwriter.NewWriter(out, 0, 0, 2, ' ', tabwriter.AlignRight)}
}

func (t *table) row(cells ...string) {
	fmt.Fprintln(t.w, strings.Join(cells, "\t")+"\t")
}

func (t *table) flush() { t.w.Flush() }

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
