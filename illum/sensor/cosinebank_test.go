package sensor

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// The bank gives, bit for bit, each sensor's Read and ReadPair from the same
// noise stream and leaves the stream where the sensors' reads leave it
// (closed form of its definition: the same operations in the same order),
// on drawn units with realistic errors (hobby-grade photodiode chain: common
// practice, no source), cones of 50° to 90°, one sensor with a measured
// roll-off, blocked sensors, and clipping, saturation and quantisation
// reached.
func TestCosineBankEqualsReads(t *testing.T) {
	errs := Errors{MisalignSigma: 0.5 * deg, DarkSigma: 0.01, GainSigma: 0.03, NoiseSigma: 0.02, ADCBits: 10, FullScale: 1.1}
	var ss []Sensor
	for f := FacePlusX; f <= FaceMinusZ; f++ {
		m, err := FaceMount(f, 0, FaceNone, 0)
		if err != nil {
			t.Fatal(err)
		}
		spec := CosineSpec{Name: "css" + f.String(), Mount: m, HalfAngle: float64(50+8*(int(f)-int(FacePlusX))) * deg, Threshold: 0.02, Errors: errs}
		if f == FacePlusZ {
			spec.Threshold = 0 // valid is then "above 0" (CosineBank's validFrom)
		}
		if f == FacePlusY {
			spec.RollOffAngle, spec.RollOffRel = []float64{0, 40 * deg, 80 * deg}, []float64{1, 0.97, 0.6}
		}
		c, err := NewCosine(spec)
		if err != nil {
			t.Fatal(err)
		}
		ss = append(ss, c)
	}
	nominal, err := NewArray(ss...)
	if err != nil {
		t.Fatal(err)
	}
	draw := rand.New(rand.NewPCG(1, 2))
	pick := rand.New(rand.NewPCG(3, 4))
	src := rand.NewPCG(5, 6)
	noise := rand.New(src)
	n := nominal.Len()
	got, gotAlb := make([]Reading, n), make([]Reading, n)
	blocked := make([]bool, n)
	alb := make([]Albedo, n)
	var clipped, saturated, rolled, cut int
	for range 20 {
		unit := nominal.Draw(draw)
		var cs []*Cosine
		for _, s := range unit.Sensors() {
			cs = append(cs, s.(*Cosine))
		}
		bank := NewCosineBank(cs)
		if bank.Len() != n {
			t.Fatalf("bank of %d sensors for %d", bank.Len(), n)
		}
		for range 300 {
			sun := r3.Unit(r3.Vec{X: pick.NormFloat64(), Y: pick.NormFloat64(), Z: pick.NormFloat64()})
			direct := 1361 * pick.Float64() * 1.2
			for i := range n {
				blocked[i] = pick.IntN(5) == 0
				alb[i] = Albedo{Irradiance: 400 * pick.Float64()}
				if pick.IntN(3) == 0 {
					alb[i] = Albedo{} // none: the bank copies the reading without
				}
			}
			saved := *src
			bank.Read(got, sun, direct, blocked, noise)
			after := *src
			*src = saved
			for i, c := range cs {
				d := direct
				if blocked[i] {
					d = 0
					cut++
				}
				want := c.Read(sun, d, Albedo{}, noise)
				if got[i] != want {
					t.Fatalf("%s: bank %+v, Read %+v", c.Name(), got[i], want)
				}
				switch {
				case want.Signal == 0:
					clipped++
				case want.Saturated:
					saturated++
				}
				if i == 2 && want.Signal > 0.1 {
					rolled++
				}
			}
			if *src != after {
				t.Fatal("Read: the noise stream ends elsewhere than after the sensors' reads")
			}
			*src = saved
			bank.ReadPair(got, gotAlb, sun, direct, alb, blocked, noise)
			after = *src
			*src = saved
			for i, c := range cs {
				d := direct
				if blocked[i] {
					d = 0
				}
				var wantNo, wantAlb Reading
				c.ReadPair(&wantNo, &wantAlb, sun, d, alb[i].Irradiance, noise)
				if got[i] != wantNo || gotAlb[i] != wantAlb {
					t.Fatalf("%s: bank pair %+v / %+v, ReadPair %+v / %+v", c.Name(), got[i], gotAlb[i], wantNo, wantAlb)
				}
				// No albedo: the two readings are the same bits (the
				// engine then takes the estimate without albedo for both).
				if alb[i].Irradiance == 0 && (math.Float64bits(got[i].Signal) != math.Float64bits(gotAlb[i].Signal) || got[i] != gotAlb[i]) {
					t.Fatalf("%s: no albedo, yet %+v and %+v", c.Name(), got[i], gotAlb[i])
				}
			}
			if *src != after {
				t.Fatal("ReadPair: the noise stream ends elsewhere than after the sensors' reads")
			}
		}
	}
	if clipped == 0 || saturated == 0 || rolled == 0 || cut == 0 {
		t.Fatalf("cases not reached: clipped %d, saturated %d, roll-off lit %d, blocked %d", clipped, saturated, rolled, cut)
	}
}
