package sensor

import (
	"fmt"
	"math/rand/v2"

	"gonum.org/v1/gonum/spatial/r3"
)

// Array is the set of sensors flown on one spacecraft, with what the
// estimators precompute from the nominal mounts.
type Array struct {
	sensors []Sensor
	cosine  []int // indices of cosine sensors
	pairs   []pair
	pairInv sym3 // (Σ a aᵀ)⁻¹ over the pair axes; valid when pairOK
	pairOK  bool
	twoAxis []int
}

type pair struct {
	plus, minus int
	axis        r3.Vec // boresight of the plus member
}

// NewArray checks that sensor names are unique and precomputes the opposed
// pairs of cosine sensors (nominal boresights opposite within 1e-9).
func NewArray(sensors ...Sensor) (*Array, error) {
	a := &Array{sensors: append([]Sensor(nil), sensors...)}
	seen := map[string]bool{}
	for i, s := range sensors {
		if s == nil {
			return nil, fmt.Errorf("sensor: array entry %d: nil sensor", i)
		}
		if seen[s.Name()] {
			return nil, fmt.Errorf("sensor: name %q used twice: give every sensor a unique name", s.Name())
		}
		seen[s.Name()] = true
		if IsTwoAxis(s) {
			a.twoAxis = append(a.twoAxis, i)
		} else {
			a.cosine = append(a.cosine, i)
		}
	}
	used := make([]bool, len(sensors))
	for ii, i := range a.cosine {
		if used[i] {
			continue
		}
		bi := sensors[i].Mount().Boresight()
		for _, j := range a.cosine[ii+1:] {
			if !used[j] && r3.Dot(bi, sensors[j].Mount().Boresight()) < -1+1e-9 {
				used[i], used[j] = true, true
				a.pairs = append(a.pairs, pair{plus: i, minus: j, axis: bi})
				break
			}
		}
	}
	var m sym3
	for _, p := range a.pairs {
		m.addOuter(p.axis, 1)
	}
	if len(a.pairs) >= 3 {
		a.pairInv, a.pairOK = m.inverse(defaultMaxCondition)
	}
	return a, nil
}

// Len is the number of sensors.
func (a *Array) Len() int { return len(a.sensors) }

// Sensors returns the sensors in order (do not modify).
func (a *Array) Sensors() []Sensor { return a.sensors }

// Pairs returns the names of the opposed cosine pairs (plus, minus).
func (a *Array) Pairs() [][2]string {
	out := make([][2]string, len(a.pairs))
	for i, p := range a.pairs {
		out[i] = [2]string{a.sensors[p.plus].Name(), a.sensors[p.minus].Name()}
	}
	return out
}

// Rows returns the mount table.
func (a *Array) Rows() []MountRow {
	out := make([]MountRow, len(a.sensors))
	for i, s := range a.sensors {
		out[i] = Row(s)
	}
	return out
}

// Draw returns one simulated unit of every sensor, drawn in order from rng.
func (a *Array) Draw(rng *rand.Rand) *Array {
	u := *a
	u.sensors = make([]Sensor, len(a.sensors))
	for i, s := range a.sensors {
		u.sensors[i] = s.Draw(rng)
	}
	return &u
}

// Read fills dst[i] with sensor i's reading. alb is nil (no albedo) or holds
// one entry per sensor. It panics if dst is shorter than Len or alb has the
// wrong length (a programming error). It allocates nothing.
func (a *Array) Read(dst []Reading, sun r3.Vec, direct float64, alb []Albedo, noise *rand.Rand) {
	if len(dst) < len(a.sensors) || (alb != nil && len(alb) != len(a.sensors)) {
		panic(fmt.Sprintf("sensor: Array.Read: dst has %d and alb %d entries for %d sensors", len(dst), len(alb), len(a.sensors)))
	}
	for i, s := range a.sensors {
		var al Albedo
		if alb != nil {
			al = alb[i]
		}
		if c, ok := s.(*Cosine); ok {
			c.readInto(&dst[i], sun, direct, al.Irradiance, noise)
			continue
		}
		dst[i] = s.Read(sun, direct, al, noise)
	}
}
