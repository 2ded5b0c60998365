package starter

import (
	"bytes"
	_ "embed"
	"fmt"
	"strings"
	"text/template"
	"unicode/utf8"
)

// Units is the unit system of a starting file.
type Units string

// System is the kind of system the pumps serve.
type System string

const (
	US Units = "US" // gpm, ft, hp, °F
	SI Units = "SI" // m³/h, m, kW, °C

	DP    System = "dp"    // closed loop held at a remote differential-pressure sensor
	Fixed System = "fixed" // static head plus friction (open towers, fixed curve)
)

// ParseUnits reads "US" or "SI" in any case.
func ParseUnits(s string) (Units, error) {
	switch strings.ToUpper(strings.TrimSpace(s)) {
	case "US":
		return US, nil
	case "SI":
		return SI, nil
	}
	return "", fmt.Errorf("starter: units %q: give US or SI", s)
}

// ParseSystem reads "dp" or "fixed" in any case.
func ParseSystem(s string) (System, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "dp":
		return DP, nil
	case "fixed":
		return Fixed, nil
	}
	return "", fmt.Errorf("starter: system %q: give dp (differential-pressure control) or fixed (static head plus friction)", s)
}

//go:embed plant.yaml.tmpl
var text string

var tmpl = template.Must(template.New("plant").Parse(text))

// values are the numbers and unit names of one unit system.
type values struct {
	Units                    Units
	System                   System
	Flow, Head, Power, Temp  string // unit names as written in comments
	Pressure                 string // the pressure suffix a head may carry
	Temperature              string
	RatedSpeed               string
	Curve                    [6][3]string // flow, head, efficiency (empty at zero flow)
	MinFlow, Runout          string
	Motor                    string
	DesignFlow, DesignHead   string
	ControlHead, ResetLow    string
	StaticHead, PlantMinFlow string
	Currency                 string
	EnergyPrice, Demand      string
	DriveCost, OtherCost     string
	Mains                    string
}

// us and si are the invented starting plant in each unit system: two
// equal pumps, each about half the design flow at the design head.
var (
	us = values{Units: US, Flow: "gpm", Head: "ft", Power: "hp", Temp: "°F", Pressure: "psi",
		Temperature: "44", RatedSpeed: "1770", Mains: "4-pole motor on 60 Hz",
		Curve:   [6][3]string{{"0", "95", ""}, {"300", "92", "62"}, {"500", "86", "76"}, {"700", "77", "82"}, {"850", "68", "80"}, {"1000", "56", "72"}},
		MinFlow: "30%", Runout: "1000", Motor: "20",
		DesignFlow: "1200", DesignHead: "80", ControlHead: "12 psi", ResetLow: "7 psi", StaticHead: "25", PlantMinFlow: "250",
		Currency: "USD", EnergyPrice: "0.12", Demand: "12.50", DriveCost: "6500", OtherCost: "5000"}
	si = values{Units: SI, Flow: "m³/h", Head: "m", Power: "kW", Temp: "°C", Pressure: "kPa",
		Temperature: "7", RatedSpeed: "1450", Mains: "4-pole motor on 50 Hz",
		Curve:   [6][3]string{{"0", "30", ""}, {"60", "29", "60"}, {"100", "27.5", "74"}, {"140", "25", "80"}, {"170", "22.5", "79"}, {"200", "19", "72"}},
		MinFlow: "30%", Runout: "200", Motor: "18.5",
		DesignFlow: "280", DesignHead: "24", ControlHead: "80 kPa", ResetLow: "50 kPa", StaticHead: "7", PlantMinFlow: "60",
		Currency: "EUR", EnergyPrice: "0.15", Demand: "9.00", DriveCost: "6000", OtherCost: "4500"}
)

// Write returns the starting plant file for a unit system and a kind of
// system.
func Write(u Units, s System) ([]byte, error) {
	var v values
	switch u {
	case US:
		v = us
	case SI:
		v = si
	default:
		return nil, fmt.Errorf("starter: units %q: give US or SI", u)
	}
	if s != DP && s != Fixed {
		return nil, fmt.Errorf("starter: system %q: give dp or fixed", s)
	}
	v.System = s
	var b bytes.Buffer
	if err := tmpl.Execute(&b, v); err != nil {
		return nil, fmt.Errorf("starter: %w", err)
	}
	return alignComments(b.Bytes()), nil
}

// commentColumn is where the template's inline comments start (0-based):
// the template separates a value from its comment with a tab.
const commentColumn = 31

// alignComments replaces the tab before each inline comment with spaces
// up to commentColumn (at least two), so the comments line up whatever the
// length of the values.
func alignComments(b []byte) []byte {
	lines := strings.Split(string(b), "\n")
	for i, l := range lines {
		code, comment, ok := strings.Cut(l, "\t")
		if !ok {
			continue
		}
		pad := max(2, commentColumn-utf8.RuneCountInString(code))
		lines[i] = code + strings.Repeat(" ", pad) + comment
	}
	return []byte(strings.Join(lines, "\n"))
}
