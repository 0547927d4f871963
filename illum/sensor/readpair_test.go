package sensor

import (
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// ReadPair gives, bit for bit, the two readings of Read without and with the
// albedo from one state of the noise stream, and leaves the stream where one
// Read leaves it (closed form of its definition), on drawn units with
// realistic errors (hobby-grade photodiode chain: common practice, no
// source), with saturation, clipping at zero and quantisation reached.
func TestCosineReadPairEqualsTwoReads(t *testing.T) {
	errs := Errors{MisalignSigma: 0.5 * deg, DarkSigma: 0.01, GainSigma: 0.03, NoiseSigma: 0.02, ADCBits: 10, FullScale: 1.1}
	arr := cube(t, errs)
	draw := rand.New(rand.NewPCG(1, 2))
	pick := rand.New(rand.NewPCG(3, 4))
	src := rand.NewPCG(5, 6)
	noise := rand.New(src)
	var clipped, saturated, albedoOnly int
	for range 20 {
		unit := arr.Draw(draw)
		for _, s := range unit.Sensors() {
			c := s.(*Cosine)
			for range 200 {
				sun := r3.Unit(r3.Vec{X: pick.NormFloat64(), Y: pick.NormFloat64(), Z: pick.NormFloat64()})
				direct := 1361 * pick.Float64() * 1.2
				albIrr := 400 * pick.Float64()
				saved := *src
				wantNo := c.Read(sun, direct, Albedo{}, noise)
				*src = saved
				wantAlb := c.Read(sun, direct, Albedo{Irradiance: albIrr}, noise)
				after := *src
				*src = saved
				var gotNo, gotAlb Reading
				c.ReadPair(&gotNo, &gotAlb, sun, direct, albIrr, noise)
				if gotNo != wantNo || gotAlb != wantAlb {
					t.Fatalf("%s: ReadPair %+v / %+v, two Reads %+v / %+v", c.Name(), gotNo, gotAlb, wantNo, wantAlb)
				}
				if *src != after {
					t.Fatalf("%s: the noise stream ends elsewhere than after one Read", c.Name())
				}
				switch {
				case wantNo.Signal == 0:
					clipped++
				case wantAlb.Saturated:
					saturated++
				}
				if wantAlb.Valid && !wantNo.Valid {
					albedoOnly++
				}
			}
		}
	}
	if clipped == 0 || saturated == 0 || albedoOnly == 0 {
		t.Fatalf("cases not reached: clipped %d, saturated %d, valid only with albedo %d", clipped, saturated, albedoOnly)
	}
}
