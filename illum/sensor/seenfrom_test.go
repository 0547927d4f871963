package sensor

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// TestSeenFromCosineIsSeesSun: the one comparison with the least cosine
// seen gives SeesSun's answer bit for bit, on random directions, on
// directions at the cone edge and at the threshold, for half-angles,
// thresholds and reference irradiances of every size (closed form: the
// test is SeesSun itself).
func TestSeenFromCosineIsSeesSun(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for trial := range 300 {
		half := (1 + rng.Float64()*89) * math.Pi / 180
		if trial%7 == 0 {
			half = math.Pi / 2
		}
		thr := []float64{0, 0.05, rng.Float64(), 0.9999999, 1.2}[trial%5]
		ref := []float64{0, 1361, 1000 + rng.Float64()*800}[trial%3]
		bore := randUnit(rng)
		m, err := VectorMount(bore, randUnit(rng))
		if err != nil {
			t.Fatal(err)
		}
		c, err := NewCosine(CosineSpec{Name: "c", Mount: m, HalfAngle: half, Threshold: thr, RefIrradiance: ref})
		if err != nil {
			t.Fatal(err)
		}
		cmin, ok := c.SeenFromCosine()
		if !ok {
			t.Fatal("no roll-off: want ok")
		}
		b := c.Mount().Boresight()
		check := func(d r3.Vec) {
			if got, want := r3.Dot(b, d) >= cmin, c.SeesSun(d); got != want {
				t.Fatalf("half %g°, threshold %g, ref %g: d·b = %v ≥ %v is %v, SeesSun %v", half*180/math.Pi, thr, ref, r3.Dot(b, d), cmin, got, want)
			}
		}
		for range 200 {
			check(randUnit(rng))
		}
		// Directions whose cosine lies within a few ulps of the least one.
		x, _, _ := m.Axes()
		if !math.IsInf(cmin, 1) {
			for k := -20; k <= 20; k++ {
				ct := math.Min(1, math.Float64frombits(uint64(int64(math.Float64bits(cmin))+int64(k))))
				st := math.Sqrt(math.Max(0, 1-ct*ct))
				check(r3.Add(r3.Scale(ct, b), r3.Scale(st, x)))
			}
		}
	}
}

func randUnit(rng *rand.Rand) r3.Vec {
	v := r3.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64(), Z: rng.NormFloat64()}
	return r3.Scale(1/r3.Norm(v), v)
}

// TestSeenFromCosineRefusesRollOff: a roll-off response need not grow
// with the cosine, so there is no single least cosine.
func TestSeenFromCosineRefusesRollOff(t *testing.T) {
	m, _ := VectorMount(r3.Vec{Z: 1}, r3.Vec{X: 1})
	c, err := NewCosine(CosineSpec{Name: "c", Mount: m, HalfAngle: 1, RollOffAngle: []float64{0, 1}, RollOffRel: []float64{1, 0.5}})
	if err != nil {
		t.Fatal(err)
	}
	if _, ok := c.SeenFromCosine(); ok {
		t.Fatal("roll-off: want not ok")
	}
}
