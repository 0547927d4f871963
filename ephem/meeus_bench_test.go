package ephem

import "testing"

func BenchmarkMeeusPosition(b *testing.B) {
	var s Sun = Meeus{}
	jd := 2460676.5
	for b.Loop() {
		u, d := s.Position(jd)
		sinkF += u.X + d
		jd += 1e-3
	}
}

func BenchmarkMoonPosition(b *testing.B) {
	jd := 2460676.5
	for b.Loop() {
		u, d := Moon{}.Position(jd)
		sinkF += u.X + d
		jd += 1e-3
	}
}
