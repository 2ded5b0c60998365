package optimize_test

import (
	"math"
	"testing"

	"wattstage/curves"
	"wattstage/optimize"
	"wattstage/plant"
)

// benchPlant8 is an invented 8-unit plant of 3 models: three large, three
// medium and two small units on DP control.
func benchPlant8(t testing.TB) *plant.Plant {
	return suitePlant{name: "eight-units", system: dp(0.45, 30, 0.4), models: []suiteModel{
		{name: "L", count: 3, pump: pumpL, motorHP: 60},
		{name: "M", count: 3, pump: pumpM, motorHP: 30},
		{name: "S", count: 2, pump: pumpS, motorHP: 15},
	}}.build(t)
}

// benchYear is a deterministic hourly load pattern for a non-leap year: a
// seasonal swing and a daily swing around 60 % of design flow, from about
// 20 % to 95 % of design.
func benchYear(design curves.Flow) []curves.Flow {
	out := make([]curves.Flow, curves.HoursPY)
	for h := range out {
		season := math.Sin(2 * math.Pi * (float64(h)/curves.HoursPY - 0.3))
		day := math.Sin(2 * math.Pi * (float64(h%24) - 9) / 24)
		out[h] = design * curves.Flow(0.6+0.22*season+0.13*day)
	}
	return out
}

// benchPointPlant is the plant of the single-point benchmarks, small enough
// for the brute-force reference: 2 large units and 1 medium.
func benchPointPlant(b *testing.B) (*plant.Plant, curves.Flow) {
	p := suitePlantNamed(b, "two-sizes")
	return p, 0.16 // m³/s, two or three units running
}

func BenchmarkSolvePoint(b *testing.B) {
	p, q := benchPointPlant(b)
	s := optimize.New(p, optimize.Options{})
	ref := refSolve(p, q, false)
	if r := s.Solve(q); r.Status != optimize.Served || !ref.Feasible ||
		math.Abs(float64(r.Power/ref.Power)-1) > suiteTol {
		b.Fatalf("solver %v %.6g W and reference %v %.6g W disagree", r.Status, float64(r.Power), ref.Feasible, float64(ref.Power))
	}
	b.ReportAllocs()
	b.ResetTimer()
	for b.Loop() {
		s.Solve(q)
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "points/s")
}

func BenchmarkReferencePoint(b *testing.B) {
	p, q := benchPointPlant(b)
	b.ReportAllocs()
	for b.Loop() {
		refSolve(p, q, false)
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "points/s")
}

func BenchmarkSolvePoint8Units(b *testing.B) {
	p := benchPlant8(b)
	s := optimize.New(p, optimize.Options{})
	q := 0.6 * p.DesignFlow
	if r := s.Solve(q); r.Status != optimize.Served {
		b.Fatalf("unmet: %s", r.Reason)
	}
	b.ReportAllocs()
	for b.Loop() {
		s.Solve(q)
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "points/s")
}

func benchYearRun(b *testing.B, opt optimize.Options) {
	p := benchPlant8(b)
	s := optimize.New(p, opt)
	loads := benchYear(p.DesignFlow)
	b.ReportAllocs()
	for b.Loop() {
		var energy float64
		for _, q := range loads {
			r := s.Solve(q)
			if r.Status != optimize.Served {
				b.Fatalf("load %.4g m³/s unmet: %s", float64(q), r.Reason)
			}
			energy += float64(r.Power) // W × 1 h
		}
		_ = energy
	}
	b.ReportMetric(float64(b.N*len(loads))/b.Elapsed().Seconds(), "points/s")
}

// BenchmarkSolveYear solves 8760 hourly points on the 8-unit plant.
func BenchmarkSolveYear(b *testing.B) { benchYearRun(b, optimize.Options{}) }

// BenchmarkSolveYearCommonSpeed is the same year with one common speed.
func BenchmarkSolveYearCommonSpeed(b *testing.B) {
	benchYearRun(b, optimize.Options{CommonSpeed: true})
}

// benchPlant8Corrected is benchPlant8 with the Sârbu–Borza step-down on,
// as plant files have it by default.
func benchPlant8Corrected(t testing.TB) *plant.Plant {
	on := func(m suiteModel) suiteModel { m.pump.speedCorrection = true; return m }
	return suitePlant{name: "eight-units-corrected", system: dp(0.45, 30, 0.4), models: []suiteModel{
		on(suiteModel{name: "L", count: 3, pump: pumpL, motorHP: 60}),
		on(suiteModel{name: "M", count: 3, pump: pumpM, motorHP: 30}),
		on(suiteModel{name: "S", count: 2, pump: pumpS, motorHP: 15}),
	}}.build(t)
}

// benchPlant24 is an invented 24-unit plant of 6 models, 4 units each
// (15,624 count vectors, above the plant file's cap of 800: the solver
// itself takes it), with the step-down on.
func benchPlant24(t testing.TB) *plant.Plant {
	on := func(m suiteModel, name string, shutoff, dEff float64) suiteModel {
		m.name, m.count = name, 4
		m.pump.speedCorrection = true
		m.pump.shutoff, m.pump.bepEff = shutoff, m.pump.bepEff+dEff
		return m
	}
	L := suiteModel{pump: pumpL, motorHP: 60}
	M := suiteModel{pump: pumpM, motorHP: 30}
	S := suiteModel{pump: pumpS, motorHP: 15}
	return suitePlant{name: "twenty-four-units", system: dp(0.75, 30, 0.4), models: []suiteModel{
		on(L, "L", 0, 0), on(M, "M", 0, 0), on(S, "S", 0, 0),
		on(L, "L-steep", 1.4, -0.03), on(M, "M-flat", 1.12, -0.02), on(S, "S-steep", 1.4, -0.03),
	}}.build(t)
}

func benchYearOf(b *testing.B, p *plant.Plant, opt optimize.Options, loads []curves.Flow) {
	s := optimize.New(p, opt)
	b.ReportAllocs()
	for b.Loop() {
		for _, q := range loads {
			if r := s.Solve(q); r.Status != optimize.Served {
				b.Fatalf("load %.4g m³/s unmet: %s", float64(q), r.Reason)
			}
		}
	}
	b.ReportMetric(float64(b.N*len(loads))/b.Elapsed().Seconds(), "points/s")
}

// BenchmarkSolveYearCorrected is the 8-unit year with the speed correction
// on (the plant files' default).
func BenchmarkSolveYearCorrected(b *testing.B) {
	p := benchPlant8Corrected(b)
	benchYearOf(b, p, optimize.Options{}, benchYear(p.DesignFlow))
}

// BenchmarkSolveYear24 is an hourly year of the 24-unit, 6-model plant.
func BenchmarkSolveYear24(b *testing.B) {
	p := benchPlant24(b)
	benchYearOf(b, p, optimize.Options{}, benchYear(p.DesignFlow))
}
