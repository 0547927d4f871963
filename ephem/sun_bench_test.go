package ephem

import "testing"

var sinkF float64

func BenchmarkLowPrecisionPosition(b *testing.B) {
	var s Sun = LowPrecision{}
	jd := 2460676.5
	for b.Loop() {
		u, d := s.Position(jd)
		sinkF += u.X + d
		jd += 1e-3
	}
}

func BenchmarkGMST(b *testing.B) {
	jd := 2460676.5
	for b.Loop() {
		sinkF += GMST(jd)
		jd += 1e-3
	}
}

func BenchmarkMeanSunRA2000(b *testing.B) {
	jd := 2460676.5
	for b.Loop() {
		sinkF += MeanSunRA2000(jd)
		jd += 1e-3
	}
}
