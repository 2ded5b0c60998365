package optimize_test

import (
	"encoding/csv"
	"encoding/json"
	"math"
	"path/filepath"
	"strings"
	"testing"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
)

func exampleSetpoints(t *testing.T, name string) (*plant.Plant, *optimize.Setpoints) {
	t.Helper()
	p, err := plant.Load(filepath.Join("..", "examples", name))
	if err != nil {
		t.Fatal(err)
	}
	sp, err := optimize.DeriveSetpoints(p, optimize.SetpointOptions{})
	if err != nil {
		t.Fatal(err)
	}
	return p, sp
}

func flat(s string) string { return strings.Join(strings.Fields(s), " ") }

// A fixed-curve plant (open towers: static lift plus friction) gets a
// sequence of its own kind: no pressure loop, no setpoint, no DP sensor;
// the speed loop holds the flow.
func TestFixedCurveSequenceHasNoPressureLoop(t *testing.T) {
	_, sp := exampleSetpoints(t, "condenser-water.yaml")
	text := flat(sp.SequenceOfOperation())
	for _, bad := range []string{"differential-pressure", "differential pressure", "setpoint at the sensor", "kPa", "DP loop"} {
		if strings.Contains(text, bad) {
			t.Errorf("the fixed-curve sequence says %q:\n%s", bad, text)
		}
	}
	if !strings.Contains(text, "there is no pressure loop") || !strings.Contains(text, "holds the plant flow") {
		t.Errorf("the sequence does not say what sets the speed on a fixed curve:\n%s", text)
	}
	if rows, _, _ := sp.DPSchedule(); rows != nil {
		t.Errorf("a DP schedule for a fixed curve: %v", rows)
	}
	for _, pt := range sp.PointsList() {
		if strings.Contains(strings.ToLower(pt.Name), "pressure") {
			t.Errorf("points list has %q on a plant without a DP loop", pt.Name)
		}
	}
}

// A DP-controlled plant's sequence states the setpoint and its reset in
// the file's units, and the schedule follows the reset the file gives:
// examples/chilled-water.yaml holds 15 psi at and above 80 % of 3,000 gpm,
// reset linearly to 8 psi at and below 40 %.
func TestDPSequenceStatesSetpointAndReset(t *testing.T) {
	p, sp := exampleSetpoints(t, "chilled-water.yaml")
	text := flat(sp.SequenceOfOperation())
	for _, want := range []string{"15.0 psi", "8.0 psi", "2,400 gpm", "1,200 gpm", "differential-pressure loop"} {
		if !strings.Contains(text, want) {
			t.Errorf("the sequence lacks %q:\n%s", want, text)
		}
	}
	rows, _, proposed := sp.DPSchedule()
	if proposed {
		t.Error("the file gives a reset, yet the schedule is a proposal")
	}
	// Hand check at 1,800 gpm: 8 + (15 − 8)(1,800 − 1,200)/(2,400 − 1,200)
	// = 11.5 psi (linear reset between the file's corners).
	for _, r := range rows {
		if q := p.Units.FlowOut(r.Flow); math.Abs(q-1800) < 1e-6 {
			if got := p.Units.PressureOut(r.Setpoint, p.Fluid.Density); math.Abs(got-11.5) > 1e-9 {
				t.Errorf("setpoint at 1,800 gpm: %v psi, want 11.5", got)
			}
			return
		}
	}
	t.Error("no schedule row at 1,800 gpm")
}

// One staging signal, the same word in the text, the table, the CSV and
// the JSON.
func TestOneSignalEverywhere(t *testing.T) {
	for _, name := range []string{"chilled-water.yaml", "condenser-water.yaml", "heating-water.yaml"} {
		t.Run(name, func(t *testing.T) {
			_, sp := exampleSetpoints(t, name)
			word := sp.Signal.String()
			if !strings.Contains(flat(sp.SequenceOfOperation()), "Staging signal: "+word+".") {
				t.Errorf("the text does not state the signal %q", word)
			}
			var b strings.Builder
			if err := sp.WriteCSV(&b); err != nil {
				t.Fatal(err)
			}
			recs := readCSV(t, b.String())
			for _, r := range recs["staging"] {
				if sig := r[3]; sig != word && sig != "flow" {
					t.Errorf("CSV row %v stages on %q, the sequence on %q", r, sig, word)
				}
			}
			data, err := json.Marshal(sp.SubmittalJSON())
			if err != nil {
				t.Fatal(err)
			}
			var doc struct{ Signal string }
			if err := json.Unmarshal(data, &doc); err != nil || doc.Signal != word {
				t.Errorf("JSON signal %q (%v), want %q", doc.Signal, err, word)
			}
			if strings.Contains(flat(sp.SequenceOfOperation()), "staging on speed") {
				t.Error("the text still offers staging on speed as an alternative")
			}
		})
	}
}

// readCSV parses the export with encoding/csv (RFC 4180, a variable number
// of fields) and groups its records by table; header rows (first field
// "table") are left out.
func readCSV(t *testing.T, s string) map[string][][]string {
	t.Helper()
	r := csv.NewReader(strings.NewReader(s))
	r.FieldsPerRecord = -1
	recs, err := r.ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	out := map[string][][]string{}
	for _, rec := range recs {
		if rec[0] != "table" {
			out[rec[0]] = append(out[rec[0]], rec)
		}
	}
	return out
}

// The CSV export parses and its flows are the text table's.
func TestCSVFlowsAreTheTable(t *testing.T) {
	for _, name := range []string{"chilled-water.yaml", "condenser-water.yaml", "heating-water.yaml"} {
		t.Run(name, func(t *testing.T) {
			_, sp := exampleSetpoints(t, name)
			var c, tb strings.Builder
			if err := sp.WriteCSV(&c); err != nil {
				t.Fatal(err)
			}
			if err := sp.WriteTable(&tb); err != nil {
				t.Fatal(err)
			}
			recs := readCSV(t, c.String())["staging"]
			if len(recs) != 2*len(sp.Transitions) {
				t.Fatalf("%d staging rows in the CSV for %d changes", len(recs), len(sp.Transitions))
			}
			lines := map[string]string{}
			for _, l := range strings.Split(tb.String(), "\n") {
				f := strings.Fields(l)
				if len(f) > 4 && f[1] == "to" {
					lines[f[0]+" to "+f[2]] = l
				}
			}
			for _, r := range recs {
				l, ok := lines[r[1]]
				if !ok {
					t.Errorf("the text table has no row %q", r[1])
					continue
				}
				f := strings.Fields(l)
				text := strings.ReplaceAll(f[4], ",", "")
				if r[4] == "" {
					if text != "–" {
						t.Errorf("%s: text flow %q, CSV none", r[1], text)
					}
					continue
				}
				if text != r[4] {
					t.Errorf("%s: text flow %q, CSV %q", r[1], text, r[4])
				}
			}
		})
	}
}

// Each near-equal band contains its crossover, and at its ends the two
// stages, solved again at one common speed, draw within 0.5 % of each other.
func TestNearEqualBands(t *testing.T) {
	for _, name := range []string{"chilled-water.yaml", "condenser-water.yaml", "heating-water.yaml"} {
		t.Run(name, func(t *testing.T) {
			p, sp := exampleSetpoints(t, name)
			s := optimize.New(p, optimize.Options{CommonSpeed: true})
			bands := 0
			for _, tr := range sp.Transitions {
				b := tr.Band
				if b == nil {
					continue
				}
				bands++
				if !b.Contains(tr.Crossover) {
					t.Errorf("%d→%d: band %v–%v does not contain the crossover %v", tr.From, tr.To, b.Low, b.High, tr.Crossover)
				}
				for _, q := range []curves.Flow{b.Low, b.High} {
					lo := s.SolveWith(q, optimize.Constraint{Counts: tr.Lower})
					up := s.SolveWith(q, optimize.Constraint{Counts: tr.Upper})
					if lo.Status != optimize.Served || up.Status != optimize.Served {
						t.Errorf("%d→%d at %v: not served by both stages", tr.From, tr.To, p.Units.FlowOut(q))
						continue
					}
					// 1e-6 over the tolerance: the band's ends are bisected
					// on the same solver to 1e-4 of the design flow.
					if g := math.Abs(float64(up.Power)/float64(lo.Power) - 1); g > optimize.NearEqualTolerance+1e-6 {
						t.Errorf("%d→%d at %v %s: the stages differ by %.3f %%", tr.From, tr.To, p.Units.FlowOut(q), p.Units.FlowUnit(), 100*g)
					}
				}
			}
			if bands == 0 {
				t.Error("no change has a near-equal band")
			}
		})
	}
}

// Tags name the units; a standby unit is never part of a stage and the
// sequence names it only as standby.
func TestTagsAndStandby(t *testing.T) {
	p, sp := exampleSetpoints(t, "heating-water.yaml")
	m := p.Models[0]
	if m.Count != 2 || m.Standby != 1 || m.Installed() != 3 {
		t.Fatalf("HWP: %d duty, %d standby; the example has 2 and 1", m.Count, m.Standby)
	}
	for _, st := range sp.Stages {
		if st.Counts[0] > m.Count {
			t.Errorf("stage %d runs %d units of %d on duty", st.Number, st.Counts[0], m.Count)
		}
	}
	text := flat(sp.SequenceOfOperation())
	for _, tag := range []string{"HWP-1", "HWP-2"} {
		if !strings.Contains(text, tag) {
			t.Errorf("the sequence does not name %s", tag)
		}
	}
	for _, sentence := range strings.Split(text, ". ") {
		if strings.Contains(sentence, "HWP-3") && !strings.Contains(sentence, "standby") {
			t.Errorf("HWP-3 (standby) named outside its standby role: %q", sentence)
		}
		if strings.Contains(sentence, "Stages:") && strings.Contains(sentence, "HWP-3") {
			t.Errorf("a stage names the standby unit: %q", sentence)
		}
	}
	if optimize.Drives(p) != 3 {
		t.Errorf("%d drives to buy, want 3 (the standby unit needs its drive too)", optimize.Drives(p))
	}
}

// A state with a motor into its service factor says so: the chilled-water
// example's two remaining units at their most flow run at 101 % of rated
// output.
func TestServiceFactorWarning(t *testing.T) {
	p, _ := exampleSetpoints(t, "chilled-water.yaml")
	uo, err := optimize.CheckUnitOut(p, optimize.Options{})
	if err != nil {
		t.Fatal(err)
	}
	over := false
	for _, u := range uo.AtMax.Units {
		over = over || u.Load > 1
	}
	if !over {
		t.Fatal("no motor above rated output at the one-unit-out maximum: the test would not tell")
	}
	if !strings.Contains(strings.Join(uo.AtMax.Warnings, "\n"), "into its service factor") {
		t.Errorf("warnings %q lack the service factor", uo.AtMax.Warnings)
	}
}
