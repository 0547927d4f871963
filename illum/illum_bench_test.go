package illum

import (
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

func BenchmarkShadowConical(b *testing.B) {
	sun := r3.Vec{X: 1.496e8, Y: 1e6}
	sat := r3.Vec{X: -3000, Y: 6350, Z: 100}
	var sum float64
	for b.Loop() {
		lit, _ := ShadowConical(sat, sun)
		sum += lit
	}
	_ = sum
}

func BenchmarkShadowCylindrical(b *testing.B) {
	sun := r3.Vec{X: 1.496e8, Y: 1e6}
	sat := r3.Vec{X: -3000, Y: 6350, Z: 100}
	var sum float64
	for b.Loop() {
		sum += ShadowCylindrical(sat, sun)
	}
	_ = sum
}

func benchmarkFindEclipses(b *testing.B, step float64) {
	orb := sso(550, 10.5)
	g := func(t float64) (r3.Vec, r3.Vec) { return orb.pos(t), almanacSun(t) }
	var f Finder
	var buf []Eclipse
	for b.Loop() {
		buf = f.Append(buf[:0], g, 0, 86400, step)
	}
}

func BenchmarkFindEclipsesDay60s(b *testing.B)  { benchmarkFindEclipses(b, 60) }
func BenchmarkFindEclipsesDay10s(b *testing.B)  { benchmarkFindEclipses(b, 10) }
func BenchmarkFindEclipsesDay300s(b *testing.B) { benchmarkFindEclipses(b, 300) }

func BenchmarkYearTable365(b *testing.B) {
	orb := sso(550, 10.5)
	g := func(t float64) (r3.Vec, r3.Vec) { return orb.pos(t), almanacSun(t) }
	for b.Loop() {
		YearTable(Conical, g, orb.normal, 0, 365, orb.period())
	}
}
