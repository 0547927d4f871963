package sensor

import (
	"math"
	"math/rand/v2"
	"testing"
)

// roundNonNeg equals math.Round on non-negative values: ties, the largest
// double below ½, values at and beyond 2⁵², +Inf, NaN, and ADC codes of
// random signals, −0 and fractions about ¼ and ½ (closed form: the same
// bits).
func TestRoundNonNegIsRound(t *testing.T) {
	xs := []float64{0, 0.5, 1.5, 2.5, 4095.5, math.Nextafter(0.5, 0), math.Nextafter(1.5, 2), 1 << 52, 1<<52 + 1, 1 << 53, 4503599627370495.5, math.MaxFloat64, math.Inf(1), math.SmallestNonzeroFloat64,
		math.Copysign(0, -1), 0.25, math.Nextafter(0.25, 0), 0.75, math.Nextafter(0.5, 1), 1e-300, 7.25, math.Nextafter(7.5, 0)}
	rng := rand.New(rand.NewPCG(3, 4))
	for range 1_000_000 {
		q := 1.5 / float64(uint64(1)<<(8+rng.IntN(9)))
		xs = append(xs, rng.Float64()*1.5/q, float64(rng.IntN(1<<16))+0.5, rng.Float64())
	}
	for _, x := range xs {
		if got, want := roundNonNeg(x), math.Round(x); math.Float64bits(got) != math.Float64bits(want) {
			t.Fatalf("roundNonNeg(%v) = %v, math.Round %v", x, got, want)
		}
	}
	if !math.IsNaN(roundNonNeg(math.NaN())) {
		t.Fatal("roundNonNeg(NaN) is not NaN")
	}
}
