package sensor

import (
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/spatial/r3"
)

// CosineBank reads a list of cosine sensors in one loop over plain values:
// each unit's drawn boresight, gain, dark offset and converter, copied out
// of the sensors once, so a step costs no interface call, no copy of the
// error model and no pointer chase per sensor. Its readings are, bit for
// bit, the ones each sensor's Read and ReadPair give from the same noise
// stream (TestCosineBankEqualsReads): the same operations in the same order.
type CosineBank struct {
	s []bankCosine
}

// bankCosine is one sensor of a bank.
type bankCosine struct {
	bx, by, bz float64 // drawn boresight, body axes
	cosHalf    float64
	gain       float64 // 1 + drawn relative gain mismatch
	ref        float64 // RefIrradiance, W/m²
	dark       float64 // drawn dark offset
	threshold  float64
	validFrom  float64 // v > 0 && v ≥ threshold ⇔ v ≥ validFrom, for threshold ≥ 0
	noiseSigma float64
	fullScale  float64 // 0: no saturation
	q          float64 // ADC step; 0: no ADC
	sensor     *Cosine // for a roll-off, which the bank leaves to the sensor
}

// NewCosineBank returns the bank of the sensors cs (drawn units or
// nominal ones), in their order.
func NewCosineBank(cs []*Cosine) *CosineBank {
	b := &CosineBank{s: make([]bankCosine, len(cs))}
	for i, c := range cs {
		bore := c.actual.Boresight()
		e := &c.spec.Errors
		s := bankCosine{bx: bore.X, by: bore.Y, bz: bore.Z, cosHalf: c.cosHalf, gain: 1 + c.unit.gain[0],
			ref: c.spec.RefIrradiance, dark: c.unit.dark[0], threshold: c.spec.Threshold,
			noiseSigma: e.NoiseSigma, fullScale: e.FullScale}
		s.validFrom = max(s.threshold, math.SmallestNonzeroFloat64)
		if e.ADCBits > 0 {
			s.q = e.FullScale / float64(uint64(1)<<e.ADCBits)
		}
		if c.rolloff != nil {
			s.sensor = c
		}
		b.s[i] = s
	}
	return b
}

// Len returns the number of sensors.
func (b *CosineBank) Len() int { return len(b.s) }

// cosine is the cosine of the angle between the drawn boresight and sun.
func (s *bankCosine) cosine(sun r3.Vec) float64 {
	return s.bx*sun.X + s.by*sun.Y + s.bz*sun.Z
}

// response is Cosine.response on the bank's values: inside the cone the
// cosine itself, the sensor's own response for a roll-off (responseAt, out
// of line, so that the common case is inlined in the loops).
func (s *bankCosine) response(ct float64) float64 {
	if s.sensor != nil {
		return s.responseAt(ct)
	}
	if ct > 0 && ct >= s.cosHalf {
		return ct
	}
	return 0
}

//go:noinline
func (s *bankCosine) responseAt(ct float64) float64 { return s.sensor.response(ct) }

// digitise is Errors.digitise on the bank's values.
func (s *bankCosine) digitise(v float64) (float64, bool) {
	sat := false
	// max(v, 0) is v < 0 ? 0 : v here, without a branch on a sign the
	// noise decides: v is never −0 (it is a sum with a +0 or a non-zero
	// term, which rounds to +0 when it is zero).
	v = max(v, 0)
	if s.fullScale > 0 && v >= s.fullScale {
		v, sat = s.fullScale, true
	}
	if s.q > 0 {
		v = roundNonNeg(v/s.q) * s.q
	}
	return v, sat
}

// set writes a cosine reading of signal v into r: the fields a cosine
// sensor gives. The others (Dir, Cells, Sigma) are zero for a cosine
// sensor and are left as they are: a bank reads into readings that only
// cosine readings or the zero Reading were written to, and then this is the
// whole-value write, without rewriting its 80 bytes at every step.
func (s *bankCosine) set(r *Reading, v float64, sat bool) {
	r.Signal, r.Valid, r.Saturated = v, v >= s.validFrom, sat
}

// Read fills dst[i] with sensor i's reading of the body-frame sun
// direction sun under the direct irradiance direct (W/m², already times the
// shadow fraction); blocked[i] (nil: none) cuts sensor i's direct light.
// Albedo is not read (see ReadPair).
func (b *CosineBank) Read(dst []Reading, sun r3.Vec, direct float64, blocked []bool, noise *rand.Rand) {
	for i := range b.s {
		s := &b.s[i]
		d := direct
		if blocked != nil && blocked[i] {
			d = 0
		}
		v := s.gain*(d*s.response(s.cosine(sun)))/s.ref + s.dark
		if noise != nil && s.noiseSigma > 0 {
			v += s.noiseSigma * noise.NormFloat64()
		}
		v, sat := s.digitise(v)
		s.set(&dst[i], v, sat)
	}
}

// ReadPair fills noAlb[i] and withAlb[i] with sensor i's readings without
// and with the albedo irradiance alb[i].Irradiance on one noise draw each
// (Cosine.ReadPair).
func (b *CosineBank) ReadPair(noAlb, withAlb []Reading, sun r3.Vec, direct float64, alb []Albedo, blocked []bool, noise *rand.Rand) {
	for i := range b.s {
		s := &b.s[i]
		d := direct
		if blocked != nil && blocked[i] {
			d = 0
		}
		e := d * s.response(s.cosine(sun))
		v0 := s.gain*e/s.ref + s.dark
		noisy := noise != nil && s.noiseSigma > 0
		var n float64
		if noisy {
			n = s.noiseSigma * noise.NormFloat64()
			v0 += n
		}
		v0, s0 := s.digitise(v0)
		s.set(&noAlb[i], v0, s0)
		a := alb[i].Irradiance
		if a == 0 {
			// e + 0 is e: e is a product of the direct irradiance (+0 or
			// more) and a response that is +0 or more, never −0. The
			// same value, digitised once.
			s.set(&withAlb[i], v0, s0)
			continue
		}
		v1 := s.gain*(e+a)/s.ref + s.dark
		if noisy {
			v1 += n
		}
		v1, s1 := s.digitise(v1)
		s.set(&withAlb[i], v1, s1)
	}
}
