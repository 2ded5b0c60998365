package starter_test

import (
	"regexp"
	"strings"
	"testing"

	"wattstage/plant"
	"wattstage/starter"
)

var keyLine = regexp.MustCompile(`^\s*(?:- )?([a-z_]+):`)

// TestStartersLoad checks that every starting file loads without an error
// or a warning, in the unit system and with the system it was asked for,
// and that every key it sets carries a comment that explains it.
func TestStartersLoad(t *testing.T) {
	for _, u := range []starter.Units{starter.US, starter.SI} {
		for _, s := range []starter.System{starter.DP, starter.Fixed} {
			t.Run(string(u)+"-"+string(s), func(t *testing.T) {
				b, err := starter.Write(u, s)
				if err != nil {
					t.Fatal(err)
				}
				p, err := plant.Parse("start.yaml", b, "")
				if err != nil {
					t.Fatalf("the starting file does not load:\n%v\n%s", err, b)
				}
				for _, w := range p.Warnings {
					t.Errorf("warning on the starting file: %v", w)
				}
				if p.Units.String() != string(u) {
					t.Errorf("units %s, asked for %s", p.Units, u)
				}
				if got := strings.Contains(p.System.Describe(), "differential"); got != (s == starter.DP) {
					t.Errorf("system %q for --system %s", p.System.Describe(), s)
				}
				for i, line := range strings.Split(string(b), "\n") {
					m := keyLine.FindStringSubmatch(line)
					if m == nil || strings.HasPrefix(strings.TrimSpace(line), "- {") {
						continue // not a key, or a data row of a list
					}
					if !strings.Contains(line, "#") {
						t.Errorf("line %d sets %s with no comment explaining it: %q", i+1, m[1], line)
					}
				}
				if strings.Contains(string(b), "\t") {
					t.Error("a tab is left in the file (YAML refuses tabs for indentation)")
				}
			})
		}
	}
}

func TestParseChoices(t *testing.T) {
	for _, c := range []struct {
		in   string
		want starter.Units
		ok   bool
	}{{"us", starter.US, true}, {" SI ", starter.SI, true}, {"metric", "", false}, {"", "", false}} {
		got, err := starter.ParseUnits(c.in)
		if got != c.want || (err == nil) != c.ok {
			t.Errorf("ParseUnits(%q) = %q, %v", c.in, got, err)
		}
	}
	for _, c := range []struct {
		in   string
		want starter.System
		ok   bool
	}{{"DP", starter.DP, true}, {"fixed", starter.Fixed, true}, {"open", "", false}} {
		got, err := starter.ParseSystem(c.in)
		if got != c.want || (err == nil) != c.ok {
			t.Errorf("ParseSystem(%q) = %q, %v", c.in, got, err)
		}
	}
	if _, err := starter.Write("metric", starter.DP); err == nil {
		t.Error("Write accepted units \"metric\"")
	}
}
