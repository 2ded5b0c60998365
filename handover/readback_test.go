package handover_test

import (
	"bytes"
	"fmt"
	"strconv"
	"strings"
	"testing"

	"github.com/xuri/excelize/v2"

	"wattstage/handover"
	"wattstage/optimize"
	"wattstage/study"
	"wattstage/workbook"
)

// Rendering the workbook solves nothing: handover.Build and the writer
// only lay out the study's result (the "no solver call").
func TestWorkbookSolvesNothing(t *testing.T) {
	for _, name := range exampleFiles {
		ex := loadExample(t, name)
		before := optimize.Solves()
		r, err := handover.Build(ex.result)
		if err != nil {
			t.Fatal(err)
		}
		if _, err := workbook.Bytes(r); err != nil {
			t.Fatal(err)
		}
		if n := optimize.Solves() - before; n != 0 {
			t.Errorf("%s: building and writing the workbook solved %d points", name, n)
		}
	}
	// The counter does count: one study of the bin example solves points.
	before := optimize.Solves()
	if _, err := buildExample("chilled-water.yaml"); err != nil {
		t.Fatal(err)
	}
	if optimize.Solves() == before {
		t.Error("a study solved no point: the counter counts nothing")
	}
}

// sheetReader reads cells back from a written workbook: cached values of
// formulas included, unformatted.
type sheetReader struct {
	t *testing.T
	f *excelize.File
}

func readBack(t *testing.T, r *workbook.Report) *sheetReader {
	t.Helper()
	data, err := workbook.Bytes(r)
	if err != nil {
		t.Fatal(err)
	}
	f, err := excelize.OpenReader(bytes.NewReader(data))
	if err != nil {
		t.Fatal(err)
	}
	t.Cleanup(func() { f.Close() })
	return &sheetReader{t: t, f: f}
}

func (s *sheetReader) rows(sheet string) [][]string {
	s.t.Helper()
	rows, err := s.f.GetRows(sheet, excelize.Options{RawCellValue: true})
	if err != nil {
		s.t.Fatal(err)
	}
	return rows
}

// row returns the cells after the label of the first row whose first cell
// is label.
func (s *sheetReader) row(sheet, label string) []string {
	s.t.Helper()
	for _, r := range s.rows(sheet) {
		if len(r) > 0 && r[0] == label {
			return r[1:]
		}
	}
	s.t.Fatalf("%s: no row %q", sheet, label)
	return nil
}

func (s *sheetReader) number(where, cell string) float64 {
	s.t.Helper()
	v, err := strconv.ParseFloat(strings.TrimSpace(cell), 64)
	if err != nil {
		s.t.Fatalf("%s: %q is not a number", where, cell)
	}
	return v
}

// Every number the workbook shows for a strategy, read back from the
// written file, is the study's: the annual energy, peak, costs and
// investment on the Economics and Summary sheets, the savings range, and
// every load point's hours, energy and cost a year.
func TestWorkbookShowsTheResult(t *testing.T) {
	for _, name := range exampleFiles {
		t.Run(name, func(t *testing.T) {
			ex := loadExample(t, name)
			res := ex.result
			rb := readBack(t, ex.report)
			cur := res.Currency()
			for _, sheet := range []string{"Economics", "Summary"} {
				checks := []struct {
					label string
					want  func(s study.Strategy) float64
				}{
					{"Annual energy (kWh/yr)", func(s study.Strategy) float64 { return s.Annual.Energy }},
					{"Peak demand (kW)", func(s study.Strategy) float64 { return s.Energy.PeakKW }},
					{"Annual cost (" + cur + "/yr)", func(s study.Strategy) float64 { return s.Annual.Total }},
					{"Investment (" + cur + ")", func(s study.Strategy) float64 {
						if s.Appraisal == nil {
							return 0
						}
						return s.Appraisal.Investment
					}},
					{"Energy saved vs baseline (kWh/yr)", func(s study.Strategy) float64 {
						if s.Savings == nil {
							return 0
						}
						return s.Savings.Energy
					}},
					{"Cost saved vs baseline (" + cur + "/yr)", func(s study.Strategy) float64 {
						if s.Savings == nil {
							return 0
						}
						return s.Savings.Cost
					}},
				}
				if sheet == "Economics" {
					checks = append(checks, []struct {
						label string
						want  func(s study.Strategy) float64
					}{
						{"Energy cost (" + cur + "/yr)", func(s study.Strategy) float64 { return s.Annual.EnergyCost }},
						{"Demand cost (" + cur + "/yr)", func(s study.Strategy) float64 { return s.Annual.DemandCost }},
						{"Billed demand (kW·month/yr)", func(s study.Strategy) float64 { return s.Annual.BilledDemand }},
					}...)
				}
				for _, c := range checks {
					cells := rb.row(sheet, c.label)
					for i, s := range res.Strategies {
						where := fmt.Sprintf("%s, %s, %s", sheet, c.label, s.Name)
						if got, want := rb.number(where, cells[i]), c.want(s); !near(got, want, 1e-9) {
							t.Errorf("%s: %v in the file, %v in the study", where, got, want)
						}
					}
				}
			}
			lo := res.Strategy(study.KeyLowest)
			for label, want := range map[string]float64{
				"Savings, expected (as given)":                       lo.Savings.Energy,
				"Savings range, low end (" + res.Range.LowBy + ")":   res.Range.Low,
				"Savings range, high end (" + res.Range.HighBy + ")": res.Range.High,
			} {
				if got := rb.number(label, rb.row("Summary", label)[0]); !near(got, want, 1e-9) {
					t.Errorf("Summary %s: %v, the study %v", label, got, want)
				}
			}
			checkLoadPointsSheet(t, rb, res)
		})
	}
}

// checkLoadPointsSheet reads the Load points sheet's rows back: strategy,
// hours, mean kW, kWh and cost of each, in the study's order, a year.
func checkLoadPointsSheet(t *testing.T, rb *sheetReader, res *study.Result) {
	t.Helper()
	rows := rb.rows("Load points")
	const header = 3 // the sheet's header row (workbook's lpHeader)
	k := header      // rows[k] is the sheet's row k+1
	f := res.Period.Factor
	for _, s := range res.Strategies {
		for _, lp := range s.LoadPoints {
			if k >= len(rows) {
				t.Fatalf("Load points: the sheet ends before %s's points", s.Name)
			}
			r := rows[k]
			k++
			where := fmt.Sprintf("Load points row %d (%s, %s)", k, s.Name, r[0])
			if r[1] != s.Name {
				t.Errorf("%s: strategy %q", where, r[1])
				continue
			}
			for _, c := range []struct {
				what string
				col  int // 1-based column
				want float64
			}{
				{"hours", 6, lp.Hours * f},
				{"kW", 9, lp.KW},
				{"kWh", 10, lp.KWh * f},
				{"cost", 11, lp.Cost * f},
			} {
				if got := rb.number(where, r[c.col-1]); !near(got, c.want, 1e-9) {
					t.Errorf("%s: %s %v in the file, %v in the study", where, c.what, got, c.want)
				}
			}
		}
	}
}

// The workbook's Staging sheet states the same staging signal as the
// sequence, and its stage-up flows are the sequence's (at its resolution).
func TestStagingSheetSignal(t *testing.T) {
	for _, name := range exampleFiles {
		ex := loadExample(t, name)
		sp := ex.result.Setpoints
		word := sp.Signal.String()
		if ex.report.Staging.Signal != word {
			t.Errorf("%s: Staging sheet signal %q, sequence %q", name, ex.report.Staging.Signal, word)
		}
		rb := readBack(t, ex.report)
		rows := rb.rows("Staging")
		if len(rows) < 3 || !strings.Contains(strings.Join(rows[2], " "), "Staging signal: "+word+".") {
			t.Errorf("%s: Staging sheet's third row %v lacks the signal %q", name, rows[2], word)
		}
		for i, tr := range sp.Transitions {
			if sp.Signal == optimize.SpeedBasis {
				break
			}
			if got, want := ex.report.Staging.Rows[i].UpFlow, sp.FlowSetpoint(tr.Up.Flow); got != want {
				t.Errorf("%s: stage-up flow %v on the sheet, %v in the sequence", name, got, want)
			}
		}
	}
}

// The workbook names the program's version and the inputs' SHA-256 on the
// Inputs sheet, as the JSON does, so a reader can tell which files made it.
func TestWorkbookNamesVersionAndInputs(t *testing.T) {
	ex := loadExample(t, "chilled-water.yaml")
	if ex.result.InputsSHA256 == "" || ex.report.InputsSHA256 != ex.result.InputsSHA256 {
		t.Fatalf("inputs hash %q in the report, %q in the study", ex.report.InputsSHA256, ex.result.InputsSHA256)
	}
	rows := readBack(t, ex.report).rows("Inputs")
	if len(rows) < 3 || !strings.Contains(strings.Join(rows[2], " "), ex.result.InputsSHA256) || !strings.Contains(strings.Join(rows[2], " "), "wattstage") {
		t.Errorf("Inputs row 3 %v lacks the version and the inputs hash %s", rows[2], ex.result.InputsSHA256)
	}
}
