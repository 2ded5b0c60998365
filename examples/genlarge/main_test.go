package main

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"
	"time"

	"wattstage/plant"
)

// TestWritesLoadablePlants writes plants of several sizes with a short
// trend, loads each with the plant loader, and checks that a second run
// gives the same bytes.
func TestWritesLoadablePlants(t *testing.T) {
	cases := []struct {
		name          string
		models, units int
		vectors       int // Π(count+1) − 1
	}{
		{"one model of three", 1, 3, 3},
		{"three models of eight units", 3, 8, 47},
		{"six models of twelve units", 6, 12, 728},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			dir := t.TempDir()
			yaml, csv := filepath.Join(dir, "p.yaml"), filepath.Join(dir, "p.csv")
			if err := run(c.models, c.units, yaml, csv, 48, 15*time.Minute, ""); err != nil {
				t.Fatal(err)
			}
			p, err := plant.Load(yaml)
			if err != nil {
				t.Fatalf("generated plant does not load: %v", err)
			}
			n, v := 0, 1
			for _, m := range p.Models {
				n += m.Count
				v *= m.Count + 1
			}
			if len(p.Models) != c.models || n != c.units || v-1 != c.vectors {
				t.Errorf("got %d models, %d units, %d vectors; want %d, %d, %d", len(p.Models), n, v-1, c.models, c.units, c.vectors)
			}
			first, _ := os.ReadFile(csv)
			firstPlant, _ := os.ReadFile(yaml)
			if err := run(c.models, c.units, yaml, csv, 48, 15*time.Minute, ""); err != nil {
				t.Fatal(err)
			}
			again, _ := os.ReadFile(csv)
			againPlant, _ := os.ReadFile(yaml)
			if !bytes.Equal(first, again) || !bytes.Equal(firstPlant, againPlant) {
				t.Error("a second run wrote different bytes")
			}
		})
	}
}

// TestRefusesPlantsOutOfRange checks the generator's own limits.
func TestRefusesPlantsOutOfRange(t *testing.T) {
	for _, c := range []struct{ models, units int }{{0, 3}, {13, 20}, {3, 2}, {2, 41}} {
		if err := run(c.models, c.units, os.DevNull, "", 0, time.Hour, ""); err == nil {
			t.Errorf("%d models, %d units: accepted", c.models, c.units)
		}
	}
}
