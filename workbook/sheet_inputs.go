package workbook

import (
	"fmt"
	"math"
	"strings"
)

const sheetInputs = "Inputs"

// inputsSheet shows the inputs as the tool understood them: pump models
// with their fits and residuals, motors, drives, system, fluid and tariff.
func (b *book) inputsSheet() {
	s := b.newSheet(sheetInputs, false)
	r := b.r
	u := r.Units
	s.text(1, 1, "Inputs as understood: "+r.Plant, "title")
	s.text(1, 2, "Every number the results rest on, with its unit and source; defaults are marked.", "subtitle")
	made := "Written by wattstage " + b.version()
	if r.InputsSHA256 != "" {
		made += "; SHA-256 of the input files " + r.InputsSHA256
	}
	s.text(1, 3, made, "italic")
	row := 5

	s.text(1, row, "Pump models", "h2")
	row++
	if len(r.Pumps) == 0 {
		s.text(1, row, "None given.", "italic")
		row++
	} else {
		s.header(row, 1, "Model", "Units", "Rated speed ("+b.speedUnit()+")",
			"BEP flow ("+u.Flow+")", "BEP head ("+u.Head+")", "BEP efficiency (%)",
			"Minimum flow ("+u.Flow+")", "Runout flow ("+u.Flow+")",
			"Head fit RMS residual ("+u.Head+")", "Efficiency fit RMS residual (% points)", "Curve source")
		for _, p := range r.Pumps {
			row++
			s.text(1, row, p.Name, "bold")
			s.text(2, row, p.Units, "text")
			s.number(3, row, p.RatedSpeed, "int")
			s.number(4, row, p.BEPFlow, "d1")
			s.number(5, row, p.BEPHead, "d1")
			s.number(6, row, p.BEPEff, "d1")
			s.number(7, row, zeroAsGap(p.MinFlow), "d1")
			s.number(8, row, zeroAsGap(p.MaxFlow), "d1")
			s.number(9, row, p.HeadRMS, "d3")
			s.number(10, row, p.EffRMS, "d3")
			s.wrapped(11, row, p.Source, "wrap")
		}
		row++
	}
	row++

	if len(r.Pumps) > 0 {
		s.text(1, row, "Fitted curve coefficients (rated speed)", "h2")
		row++
		terms := 3
		for _, p := range r.Pumps {
			terms = max(terms, len(p.HeadFit), len(p.EffFit))
		}
		labels := []string{"Model", "Curve"}
		for k := 0; k < terms; k++ {
			labels = append(labels, fmt.Sprintf("a%d", k))
		}
		s.header(row, 1, labels...)
		for _, p := range r.Pumps {
			for _, fit := range []struct {
				name, unit string
				c          []float64
			}{{"Head (" + u.Head + ")", u.Head, p.HeadFit}, {"Efficiency (%)", "%", p.EffFit}} {
				if len(fit.c) == 0 {
					continue
				}
				row++
				s.text(1, row, p.Name, "bold")
				s.text(2, row, fit.name, "text")
				for k, c := range fit.c {
					s.number(3+k, row, c, "sci")
				}
			}
		}
		row++
		s.merged(row, 1, 2+terms, "Head: "+polyForm(terms, u.Head, u.Flow)+". Efficiency: the same form, y in %.", "note_wrap")
		row += 2

		s.text(1, row, "Datasheet points beside the fitted curves", "h2")
		row++
		s.header(row, 1, "Model", "Flow ("+u.Flow+")", "Head, datasheet ("+u.Head+")", "Head, fitted ("+u.Head+")",
			"Head residual, fitted − datasheet ("+u.Head+")", "Efficiency, datasheet (%)", "Efficiency, fitted (%)",
			"Efficiency residual (% points)")
		for _, p := range r.Pumps {
			for _, pt := range p.Points {
				row++
				s.text(1, row, p.Name, "text")
				s.number(2, row, pt.Flow, "d1")
				s.number(3, row, pt.Head, "d2")
				s.number(4, row, pt.HeadFit, "d2")
				s.formula(5, row, fmt.Sprintf("%s-%s", cellName(4, row), cellName(3, row)), num(pt.HeadFit-pt.Head), "d3")
				s.number(6, row, pt.Eff, "d1")
				s.number(7, row, pt.EffFit, "d1")
				if finite(pt.Eff) && finite(pt.EffFit) {
					s.formula(8, row, fmt.Sprintf("%s-%s", cellName(7, row), cellName(6, row)), num(pt.EffFit-pt.Eff), "d3")
				}
			}
		}
		row += 2
	}

	// The motors, drives, system, fluid and tariff begin a page of their
	// own: the pump curves fill the first, and a section title must not
	// be left at the foot of a page without its rows.
	if len(r.Pumps) > 0 {
		b.fail(b.f.InsertPageBreak(s.name, cellName(1, row)))
	}
	s.text(1, row, "Motors", "h2")
	row++
	if len(r.Motors) == 0 {
		s.text(1, row, "None given.", "italic")
		row++
	} else {
		s.header(row, 1, "Unit", "Rated output ("+u.MotorPower+")", "Full-load efficiency (%)", "Service factor (–)", "Part-load model", "Source", "Default?")
		for _, m := range r.Motors {
			row++
			s.text(1, row, m.Unit, "bold")
			s.number(2, row, m.Rated, "d1")
			s.number(3, row, m.FullLoadEff, "d1")
			s.number(4, row, zeroAsGap(m.ServiceFactor), "d2")
			s.wrapped(5, row, m.PartLoad, "wrap")
			s.wrapped(6, row, m.Source, "wrap")
			if m.Default {
				s.text(7, row, "default", "bold")
			}
		}
		row++
	}
	row++

	s.text(1, row, "Drives", "h2")
	row++
	if len(r.Drives) == 0 {
		s.text(1, row, "None given.", "italic")
		row++
	} else {
		s.header(row, 1, "Unit", "Drive", "Minimum speed (%)", "Maximum speed (%)", "Loss model", "Default?")
		for _, d := range r.Drives {
			row++
			s.text(1, row, d.Unit, "bold")
			s.wrapped(2, row, d.Kind, "wrap")
			s.number(3, row, zeroAsGap(d.MinSpeed), "d1")
			s.number(4, row, zeroAsGap(d.MaxSpeed), "d1")
			s.wrapped(5, row, d.LossModel, "wrap")
			if d.Default {
				s.text(6, row, "default", "bold")
			}
		}
		row++
	}
	row++

	s.text(1, row, "System served", "h2")
	row = b.quantities(s, row+1, r.System, true) + 1
	s.text(1, row, "Fluid", "h2")
	row = b.quantities(s, row+1, r.Fluid, true) + 1

	s.text(1, row, "Tariff", "h2")
	row++
	if r.Tariff.Description != "" {
		s.text(1, row, r.Tariff.Description, "text")
		row++
	}
	row = b.quantities(s, row, r.Tariff.Items, true)
	if len(r.Tariff.Periods) > 0 {
		row++
		s.header(row, 1, "Time-of-use period", "Price ("+b.currency()+"/kWh)", "Hours")
		for _, p := range r.Tariff.Periods {
			row++
			s.text(1, row, p.Name, "text")
			s.number(2, row, p.Price, "d4")
			s.text(3, row, p.Hours, "text")
		}
		row++
	}
	s.fixed[1] = 26
	for c := 2; c <= 11; c++ {
		s.fixed[c] = 14
	}
	s.fixed[5], s.fixed[6], s.fixed[11] = 20, 20, 24
	b.freeze(s, 1, 3)
	b.pageSetup(s, true, 11, row)
	s.finish()
}

func (b *book) speedUnit() string {
	if b.r.Units.Speed != "" {
		return b.r.Units.Speed
	}
	return "rpm"
}

// polyForm writes the polynomial a fit's coefficients belong to, with the
// unit of each coefficient, e.g. "ft = a0 + a1·Q + a2·Q²; a1 in ft/gpm…".
func polyForm(terms int, yUnit, xUnit string) string {
	var t []string
	for k := 0; k < terms; k++ {
		switch k {
		case 0:
			t = append(t, "a0")
		case 1:
			t = append(t, "a1·Q")
		default:
			t = append(t, fmt.Sprintf("a%d·Q%s", k, superscript(k)))
		}
	}
	form := "y = " + strings.Join(t, " + ") + "; y in " + yUnit + ", Q in " + xUnit
	return form
}

func superscript(k int) string {
	const digits = "⁰¹²³⁴⁵⁶⁷⁸⁹"
	r := []rune(digits)
	if k >= 0 && k < 10 {
		return string(r[k])
	}
	return fmt.Sprintf("^%d", k)
}

func zeroAsGap(v float64) float64 {
	if v == 0 {
		return math.NaN()
	}
	return v
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }
