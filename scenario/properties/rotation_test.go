package properties

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/num/quat"
	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/randscenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// bodyTurn is a rotation of the body frame that maps body axes to body axes
// (a product of quarter turns), so that faces, law axes and obstruction
// boxes stay expressible in the scenario file.
type bodyTurn struct{ q quat.Number }

// quarterTurns returns the product of quarter turns about X, Y, Z chosen
// by the digits of k (0–3 quarter turns each).
func quarterTurns(k int) bodyTurn {
	q := quat.Number{Real: 1}
	for i, axis := range []r3.Vec{{X: 1}, {Y: 1}, {Z: 1}} {
		n := (k >> (2 * i)) & 3
		q = quat.Mul(smallRotation(axis, float64(n)*math.Pi/2), q)
	}
	return bodyTurn{q}
}

func (b bodyTurn) vec(v r3.Vec) r3.Vec { return r3.Rotation(b.q).Rotate(v) }

func (b bodyTurn) slice(v []float64) []float64 {
	if v == nil {
		return nil
	}
	w := b.vec(r3.Vec{X: v[0], Y: v[1], Z: v[2]})
	return []float64{roundTo(w.X, 12), roundTo(w.Y, 12), roundTo(w.Z, 12)}
}

func roundTo(v float64, digits int) float64 {
	s := math.Pow(10, float64(digits))
	return math.Round(v*s) / s
}

// axis turns a face name.
func (b bodyTurn) axis(face string) string {
	if face == "" {
		return ""
	}
	n, _ := faceNormal(face)
	w := b.vec(n)
	for _, f := range randscenario.Faces {
		m, _ := faceNormal(f)
		if r3.Dot(m, w) > 0.5 {
			return f
		}
	}
	panic("not a quarter turn")
}

// defaultToward repeats the file's documented default tilt direction of a
// face: +Z for the side faces, +X for the ±Z faces.
func defaultToward(face string) string {
	if face[1] == 'Z' {
		return "+X"
	}
	return "+Z"
}

// law turns an attitude law; ok is false for laws a turned file cannot
// express (random laws, Euler angles, nadir offsets).
func (b bodyTurn) law(l *randscenario.Law) bool {
	switch l.Law {
	case "":
		return l.InSunlight != nil && b.law(l.InSunlight) && b.law(l.InEclipse)
	case "nadir":
		if l.RollOffsetDeg != nil {
			return false
		}
	case "inertial", "spin":
		if l.Quaternion == nil {
			return false
		}
		// The body ← ECI attitude becomes turn ∘ attitude.
		q := quat.Mul(b.q, quat.Number{Real: l.Quaternion[0], Imag: l.Quaternion[1], Jmag: l.Quaternion[2], Kmag: l.Quaternion[3]})
		l.Quaternion = []float64{q.Real, q.Imag, q.Jmag, q.Kmag}
	case "sun":
	default:
		return false
	}
	l.PointAxis, l.AlignAxis, l.SpinAxis = b.axis(l.PointAxis), b.axis(l.AlignAxis), b.axis(l.SpinAxis)
	return true
}

// file turns the whole body of a scenario file: sensors, obstructions and
// the attitude. ok is false when the file cannot be turned exactly.
func (b bodyTurn) file(f *randscenario.File) bool {
	if !b.law(&f.Attitude) || f.Body.FormFactor != "" {
		return false // a named form factor has fixed axes
	}
	if h := b.slice(f.Body.SizeM); h != nil {
		f.Body.SizeM = []float64{math.Abs(h[0]), math.Abs(h[1]), math.Abs(h[2])}
	}
	for i := range f.Body.Sensors {
		s := &f.Body.Sensors[i]
		if s.Errors != nil {
			// A misalignment draw is a fixed vector in sensor axes:
			// turned with the sensor only for face mounts.
			if s.Face == "" && s.Errors.MisalignmentDeg1Sigma != 0 {
				return false
			}
		}
		if s.Face != "" {
			if s.TiltToward == "" {
				s.TiltToward = defaultToward(s.Face)
			}
			s.Face, s.TiltToward = b.axis(s.Face), b.axis(s.TiltToward)
		} else {
			// A boresight mount picks its own reference axis, which does
			// not turn with the body: only sensors symmetric about their
			// boresight can be turned.
			if s.Kind != "cosine" {
				return false
			}
			s.Boresight = b.slice(s.Boresight)
		}
		s.PositionM = b.slice(s.PositionM)
	}
	for i := range f.Body.Obstructions {
		o := &f.Body.Obstructions[i]
		o.CentreM, o.FromM, o.ToM = b.slice(o.CentreM), b.slice(o.FromM), b.slice(o.ToM)
		if h := b.slice(o.HalfExtentsM); h != nil {
			o.HalfExtentsM = []float64{math.Abs(h[0]), math.Abs(h[1]), math.Abs(h[2])}
		}
	}
	return true
}

// Rotating the layout with the attitude leaves coverage, peak signals and
// errors unchanged (the physics does not know the names of the body axes).
func checkRotation(c *runCase) failures {
	return inMountingPlane(c, rotation(c, c.b.file.Clone()))
}

func rotation(c *runCase, g *randscenario.File) (f failures) {
	// Make the default tilt direction explicit in the original too.
	for i := range g.Body.Sensors {
		if s := &g.Body.Sensors[i]; s.Face != "" && s.TiltToward == "" {
			s.TiltToward = defaultToward(s.Face)
		}
	}
	turn := quarterTurns(1 + int(c.b.s.Seed)%63)
	h := g.Clone()
	if !turn.file(h) {
		return nil
	}
	_, a := c.rerun(func(b *built) bool { c.rebuild(b, g); return true })
	_, r := c.rerun(func(b *built) bool { c.rebuild(b, h); return true })
	for u := range a.Units {
		x, y := a.Units[u], r.Units[u]
		n := float64(sunlitSamples(x))
		if n == 0 {
			continue
		}
		shareDiffs(&f, fmt.Sprintf("unit %d turned", u), x, y, 1/n)
		for i := range x.Sensors {
			p, q := x.Sensors[i].PeakSignal, y.Sensors[i].PeakSignal
			if math.Abs(p-q) > 1e-9*math.Max(1, math.Abs(p)) {
				f.addf("unit %d sensor %s: peak signal %.12g, turned %.12g", u, x.Sensors[i].Name, p, q)
			}
		}
		for i := range x.Estimators {
			for label, s := range statsOf(&x.Estimators[i]) {
				t := statsOf(&y.Estimators[i])[label]
				if !sameStats(s, t) {
					f.addf("unit %d %s %s: %+v, turned %+v", u, x.Estimators[i].Name, label, s, t)
				}
			}
		}
	}
	return f
}

// sameStats compares error statistics up to rounding: counts within one
// sample of an edge case, quantiles within one histogram bin (0.2 %).
func sameStats(a, b sim.ErrorStats) bool {
	if a.N == 0 || b.N == 0 {
		return a.N == b.N || max(a.N, b.N) <= 1
	}
	close := func(x, y, rel float64) bool { return math.Abs(x-y) <= rel*math.Max(math.Abs(x), math.Abs(y))+1e-7 }
	return abs(a.N-b.N) <= 1 && close(a.P50Deg, b.P50Deg, 3e-3) && close(a.P95Deg, b.P95Deg, 3e-3) &&
		close(a.P99Deg, b.P99Deg, 3e-3) && (abs(a.N-b.N) == 1 || close(a.MeanDeg, b.MeanDeg, 1e-6) && close(a.MaxDeg, b.MaxDeg, 1e-6))
}

func abs(n int) int {
	if n < 0 {
		return -n
	}
	return n
}

// A spin at zero rate is the inertial law at the spin's starting attitude
// (definition: the starting attitude is the whole attitude at t = 0).
func checkSpinAtRest(c *runCase) (f failures) {
	l := c.b.file.Attitude
	if l.Law != "spin" {
		return nil
	}
	spin := c.b.file.Clone()
	zero := 0.0
	spin.Attitude.RateDegS = &zero
	inertial := c.b.file.Clone()
	inertial.Attitude = randscenario.Law{Law: "inertial", Quaternion: l.Quaternion, EulerDeg: l.EulerDeg, EulerSequence: l.EulerSequence}
	_, a := c.rerun(func(b *built) bool { c.rebuild(b, spin); return true })
	_, r := c.rerun(func(b *built) bool { c.rebuild(b, inertial); return true })
	shareDiffs(&f, "spin at rate 0 vs inertial", a.Nominal, r.Nominal, 0)
	return f
}
