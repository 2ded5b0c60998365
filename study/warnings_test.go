package study_test

import (
	"bytes"
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"wattstage/plant"
	"wattstage/study"
)

// Every warning of the plant loader and of the trend reader reaches the
// study's result and its JSON, with its origin (file:line[:column] and
// field) as the source. The invented plant has its runout past the last
// datasheet point; its trend has a line before the header and dates that
// read either way (day/month or month/day) with no format given.
func TestLoaderAndTrendWarningsInJSON(t *testing.T) {
	dir := t.TempDir()
	var b strings.Builder
	b.WriteString("exported by a building automation system\n")
	b.WriteString("timestamp,plant_flow_gpm\n")
	start := time.Date(2025, 3, 3, 0, 0, 0, 0, time.UTC)
	for i := 0; i < 168; i++ { // 3–9 March: every date reads either way
		fmt.Fprintf(&b, "%s,%.1f\n", start.Add(time.Duration(i)*time.Hour).Format("01/02/2006 15:04"), weekFlow(i%168))
	}
	if err := os.WriteFile(filepath.Join(dir, "trend.csv"), []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	var lines []string
	for _, l := range strings.Split(trendPlantYAML(t, "trend.csv"), "\n") {
		switch k := strings.TrimSpace(l); {
		case strings.HasPrefix(k, "time_format:"):
			continue
		case strings.HasPrefix(k, "runout:"):
			l = strings.Replace(l, "1400", "1450", 1)
		}
		lines = append(lines, l)
	}
	path := filepath.Join(dir, "plant.yaml")
	if err := os.WriteFile(path, []byte(strings.Join(lines, "\n")), 0o644); err != nil {
		t.Fatal(err)
	}
	p, err := plant.Load(path)
	if err != nil {
		t.Fatal(err)
	}
	in, err := study.Prepare(p, 0)
	if err != nil {
		t.Fatal(err)
	}
	if len(p.Warnings) == 0 || len(in.Trend.Warnings) < 2 {
		t.Fatalf("the invented inputs should warn: plant %v, trend %v", p.Warnings, in.Trend.Warnings)
	}
	r, err := study.Run(in, noRange)
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := r.WriteJSON(&buf, false); err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Warnings []study.Warning `json:"warnings"`
	}
	if err := json.Unmarshal(buf.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	has := func(source, message string) bool {
		for _, w := range doc.Warnings {
			if w.Source == source && w.Message == message {
				return true
			}
		}
		return false
	}
	for _, w := range p.Warnings {
		if !has(w.Origin(), w.Message) {
			t.Errorf("plant warning %q missing from the JSON warnings %v", w, doc.Warnings)
		}
		if w.Line == 0 {
			t.Errorf("plant warning %q has no line", w)
		}
	}
	for _, w := range in.Trend.Warnings {
		if !has(w.Origin(), w.Message) {
			t.Errorf("trend warning %q missing from the JSON warnings %v", w, doc.Warnings)
		}
	}
	t.Logf("%d warnings: %v", len(doc.Warnings), doc.Warnings)
}
