package profile

import (
	"strings"

	"wattstage/curves"
)

// flowUnits maps the accepted spellings of a flow unit to m³/s per unit.
var flowUnits = map[string]float64{
	"gpm": curves.GPM, "usgpm": curves.GPM, "gal/min": curves.GPM,
	"m3/h": curves.M3PerH, "m³/h": curves.M3PerH, "m3/hr": curves.M3PerH, "m3h": curves.M3PerH, "cmh": curves.M3PerH,
	"l/s": curves.LPerS, "lps": curves.LPerS, "l/sec": curves.LPerS,
}

// dpUnit converts a DP reading: pressures go through the fluid density,
// heads are lengths of the pumped fluid.
type dpUnit struct {
	pascal float64 // Pa per unit, for a pressure unit; 0 for a head unit
	metre  float64 // m per unit, for a head unit
}

var dpUnits = map[string]dpUnit{
	"psi": {pascal: curves.PSI}, "psid": {pascal: curves.PSI},
	"kpa": {pascal: curves.KPa}, "kpad": {pascal: curves.KPa},
	"ft": {metre: curves.Foot}, "fthd": {metre: curves.Foot}, "ftwc": {metre: curves.Foot}, "fth2o": {metre: curves.Foot},
	"m": {metre: 1}, "mwc": {metre: 1}, "mh2o": {metre: 1},
}

func unitKey(s string) string {
	return strings.ToLower(strings.ReplaceAll(strings.TrimSpace(s), " ", ""))
}

// head converts a DP reading to head of a fluid of the given density.
func (u dpUnit) head(v, density float64) curves.Head {
	if u.pascal != 0 {
		return curves.PressureToHead(v*u.pascal, density)
	}
	return curves.Head(v * u.metre)
}

// headerTokens splits a column header into lower-case words, keeping the
// characters units are written with ("m3/h", "l/s", "m³/h").
func headerTokens(h string) []string {
	return strings.FieldsFunc(strings.ToLower(h), func(r rune) bool {
		switch {
		case r >= 'a' && r <= 'z', r >= '0' && r <= '9', r == '/', r == '³':
			return false
		}
		return true
	})
}

// unitFromHeader finds a unit named in a column header, e.g. "gpm" in
// "plant_flow_gpm" or "kPa" in "DP [kPa]". Single letters ("m") are not
// guessed.
func unitFromHeader[V any](h string, units map[string]V) string {
	for _, tok := range headerTokens(h) {
		if _, ok := units[tok]; ok && len(tok) > 1 {
			return tok
		}
	}
	return ""
}
