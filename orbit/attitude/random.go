package attitude

import (
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/orbit"
)

// splitmix64 is the finaliser of SplitMix64 (Steele, Lea & Flood 2014,
// OOPSLA, from memory); it spreads nearby inputs over all 64 bits before
// they seed PCG.
func splitmix64(x uint64) uint64 {
	x += 0x9e3779b97f4a7c15
	x = (x ^ (x >> 30)) * 0xbf58476d1ce4e5b9
	x = (x ^ (x >> 27)) * 0x94d049bb133111eb
	return x ^ (x >> 31)
}

func newSource(seed, stream uint64) *rand.Rand {
	return rand.New(rand.NewPCG(splitmix64(seed), splitmix64(stream^0x5eed)))
}

// shoemake maps three uniform numbers on [0, 1) to a uniformly distributed
// unit quaternion (Shoemake 1992, "Uniform random rotations", Graphics
// Gems III, pp. 124–132, from memory).
func shoemake(u1, u2, u3 float64) r3.Rotation {
	a, b := math.Sqrt(1-u1), math.Sqrt(u1)
	s2, c2 := math.Sincos(2 * math.Pi * u2)
	s3, c3 := math.Sincos(2 * math.Pi * u3)
	return canonical(r3.Rotation{Real: b * c3, Imag: a * s2, Jmag: a * c2, Kmag: b * s3})
}

// UniformRotation returns a uniformly random rotation drawn from r.
func UniformRotation(r *rand.Rand) r3.Rotation {
	return shoemake(r.Float64(), r.Float64(), r.Float64())
}

// Isotropic draws an independent uniformly random attitude at each time,
// for statistics over the whole sphere of sun directions. The draw is a
// pure function of (Seed, t): the same seed and time always give the same
// attitude, so runs are reproducible and may be split across workers.
type Isotropic struct {
	Seed uint64
}

// Attitude implements Law.
func (l Isotropic) Attitude(t float64, _ orbit.State, _ r3.Vec) r3.Rotation {
	var p rand.PCG
	p.Seed(splitmix64(l.Seed), splitmix64(math.Float64bits(t)^splitmix64(l.Seed+1)))
	const scale = 1.0 / (1 << 53)
	u1 := float64(p.Uint64()>>11) * scale
	u2 := float64(p.Uint64()>>11) * scale
	u3 := float64(p.Uint64()>>11) * scale
	return shoemake(u1, u2, u3)
}
