package sim

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/illum/sky"
)

// TestViewerObstructionTestsAreHidden: the viewer's written-out mounting
// plane (hider) and the short path of the sensors whose cone lies wholly
// above their plane (inFront) give, direction by direction, what the
// obstruction tests themselves say: Blocked[i].Hidden for the sun and
// Viewers[i].Sees for the view (the same rule, closed form). The cases
// cover cones above, across and touching the plane, obstacles and none.
func TestViewerObstructionTestsAreHidden(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 22))
	unit := func() r3.Vec {
		return r3.Unit(r3.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64(), Z: rng.NormFloat64()})
	}
	box := []sky.Obstacle{sky.Box{Centre: r3.Vec{Z: -0.05}, Half: r3.Vec{X: 0.05, Y: 0.05, Z: 0.05}}}
	beside := []sky.Obstacle{box[0], sky.Box{Centre: r3.Vec{X: 0.1, Z: 0.05}, Half: r3.Vec{X: 0.03, Y: 0.03, Z: 0.03}}}
	type mount = viewerMount
	tilt := func(deg float64) r3.Vec {
		return r3.Vec{X: math.Sin(deg * math.Pi / 180), Z: math.Cos(deg * math.Pi / 180)}
	}
	mounts := []mount{
		{bore: r3.Vec{Z: 1}, face: r3.Vec{Z: 1}, halfDeg: 60, short: true},
		{bore: tilt(20), face: r3.Vec{Z: 1}, halfDeg: 60, short: true},                     // edge 10° above the plane
		{bore: tilt(40), face: r3.Vec{Z: 1}, halfDeg: 60},                                  // across the plane
		{bore: tilt(30), face: r3.Vec{Z: 1}, halfDeg: 60},                                  // edge on the plane
		{bore: tilt(29.99), face: r3.Vec{Z: 1}, halfDeg: 60},                               // edge 0.01° above: within the margin
		{bore: r3.Vec{Z: 1}, face: r3.Vec{Z: 1}, halfDeg: 89.99},                           // nearly flat
		{bore: r3.Vec{Z: 1}, face: r3.Vec{Z: 1}, halfDeg: 60, obstacles: box, short: true}, // on the box's face
		{bore: r3.Vec{Z: 1}, face: r3.Vec{Z: 1}, halfDeg: 80, obstacles: beside},           // a box beside it
		{bore: unit(), halfDeg: 70, short: true},                                           // no plane
	}
	var ss []sensor.Sensor
	for i, m := range mounts {
		ss = append(ss, cosineAt(t, fmt.Sprintf("c%d", i), m.bore, m.halfDeg))
	}
	arr, err := sensor.NewArray(ss...)
	if err != nil {
		t.Fatal(err)
	}
	// Three ways of giving the views: a function (the call path), a
	// sensor.SunView with the obstruction test also in Blocked (the one
	// comparison, the step's own blocked flag), and a SunView without
	// Blocked (the comparison and the viewer's own hider).
	for way := range 3 {
		cfg := Config{Array: arr}
		for i, m := range mounts {
			s := arr.Sensors()[i]
			var view sky.Viewer = sky.ViewerFunc(s.SeesSun)
			if way > 0 {
				view = sensor.SunView{Sensor: s}
			}
			cfg.Viewers = append(cfg.Viewers, &sky.Obstructed{View: view, Face: m.face, Obstacles: m.obstacles})
			if way < 2 {
				cfg.Blocked = append(cfg.Blocked, &sky.Obstructed{Face: m.face, Obstacles: m.obstacles})
			}
		}
		t.Run(fmt.Sprint("way", way), func(t *testing.T) { checkViewer(t, rng, &cfg, mounts, way > 0) })
	}
}

type viewerMount struct {
	bore, face r3.Vec
	halfDeg    float64
	obstacles  []sky.Obstacle
	short      bool // the viewer may skip the plane test
}

func checkViewer(t *testing.T, rng *rand.Rand, cfg *Config, mounts []viewerMount, oneComparison bool) {
	unit := func() r3.Vec {
		return r3.Unit(r3.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64(), Z: rng.NormFloat64()})
	}
	arr := cfg.Array
	vw := newViewer(cfg, arr)
	for i := range mounts {
		if got := !math.IsNaN(vw.seenFrom[i]); got != oneComparison {
			t.Errorf("sensor %d: one comparison %v, want %v", i, got, oneComparison)
		}
		if oneComparison && vw.sameBlocked[i] != (cfg.Blocked != nil) {
			t.Errorf("sensor %d: same blocked test %v with Blocked %v", i, vw.sameBlocked[i], cfg.Blocked != nil)
		}
	}
	for i, m := range mounts {
		short := !mayBlock(cfg.Viewers[i].(*sky.Obstructed)) && inFront(vw.cone[i].Axis, m.face, vw.outside[i])
		if short != m.short {
			t.Errorf("sensor %d: short path %v, want %v", i, short, m.short)
		}
	}
	seen, hidden := make([]int, len(mounts)), make([]int, len(mounts))
	for k := range 200000 {
		d := unit()
		if k%2 == 0 {
			// Near the cone's edge or the plane, where the tests turn.
			m := mounts[k/2%len(mounts)]
			axis, edge := m.bore, m.halfDeg*math.Pi/180
			if k%4 == 0 && m.face != (r3.Vec{}) {
				axis, edge = m.face, math.Pi/2
			}
			d = onCone(axis, unit(), edge+(rng.Float64()-0.5)*1e-5)
		}
		g := stepGeom{region: illum.Sunlit, sunBody: d}
		v := vw.at(&g, nil, nil)
		for i := range mounts {
			if cfg.Blocked == nil {
				if want := cfg.Viewers[i].Sees(d); v.sees[i] != want {
					t.Fatalf("sensor %d, sun %v: sees %v, Sees %v", i, d, v.sees[i], want)
				}
				if v.sees[i] {
					seen[i]++
				}
				if cfg.Viewers[i].(*sky.Obstructed).Hidden(d) {
					hidden[i]++
				}
				continue
			}
			if want := cfg.Blocked[i].Hidden(d); v.sunBlocked[i] != want {
				t.Fatalf("sensor %d, sun %v: blocked %v, Hidden %v", i, d, v.sunBlocked[i], want)
			}
			if want := cfg.Viewers[i].Sees(d); v.sees[i] != want {
				t.Fatalf("sensor %d, sun %v: sees %v, Sees %v", i, d, v.sees[i], want)
			}
			if v.sees[i] {
				seen[i]++
			}
			if v.sunBlocked[i] {
				hidden[i]++
			}
		}
	}
	for i := range mounts {
		if seen[i] == 0 || hidden[i] == 0 && mounts[i].face != (r3.Vec{}) {
			t.Errorf("sensor %d: cases not reached: seen %d, hidden %d", i, seen[i], hidden[i])
		}
	}
}

// onCone returns the unit direction at angle a from the unit axis, toward
// the side of the direction w.
func onCone(axis, w r3.Vec, a float64) r3.Vec {
	p := r3.Sub(w, r3.Scale(r3.Dot(w, axis), axis))
	if r3.Norm(p) < 1e-6 {
		return axis
	}
	p = r3.Unit(p)
	return r3.Add(r3.Scale(math.Cos(a), axis), r3.Scale(math.Sin(a), p))
}
