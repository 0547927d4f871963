package orbit

import "testing"

func benchElements() Elements {
	i, _ := SunSyncInclination(RadiusEarthKm+550, 0.001)
	return Elements{RadiusEarthKm + 550, 0.001, i, 1, 2, 3}
}

func BenchmarkTwoBodyStateAt(b *testing.B) {
	p := NewTwoBody(benchElements())
	t := 0.0
	for b.Loop() {
		t += 10
		_ = p.StateAt(t)
	}
}

func BenchmarkJ2MeanStateAt(b *testing.B) {
	p := NewJ2Mean(benchElements())
	t := 0.0
	for b.Loop() {
		t += 10
		_ = p.StateAt(t)
	}
}

// One 10 s output step of the Cowell integrator (dense output between steps).
func BenchmarkJ2NumericStateAt(b *testing.B) {
	p, _ := NewJ2Numeric(benchElements(), NumericOptions{})
	t := 0.0
	for b.Loop() {
		t += 10
		_ = p.StateAt(t)
	}
}

// A year at 10 s: 3 155 760 states.
func BenchmarkJ2MeanFillYear(b *testing.B) {
	p := NewJ2Mean(benchElements())
	dst := make([]State, 3155760)
	for b.Loop() {
		p.Fill(dst, 0, 10)
	}
}

func BenchmarkEccentricAnomaly(b *testing.B) {
	M := 0.0
	for b.Loop() {
		M += 0.1
		_ = EccentricAnomaly(M, 0.7)
	}
}

func BenchmarkMeanToOsculating(b *testing.B) {
	el := benchElements()
	for b.Loop() {
		_ = MeanToOsculating(el)
	}
}
