package handover_test

import (
	"fmt"
	"math"
	"reflect"
	"testing"

	"wattstage/workbook"
)

// nanAllowed are the Report fields whose documentation gives NaN a
// meaning (workbook/report.go): a datasheet efficiency not given, an
// efficiency not fitted, no drive, a gap in a chart line. Every other
// number must be finite.
var nanAllowed = map[string]bool{
	"CurvePoint.Eff":     true, // "NaN = not given"
	"CurvePoint.EffFit":  true, // "NaN = not fitted"
	"UnitPoint.DriveEff": true, // "NaN = no drive"
	"Series.Y":           true, // Curves: "A NaN in Y leaves a gap"
}

// nonFinite lists every NaN or infinite number in v (a Report) outside
// nanAllowed, by its field path.
func nonFinite(v any) []string {
	var bad []string
	var walk func(rv reflect.Value, path, field string)
	walk = func(rv reflect.Value, path, field string) {
		switch rv.Kind() {
		case reflect.Pointer, reflect.Interface:
			if !rv.IsNil() {
				walk(rv.Elem(), path, field)
			}
		case reflect.Struct:
			for i := 0; i < rv.NumField(); i++ {
				f := rv.Type().Field(i)
				walk(rv.Field(i), path+"."+f.Name, rv.Type().Name()+"."+f.Name)
			}
		case reflect.Slice, reflect.Array:
			for i := 0; i < rv.Len(); i++ {
				walk(rv.Index(i), fmt.Sprintf("%s[%d]", path, i), field)
			}
		case reflect.Float64, reflect.Float32:
			x := rv.Float()
			if math.IsInf(x, 0) || math.IsNaN(x) && !nanAllowed[field] {
				bad = append(bad, fmt.Sprintf("%s = %v", path, x))
			}
		}
	}
	walk(reflect.ValueOf(v), "Report", "")
	return bad
}

// TestNoNonFinite: no NaN outside the fields that allow it, and no
// infinity anywhere, in the report of any example.
func TestNoNonFinite(t *testing.T) {
	for _, name := range exampleFiles {
		t.Run(name, func(t *testing.T) {
			for _, b := range nonFinite(loadExample(t, name).report) {
				t.Error(b)
			}
		})
	}
}

// TestNonFiniteFinds: the walker finds a NaN where none is allowed and an
// infinity anywhere, and lets an allowed NaN pass.
func TestNonFiniteFinds(t *testing.T) {
	r := &workbook.Report{
		LoadPoints: []workbook.LoadPoint{{KW: math.NaN(), Units: []workbook.UnitPoint{{DriveEff: math.NaN()}, {DriveEff: math.Inf(1)}}}},
		Curves:     workbook.Curves{GroupPower: workbook.Chart{Series: []workbook.Series{{X: []float64{1}, Y: []float64{math.NaN()}}}}},
	}
	got := nonFinite(r)
	want := []string{"Report.LoadPoints[0].Units[1].DriveEff = +Inf", "Report.LoadPoints[0].KW = NaN"}
	if !reflect.DeepEqual(got, want) {
		t.Errorf("nonFinite found %q, want %q", got, want)
	}
}
