package plant

import (
	"strings"
	"testing"
)

// bypassBase is an invented plant with a plant minimum flow; %s is the
// bypass_at line.
const bypassBase = `units: SI
fluid:
  temperature: 7
pumps:
  - name: CHWP
    count: 2
    rated_speed: 1480
    curve:
      - {flow: 0, head: 34}
      - {flow: 200, head: 32.4, efficiency: 58}
      - {flow: 350, head: 30.2, efficiency: 76}
      - {flow: 550, head: 25.8, efficiency: 85}
      - {flow: 750, head: 19.8, efficiency: 79}
    motor:
      rated_output: 55
    drive: variable
system:
  design_flow: 800
  design_head: 24
  dp_control:
    control_head: 8
  plant_min_flow: 200
%s
profile:
  bins:
    - {flow: 60%, hours: 5000}
tariff:
  currency: EUR
  energy_price: 0.14
`

// bypass_at says where the plant-minimum bypass sits; the default (plant)
// is listed among the defaults, and a wrong word is refused at its place.
func TestBypassAt(t *testing.T) {
	for _, tc := range []struct {
		name, line string
		loopEnd    bool
		dflt       bool   // the default is listed
		err        string // part of the error; "" = loads
	}{
		{"not given", "", false, true, ""},
		{"plant", "  bypass_at: plant", false, false, ""},
		{"loop end", "  bypass_at: loop_end", true, false, ""},
		{"misspelt", "  bypass_at: far_end", false, false, `bypass.yaml:23:14: system.bypass_at: must be plant or loop_end, not "far_end"`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p, err := Parse("bypass.yaml", []byte(strings.Replace(bypassBase, "%s", tc.line, 1)), "")
			if tc.err != "" {
				if err == nil || !strings.Contains(err.Error(), tc.err) {
					t.Fatalf("error %v, want %q", err, tc.err)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			if p.BypassAtLoopEnd != tc.loopEnd {
				t.Errorf("BypassAtLoopEnd %v, want %v", p.BypassAtLoopEnd, tc.loopEnd)
			}
			listed := false
			for _, d := range p.Defaults {
				if strings.HasPrefix(d, "system.bypass_at: plant") {
					listed = true
				}
			}
			if listed != tc.dflt {
				t.Errorf("default listed %v, want %v: %v", listed, tc.dflt, p.Defaults)
			}
			// The head the pumps make at 100 m³/h, below the 200 m³/h minimum:
			// the system's need at the load flow, or at the pumped flow with
			// the bypass at the loop's end.
			load, pumped := p.MinFlow/2, p.MinFlow
			want := p.System.Required(load)
			if tc.loopEnd {
				want = p.System.Required(pumped)
			}
			if got := p.RequiredHead(load); got != want {
				t.Errorf("RequiredHead %g m, want %g m", float64(got), float64(want))
			}
		})
	}
}
