package plant

import (
	"math"
	"strings"
	"testing"
)

// warnBase is minimal-us.yaml with placeholders (filled by fill) for the
// values a warning is about. With the defaults the plant warns of nothing.
// When part_load, runout and reset are empty, the shutoff point is on line
// 6, rated_output on line 13,
// design_flow on line 16 and the second bin on line 23.
const warnBase = `units: US
pumps:
  - name: HWP
    rated_speed: 1770
    curve:
      - {flow: 0, head: 80{shutoff}}
      - {flow: 200, head: 77, efficiency: {e200}}
      - {flow: 400, head: 70, efficiency: 74}
      - {flow: 600, head: 59, efficiency: 80}
      - {flow: 700, head: 52, efficiency: 78}
      - {flow: 800, head: 44, efficiency: 72}
    motor:
      rated_output: {rated}
{part_load}    drive: variable
{runout}system:
  design_flow: {design_flow}
  design_head: 58
  dp_control:
    control_head: 20
{reset}profile:
  bins:
    - {flow: 50%, hours: 3000}
    - {flow: {bin}, hours: 100}
tariff:
  currency: USD
  energy_price: 0.1
`

var warnDefaults = map[string]string{
	"rated": "25", "part_load": "", "runout": "", "design_flow": "600", "reset": "", "bin": "90%",
	"shutoff": "", "e200": "52",
}

func warnPlant(kv map[string]string) string {
	all := map[string]string{}
	for k, v := range warnDefaults {
		all[k] = v
	}
	for k, v := range kv {
		all[k] = v
	}
	return fill(warnBase, all)
}

// TestWarningPositions checks that each warning points at the value it is
// about, by file, line, column and field path, as errors do.
func TestWarningPositions(t *testing.T) {
	cases := []struct {
		name       string
		kv         map[string]string
		line, col  int
		path, want string // want: a fragment of the message
	}{
		{"bin above the design flow", map[string]string{"bin": "650"},
			23, 14, "profile.bins[1].flow", "650 gpm is above the design flow 600 gpm"},
		{"bin above the design flow as a percentage", map[string]string{"bin": "105%"},
			23, 14, "profile.bins[1].flow", "630 gpm is above the design flow 600 gpm"},
		{"runout past the last datasheet point", map[string]string{"runout": "    runout: 850\n"},
			15, 13, "pumps[0].runout", "850 gpm is past the last datasheet point (800 gpm)"},
		{"reset high flow above the design flow", map[string]string{"reset": "    reset: {low_flow: 200, low_head: 10, high_flow: 650}\n"},
			20, 53, "system.dp_control.reset.high_flow", "650 gpm is above the design flow 600 gpm"},
		{"motor into its service factor", map[string]string{"rated": "10"},
			13, 21, "pumps[0].motor.rated_output", "10 hp runs into its service factor at the design head"},
		{"motor table with the DOE drive", map[string]string{"part_load": "      part_load:\n        - {load: 50%, efficiency: 89}\n        - {load: 100%, efficiency: 91}\n"},
			15, 9, "pumps[0].motor.part_load", "the motor table only splits the combined motor-and-drive loss"},
		{"capacity short of the design flow", map[string]string{"design_flow": "900"},
			16, 16, "system.design_flow", "short of the design flow 900 gpm"},
		// The base curve's efficiency fit gives 6.02 hp at zero flow (a
		// test input's fit, not a published value); 4.5 hp is 34 % off.
		{"shutoff shaft power the fit ignores", map[string]string{"shutoff": ", shaft_power: 4.5"},
			6, 42, "pumps[0].curve[0].shaft_power", "the shutoff shaft power 4.5 hp is not used by the efficiency fit"},
		// 55 % at 200 gpm pulls the fitted peak to 538.7 gpm, 10.2 % below
		// the datasheet's best point (600 gpm, 80 %).
		{"fitted BEP away from the datasheet's best point", map[string]string{"e200": "55"},
			6, 7, "pumps[0].curve", "(538.7 gpm, 79.96 %) is 10.2 % below the datasheet's best point (600 gpm, 80 %, curve[3])"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			p, err := Parse("warn.yaml", []byte(warnPlant(c.kv)), "")
			if err != nil {
				t.Fatalf("Parse:\n%v", err)
			}
			if len(p.Warnings) != 1 {
				t.Fatalf("got %d warnings, want 1: %v", len(p.Warnings), p.Warnings)
			}
			w := p.Warnings[0]
			if w.File != "warn.yaml" || w.Line != c.line || w.Column != c.col || w.Path != c.path {
				t.Errorf("warning at %s:%d:%d %s, want warn.yaml:%d:%d %s", w.File, w.Line, w.Column, w.Path, c.line, c.col, c.path)
			}
			if !strings.Contains(w.Message, c.want) {
				t.Errorf("message %q lacks %q", w.Message, c.want)
			}
			if strings.HasPrefix(w.Message, c.path) {
				t.Errorf("message %q repeats the path", w.Message)
			}
		})
	}
}

// TestWarningsClean: the base file itself warns of nothing, so each case
// above tests one warning.
func TestWarningsClean(t *testing.T) {
	p, err := Parse("warn.yaml", []byte(warnPlant(nil)), "")
	if err != nil {
		t.Fatalf("Parse:\n%v", err)
	}
	if len(p.Warnings) > 0 {
		t.Errorf("warnings %v", p.Warnings)
	}
}

// TestDatasheetChecksQuiet: a shutoff shaft power within 5 % of the fitted
// one (6 hp against the fit's 6.02 hp) and a fitted BEP within 10 % of the
// datasheet's best point (559 gpm against 600 gpm) warn of nothing.
func TestDatasheetChecksQuiet(t *testing.T) {
	p, err := Parse("warn.yaml", []byte(warnPlant(map[string]string{"shutoff": ", shaft_power: 6"})), "")
	if err != nil {
		t.Fatalf("Parse:\n%v", err)
	}
	if len(p.Warnings) > 0 {
		t.Errorf("warnings %v", p.Warnings)
	}
}

func TestWarningFormat(t *testing.T) {
	cases := []struct {
		w              Warning
		origin, string string
	}{
		{Warning{File: "p.yaml", Line: 12, Column: 15, Path: "profile.bins[3].flow", Message: "650 gpm is above the design flow 600 gpm"},
			"p.yaml:12:15: profile.bins[3].flow", "p.yaml:12:15: profile.bins[3].flow: 650 gpm is above the design flow 600 gpm"},
		{Warning{File: "p.yaml", Line: 12, Path: "system.design_flow", Message: "m"},
			"p.yaml:12: system.design_flow", "p.yaml:12: system.design_flow: m"},
		{Warning{File: "p.yaml", Path: "system.design_flow", Message: "m"},
			"p.yaml: system.design_flow", "p.yaml: system.design_flow: m"},
	}
	for _, c := range cases {
		if got := c.w.Origin(); got != c.origin {
			t.Errorf("Origin() = %q, want %q", got, c.origin)
		}
		if got := c.w.String(); got != c.string {
			t.Errorf("String() = %q, want %q", got, c.string)
		}
	}
}

// A motor on 50 Hz or in an SI file takes the IEC defaults: IE3 full-load
// efficiency (IEC 60034-30-1, 4-pole 50 Hz table; 30 kW → 93.6 %, from
// memory) and no service factor; a US file's 60 Hz motor the NEMA ones.
func TestIECMotorDefaults(t *testing.T) {
	p, err := Load("../examples/condenser-water.yaml")
	if err != nil {
		t.Fatal(err)
	}
	small := p.Models[1] // CWP-S: 30 kW, 2950 rpm, no efficiency given
	if math.Abs(small.Motor.FullLoadEff-0.936) > 1e-12 || small.Motor.SF() != 1 {
		t.Errorf("CWP-S motor %.3f, service factor %v; want IE3 93.6 %% and 1.0", small.Motor.FullLoadEff, small.Motor.SF())
	}
	us, err := Load("../examples/chilled-water.yaml")
	if err != nil {
		t.Fatal(err)
	}
	// 30 hp 4-pole NEMA Premium 93.6 % (10 CFR 431.25 Table 5, from memory
	// for 30 hp) and the usual NEMA service factor 1.15 — the file gives 1.15.
	if m := us.Models[0].Motor; math.Abs(m.FullLoadEff-0.936) > 1e-12 || m.SF() != 1.15 {
		t.Errorf("CHWP motor %.3f, service factor %v", m.FullLoadEff, m.SF())
	}
}
