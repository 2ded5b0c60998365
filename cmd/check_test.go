package cmd_test

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"wattstage/cmd"
)

// checkPlantHead is a small US plant up to its profile: the pump's runout
// (line 14) is past its last datasheet point (800 gpm). 52 % at 200 gpm
// keeps the fitted BEP (559 gpm) within 10 % of the datasheet's best point
// (600 gpm), so the runout is the one pump warning.
const checkPlantHead = `units: US
pumps:
  - name: HWP
    rated_speed: 1770
    curve:
      - {flow: 0, head: 80}
      - {flow: 200, head: 77, efficiency: 52}
      - {flow: 400, head: 70, efficiency: 74}
      - {flow: 600, head: 59, efficiency: 80}
      - {flow: 700, head: 52, efficiency: 78}
      - {flow: 800, head: 44, efficiency: 72}
    motor: {rated_output: 25}
    drive: variable
    runout: 850
system:
  design_flow: 600
  design_head: 58
  dp_control: {control_head: 20}
tariff: {currency: USD, energy_price: 0.1}
`

// TestCheckShowsWarnings: `check` lists the plant loader's warnings, and
// the trend reader's when the profile is a trend log, under a Warnings
// heading, each as origin: message.
func TestCheckShowsWarnings(t *testing.T) {
	dir := t.TempDir()
	runout := "- PLANT:14:13: pumps[0].runout: 850 gpm is past the last datasheet point (800 gpm): the curve is extrapolated there"
	cases := []struct {
		name    string
		profile string
		csv     string
		want    []string // lines after the Warnings heading, in order; PLANT and CSV stand for the files
	}{
		{"bins",
			"profile:\n  bins:\n    - {flow: 50%, hours: 3000}\n    - {flow: 650, hours: 100}\n",
			"",
			[]string{runout, "- PLANT:23:14: profile.bins[1].flow: 650 gpm is above the design flow 600 gpm"}},
		{"trend",
			"profile:\n  trend: {file: log.csv, flow_unit: gpm}\n",
			"Exported by the BAS\ntime,CHW flow\n03/04/2025 10:00,500\n03/04/2025 11:00,520\n03/04/2025 12:00,510\n",
			[]string{runout,
				`- CSV:2: skipped 1 lines before the header on line 2`,
				`- CSV:2: flow column not named; using "CHW flow"`,
				`- CSV:3: dates such as "03/04/2025 10:00" read as month/day; give the trend's time format if that is wrong`}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			plantPath := filepath.Join(dir, c.name+".yaml")
			if err := os.WriteFile(plantPath, []byte(checkPlantHead+c.profile), 0o644); err != nil {
				t.Fatal(err)
			}
			csvPath := filepath.Join(dir, "log.csv")
			if c.csv != "" {
				if err := os.WriteFile(csvPath, []byte(c.csv), 0o644); err != nil {
					t.Fatal(err)
				}
			}
			args := []string{"check", plantPath}
			r := run(t, args...)
			if r.code != 0 || r.err != "" {
				t.Fatalf("%s", r.describe(args))
			}
			_, after, ok := strings.Cut(r.out, "\nWarnings\n────────\n")
			if !ok {
				t.Fatalf("no Warnings heading in\n%s", r.out)
			}
			got := strings.Split(strings.TrimRight(after, "\n"), "\n")
			r2 := strings.NewReplacer("PLANT", plantPath, "CSV", csvPath)
			if len(got) != len(c.want) {
				t.Fatalf("warnings:\n%s\nwant %d lines", after, len(c.want))
			}
			for i, w := range c.want {
				if w = r2.Replace(w); got[i] != w {
					t.Errorf("warning %d:\n got %s\nwant %s", i, got[i], w)
				}
			}
		})
	}
}

// TestCheckNoWarnings: a plant with nothing to warn of has no Warnings
// heading.
func TestCheckNoWarnings(t *testing.T) {
	args := []string{"check", filepath.Join(moduleRoot, "examples", "condenser-water.yaml")}
	r := run(t, args...)
	if r.code != 0 {
		t.Fatalf("%s", r.describe(args))
	}
	if strings.Contains(r.out, "\nWarnings\n") {
		t.Errorf("Warnings heading for a plant without warnings:\n%s", r.out)
	}
}

// TestCheckUnreadableTrend: check reads the trend as plan does, so a
// trend log the reader refuses fails check too, with the reader's message.
func TestCheckUnreadableTrend(t *testing.T) {
	dir := t.TempDir()
	plantPath := filepath.Join(dir, "p.yaml")
	src := checkPlantHead + "profile:\n  trend: {file: log.csv, flow_unit: gpm}\n"
	if err := os.WriteFile(plantPath, []byte(src), 0o644); err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(filepath.Join(dir, "log.csv"), []byte("time,flow\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	args := []string{"check", plantPath}
	r := run(t, args...)
	if r.code != cmd.ExitBadInput || !strings.Contains(r.err, filepath.Join(dir, "log.csv")) || r.out != "" {
		t.Fatalf("%s\n--- stdout\n%s", r.describe(args), r.out)
	}
}
