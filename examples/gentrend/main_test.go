package main

import (
	"bytes"
	"os"
	"testing"
	"time"
)

// TestCommittedFileIsRegenerated checks that the committed example trend is
// exactly what this generator writes, so that it can be regenerated.
func TestCommittedFileIsRegenerated(t *testing.T) {
	var b bytes.Buffer
	if err := write(&b); err != nil {
		t.Fatal(err)
	}
	want, err := os.ReadFile("../chilled-water-trend.csv")
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Equal(b.Bytes(), want) {
		t.Errorf("examples/chilled-water-trend.csv differs from the generator's output; run go run ./examples/gentrend -o examples/chilled-water-trend.csv")
	}
}

func TestLoadShape(t *testing.T) {
	// The invented load: winter nights near the 28 % base, summer weekday
	// afternoons near 90 %, weekends lower than weekdays.
	winterNight := load(mustTime(t, "2025-01-29 03:00"))
	summerAfternoon := load(mustTime(t, "2025-07-29 13:00")) // a Tuesday
	summerSaturday := load(mustTime(t, "2025-07-26 13:00"))
	if winterNight < 0.27 || winterNight > 0.30 || summerAfternoon < 0.85 || summerAfternoon > 0.92 || summerSaturday >= summerAfternoon {
		t.Errorf("winter night %.3f, summer weekday %.3f, summer Saturday %.3f", winterNight, summerAfternoon, summerSaturday)
	}
}

func mustTime(t *testing.T, s string) time.Time {
	v, err := time.Parse("2006-01-02 15:04", s)
	if err != nil {
		t.Fatal(err)
	}
	return v
}
