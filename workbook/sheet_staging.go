package workbook

import "fmt"

const sheetStaging = "Staging"

const stagingHeader = 4

func (b *book) stagingSheet() {
	s := b.newSheet(sheetStaging, false)
	r := b.r
	u := r.Units
	st := r.Staging
	s.text(1, 1, "Staging setpoints: "+r.Plant, "title")
	s.text(1, 2, "Adjustable starting values for the controls contractor.", "subtitle")
	if st.Signal != "" {
		s.merged(3, 1, 11, "Staging signal: "+st.Signal+". "+st.SignalRule, "wrap")
	}
	s.header(stagingHeader, 1, "From (units running)", "To (units running)", "Units added",
		"Stage up: speed above (%)", "Stage up: flow above ("+u.Flow+")", "Stage up delay (min)",
		"Stage down: speed below (%)", "Stage down: flow below ("+u.Flow+")", "Stage down delay (min)",
		"Band between stage-up and stage-down flow (%)", "Note")
	row := stagingHeader
	if len(st.Rows) == 0 {
		row++
		s.text(1, row, "None given.", "italic")
	}
	for _, sr := range st.Rows {
		row++
		s.number(1, row, float64(sr.From), "int")
		s.number(2, row, float64(sr.To), "int")
		s.text(3, row, sr.Units, "text")
		s.number(4, row, zeroAsGap(sr.UpSpeed), "d1")
		s.number(5, row, zeroAsGap(sr.UpFlow), "d1")
		s.number(6, row, sr.UpDelay, "gen")
		s.number(7, row, zeroAsGap(sr.DownSpeed), "d1")
		s.number(8, row, zeroAsGap(sr.DownFlow), "d1")
		s.number(9, row, sr.DownDelay, "gen")
		if sr.UpFlow > 0 && sr.DownFlow > 0 {
			// The band a reviewer checks: stage-down flow must sit well below
			// stage-up flow or the group hunts between counts.
			s.formula(10, row, fmt.Sprintf("(%s-%s)/%s", cellName(5, row), cellName(8, row), cellName(5, row)),
				num((sr.UpFlow-sr.DownFlow)/sr.UpFlow), "pct")
		}
		s.wrapped(11, row, sr.Note, "wrap")
	}
	last := 11
	row += 2
	s.text(1, row, "Settings the values were derived with", "h2")
	row++
	s.merged(row, 1, last, "A record of what was used, not inputs: these cells drive nothing. To derive values with other settings, change them in the plant file and run wattstage again. The band column above does follow the stage-up and stage-down flows if they are edited.", "note_wrap")
	row = b.quantitiesAt(s, row+1, 1, st.Settings) + 1

	s.text(1, row, "Sequence of operation", "h2")
	row++
	if len(st.Sequence) == 0 {
		s.text(1, row, "None given.", "italic")
		row++
	}
	for i, step := range st.Sequence {
		row = s.paragraph(row, 1, last, fmt.Sprintf("%d. %s", i+1, step), "wrap")
	}
	for c := 1; c <= 10; c++ {
		s.fixed[c] = 13
	}
	delete(s.fixed, 3) // units added: fitted to its text
	s.fixed[11] = 36
	b.freeze(s, 1, stagingHeader+1)
	b.pageSetup(s, true, last, row)
	s.finish()
}

// quantitiesAt writes label/value/unit rows (no source column) from row
// and returns the row after the last.
func (b *book) quantitiesAt(s *sheet, row, col int, qs []Quantity) int {
	if len(qs) == 0 {
		s.text(col, row, "None given.", "italic")
		return row + 1
	}
	for _, q := range qs {
		s.merged(row, col, col+2, q.Label, "text")
		if q.Text != "" {
			s.merged(row, col+3, col+8, q.Text, "wrap")
		} else {
			s.number(col+3, row, q.Value, decStyle(q.Decimals))
			s.text(col+4, row, q.Unit, "text")
		}
		row++
	}
	return row
}
