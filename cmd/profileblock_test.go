package cmd_test

import (
	"math"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"wattstage/curves"
	"wattstage/plant"
	"wattstage/profile"
)

var binLine = regexp.MustCompile(`^    - \{flow: ([0-9.]+), hours: ([0-9.]+)\}$`)

// TestBinsAsProfile turns the example trend into a profile: block, puts it
// in place of the example plant's bins and loads the plant; the block's
// hours must make a year and its hours-weighted mean flow must be the
// trend's.
func TestBinsAsProfile(t *testing.T) {
	t.Chdir(moduleRoot)
	r := run(t, "bins", "examples/chilled-water-trend.csv", "--as-profile", "--time-zone", "America/Chicago")
	if r.code != 0 {
		t.Fatal(r.describe(nil))
	}
	var hours, flowHours float64
	for _, l := range strings.Split(r.out, "\n") {
		if m := binLine.FindStringSubmatch(l); m != nil {
			q, _ := strconv.ParseFloat(m[1], 64)
			h, _ := strconv.ParseFloat(m[2], 64)
			hours += h
			flowHours += q * h
		}
	}
	// 8,760 h in a non-leap year (common practice); every bin is rounded
	// to 0.05 h, so ten bins sum to within 0.5 h.
	if math.Abs(hours-8760) > 0.5 {
		t.Errorf("the bins hold %.1f h, want 8,760 h (the trend has no zero-flow hours)", hours)
	}
	tr, err := profile.ReadTrendFile(profile.TrendSpec{TimeZone: "America/Chicago", FlowUnit: "gpm"}, "examples/chilled-water-trend.csv")
	if err != nil {
		t.Fatal(err)
	}
	var h, qh float64
	for _, p := range tr.Points {
		h += p.Hours
		qh += p.Hours * float64(p.Flow) / curves.GPM
	}
	// Flows are rounded to 0.05 gpm and hours to 0.05 h: the mean moves
	// by less than 0.1 gpm.
	if got, want := flowHours/hours, qh/h; math.Abs(got-want) > 0.1 {
		t.Errorf("mean flow of the block %.2f gpm, of the trend %.2f gpm", got, want)
	}

	src, err := os.ReadFile("examples/chilled-water.yaml")
	if err != nil {
		t.Fatal(err)
	}
	s := string(src)
	start, end := strings.Index(s, "\nprofile:"), strings.Index(s, "\ntariff:")
	if start < 0 || end < start {
		t.Fatal("the example plant has no profile: before tariff:")
	}
	pasted := s[:start+1] + r.out + s[end:]
	path := filepath.Join(t.TempDir(), "pasted.yaml")
	if err := os.WriteFile(path, []byte(pasted), 0o644); err != nil {
		t.Fatal(err)
	}
	p, err := plant.Load(path)
	if err != nil {
		t.Fatalf("the plant with the pasted block does not load: %v", err)
	}
	if len(p.Profile.Bins) < 5 {
		t.Errorf("the pasted profile has %d bins", len(p.Profile.Bins))
	}
	if r := run(t, "plan", path); r.code != 0 {
		t.Errorf("plan on the pasted profile: %s", r.describe(nil))
	}
}
