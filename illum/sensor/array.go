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
	bores := make([]r3.Vec, len(a.cosine))
	for k, i := range a.cosine {
		bores[k] = sensors[i].Mount().Boresight()
	}
	var pp [][2]int
	pp, a.pairInv, a.pairOK = pairsOf(bores)
	for _, p := range pp {
		a.pairs = append(a.pairs, pair{plus: a.cosine[p[0]], minus: a.cosine[p[1]], axis: bores[p[0]]})
	}
	return a, nil
}

// pairsOf pairs the opposed boresights among bores, each with the first
// later one opposite it, and returns the pairs (indices into bores), the
// inverse of Σ a aᵀ over their axes a and whether it serves: at least three
// pairs whose axes are not coplanar (condition ≤ defaultMaxCondition).
func pairsOf(bores []r3.Vec) (pairs [][2]int, inv sym3, ok bool) {
	used := make([]bool, len(bores))
	for i, bi := range bores {
		if used[i] {
			continue
		}
		for j := i + 1; j < len(bores); j++ {
			if !used[j] && r3.Dot(bi, bores[j]) < -1+1e-9 {
				used[i], used[j] = true, true
				pairs = append(pairs, [2]int{i, j})
				break
			}
		}
	}
	var m sym3
	for _, p := range pairs {
		m.addOuter(bores[p[0]], 1)
	}
	if len(pairs) >= 3 {
		inv, ok = m.inverse(defaultMaxCondition)
	}
	return pairs, inv, ok
}

// OppositePairsPossible reports whether cosine sensors of these nominal
// boresights (unit, body axes) can give OppositePairs an estimate at all:
// at least three opposed pairs with axes that are not coplanar, as Array
// finds them.
func OppositePairsPossible(bores []r3.Vec) bool {
	_, _, ok := pairsOf(bores)
	return ok
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
