package plant

import (
	"errors"
	"math"
	"os"
	"path/filepath"
	"testing"
)

// FuzzParse feeds arbitrary bytes to the loader. It must never panic, and
// must return either a usable Plant or an ErrorList of positioned input
// errors, the same one every time. The seed corpus is the examples, the
// valid test plants and the bad-input corpus, plus the committed entries
// under testdata/fuzz/FuzzParse.
func FuzzParse(f *testing.F) {
	for _, pattern := range []string{"../examples/*.yaml", "../testdata/plants/*.yaml", "../testdata/invalid/plants/*.yaml"} {
		files, _ := filepath.Glob(pattern)
		for _, file := range files {
			if data, err := os.ReadFile(file); err == nil {
				f.Add(data)
			}
		}
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		p, err := Parse("fuzz.yaml", data, "")
		if err != nil {
			checkFuzzError(t, p, err)
			// Parsing is deterministic: the same input, the same report.
			if _, again := Parse("fuzz.yaml", data, ""); again == nil || again.Error() != err.Error() {
				t.Fatalf("second parse differs:\n%v\n---\n%v", err, again)
			}
			return
		}
		checkFuzzPlant(t, p)
	})
}

func checkFuzzError(t *testing.T, p *Plant, err error) {
	if p != nil {
		t.Fatalf("a plant returned with an error")
	}
	var list ErrorList
	if !errors.As(err, &list) || len(list) == 0 || !errors.Is(err, ErrInvalid) {
		t.Fatalf("error %T %v is not a non-empty ErrorList of ErrInvalid", err, err)
	}
	for _, e := range list {
		if e.File != "fuzz.yaml" || e.Msg == "" || e.Line < 0 || e.Column < 0 || (e.Column > 0 && e.Line == 0) {
			t.Fatalf("malformed error %#v", e)
		}
	}
}

func finite(v ...float64) bool {
	for _, x := range v {
		if math.IsNaN(x) || math.IsInf(x, 0) {
			return false
		}
	}
	return true
}

// checkFuzzPlant checks what every loaded plant promises its users.
func checkFuzzPlant(t *testing.T, p *Plant) {
	if len(p.Models) == 0 || p.System == nil {
		t.Fatalf("plant without models or system: %+v", p)
	}
	if !(p.DesignFlow > 0 && p.DesignHead > 0 && p.Fluid.Density > 0) || !finite(float64(p.DesignFlow), float64(p.DesignHead), p.Fluid.Density) {
		t.Fatalf("design %g m³/s, %g m, density %g", p.DesignFlow, p.DesignHead, p.Fluid.Density)
	}
	if p.MinFlow < 0 || p.MinFlow >= p.DesignFlow {
		t.Fatalf("plant minimum flow %g outside [0, design)", p.MinFlow)
	}
	for i, m := range p.Models {
		switch {
		case m.Pump == nil || m.Drive == nil:
			t.Fatalf("pumps[%d] without pump or drive", i)
		case m.Count < 1 || m.Count > maxCount:
			t.Fatalf("pumps[%d] count %d", i, m.Count)
		case !(m.MinSpeed > 0 && m.MinSpeed <= m.MaxSpeed && m.MaxSpeed <= 1.5):
			t.Fatalf("pumps[%d] speeds %g–%g", i, m.MinSpeed, m.MaxSpeed)
		case !(m.Motor.Rated > 0 && m.Motor.FullLoadEff > 0 && m.Motor.FullLoadEff <= 1):
			t.Fatalf("pumps[%d] motor %+v", i, m.Motor)
		case !(m.MinFlow >= 0 && m.MinFlow < m.Pump.BEPFlow && m.Pump.BEPFlow < m.Runout):
			t.Fatalf("pumps[%d] min flow %g, BEP %g, runout %g", i, m.MinFlow, m.Pump.BEPFlow, m.Runout)
		case !finite(m.BranchK) || m.BranchK < 0:
			t.Fatalf("pumps[%d] branch k %g", i, m.BranchK)
		}
	}
	hours := 0.0
	for _, b := range p.Profile.Bins {
		if !(b.Flow > 0 && b.Hours > 0) {
			t.Fatalf("bin %+v", b)
		}
		hours += b.Hours
	}
	if hours > maxYearHours || (len(p.Profile.Bins) == 0) == (p.Profile.Trend == nil) {
		t.Fatalf("profile: %d bins, %g h, trend %v", len(p.Profile.Bins), hours, p.Profile.Trend)
	}
	if p.Tariff.EnergyPrice < 0 || p.Tariff.Currency == "" {
		t.Fatalf("tariff %+v", p.Tariff)
	}
	if s := p.Sequence; s != nil && !s.ByBands() && !(s.StageDownSpeed > 0 && s.StageDownSpeed < s.StageUpSpeed) {
		t.Fatalf("sequence %+v", s)
	}
	if s := p.Sequence; s != nil && s.ByBands() {
		duty := 0
		for _, m := range p.Models {
			duty += m.Count
		}
		for i, b := range s.Bands {
			last := i == len(s.Bands)-1
			if b.Running < 1 || b.Running > duty || last != (b.UpTo == 0) || i > 0 && !last && b.UpTo <= s.Bands[i-1].UpTo {
				t.Fatalf("sequence bands %+v (%d on duty)", s.Bands, duty)
			}
		}
	}
	for i, m := range p.Models {
		if m.Standby < 0 || m.Count < 1 || m.Tags != nil && len(m.Tags) != m.Installed() {
			t.Fatalf("pumps[%d]: %d duty, %d standby, tags %v", i, m.Count, m.Standby, m.Tags)
		}
	}
}
