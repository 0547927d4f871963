package power

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
)

func panel(n r3.Vec, a, eta, f float64) Panel {
	return Panel{Name: "p", Normal: r3.Unit(n), AreaM2: a, Efficiency: eta, PackingFactor: f}
}

// A panel facing the sun gives E·A·η·f exactly (closed form of the model).
func TestSunPointingClosedForm(t *testing.T) {
	p := panel(r3.Vec{X: 1, Y: 2, Z: -0.5}, 0.06, 0.295, 0.9)
	E := ephem.SolarIrradiance1AU * 0.73 // a partly lit disc
	got := p.Power(p.Normal, E)
	want := 0.06 * 0.295 * 0.9 * E
	if math.Abs(got-want) > 1e-12*want {
		t.Errorf("sun-pointing panel: %.15g W, want %.15g W", got, want)
	}
	t.Logf("sun-pointing panel: %.6f W (closed form %.6f W)", got, want)
}

// randomUnit draws a direction uniform on the sphere (Marsaglia 1972).
func randomUnit(rng *rand.Rand) r3.Vec {
	for {
		x, y := 2*rng.Float64()-1, 2*rng.Float64()-1
		s := x*x + y*y
		if s < 1 {
			q := 2 * math.Sqrt(1-s)
			return r3.Vec{X: x * q, Y: y * q, Z: 1 - 2*s}
		}
	}
}

// Cauchy's surface-area formula: a convex body's projected area averaged
// over isotropic directions is a quarter of its surface area. With a panel
// on every face (η = f = 1, E = 1 W/m²) the mean power is that area.
func TestCauchyMeanProjectedArea(t *testing.T) {
	box := func(x, y, z float64) []Panel {
		return []Panel{
			panel(r3.Vec{X: 1}, y*z, 1, 1), panel(r3.Vec{X: -1}, y*z, 1, 1),
			panel(r3.Vec{Y: 1}, x*z, 1, 1), panel(r3.Vec{Y: -1}, x*z, 1, 1),
			panel(r3.Vec{Z: 1}, x*y, 1, 1), panel(r3.Vec{Z: -1}, x*y, 1, 1),
		}
	}
	// A regular octahedron of edge a: 8 faces of √3/4·a², normals (±1,±1,±1)/√3.
	oct := func(a float64) []Panel {
		var ps []Panel
		for _, sx := range []float64{-1, 1} {
			for _, sy := range []float64{-1, 1} {
				for _, sz := range []float64{-1, 1} {
					ps = append(ps, panel(r3.Vec{X: sx, Y: sy, Z: sz}, math.Sqrt(3)/4*a*a, 1, 1))
				}
			}
		}
		return ps
	}
	for name, ps := range map[string][]Panel{"6U box": box(0.1, 0.2266, 0.366), "octahedron": oct(0.3)} {
		arr, err := NewArray(ps...)
		if err != nil {
			t.Fatal(err)
		}
		var surface float64
		for _, p := range ps {
			surface += p.AreaM2
		}
		rng := rand.New(rand.NewPCG(7, 19))
		const n = 400000
		var sum, sum2 float64
		for range n {
			p := arr.Power(randomUnit(rng), 1)
			sum += p
			sum2 += p * p
		}
		mean := sum / n
		se := math.Sqrt((sum2/n - mean*mean) / n)
		want := surface / 4
		if math.Abs(mean-want) > 4*se {
			t.Errorf("%s: mean projected area %.6g m², want S/4 = %.6g m² (±4σ = %.2g)", name, mean, want, 4*se)
		}
		t.Logf("%s: mean projected area %.6f m², S/4 = %.6f m², relative difference %.2e, standard error %.1e", name, mean, want, (mean-want)/want, se/want)
	}
}

// Properties: no power without light or behind the panel or when hidden;
// power linear in area and in efficiency.
func TestPowerProperties(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for range 2000 {
		n, s := randomUnit(rng), randomUnit(rng)
		a, eta, f := 0.01+rng.Float64(), 0.05+0.9*rng.Float64(), 0.5+0.5*rng.Float64()
		E := 1400 * rng.Float64()
		p := panel(n, a, eta, f)
		if got := p.Power(s, 0); got != 0 {
			t.Fatalf("umbra (E = 0): %g W", got)
		}
		if r3.Dot(n, s) <= 0 && p.Power(s, E) != 0 {
			t.Fatalf("sun behind the panel: %g W", p.Power(s, E))
		}
		base := p.Power(s, E)
		k := 0.1 + 3*rng.Float64()
		pa := panel(n, k*a, eta, f)
		pe := panel(n, a, math.Min(1, k*eta), f)
		if d := pa.Power(s, E) - k*base; math.Abs(d) > 1e-12*(1+base) {
			t.Fatalf("area ×%g: %g W, want %g W", k, pa.Power(s, E), k*base)
		}
		if d := pe.Power(s, E) - math.Min(1, k*eta)/eta*base; math.Abs(d) > 1e-12*(1+base) {
			t.Fatalf("efficiency ×%g: %g W, want %g W", k, pe.Power(s, E), k*base)
		}
		p.LitShare = func(r3.Vec) float64 { return 0 }
		if p.Power(s, E) != 0 {
			t.Fatal("hidden panel gives power")
		}
		h := rng.Float64()
		p.LitShare = func(r3.Vec) float64 { return h }
		if d := p.Power(s, E) - h*base; math.Abs(d) > 1e-12*(1+base) {
			t.Fatalf("lit share %g: %g W, want %g W", h, p.Power(s, E), h*base)
		}
	}
}

func TestValidateRefuses(t *testing.T) {
	for _, p := range []Panel{
		panel(r3.Vec{X: 1}, 0, 0.3, 0.9), panel(r3.Vec{X: 1}, 0.1, 0, 0.9), panel(r3.Vec{X: 1}, 0.1, 1.2, 0.9),
		panel(r3.Vec{X: 1}, 0.1, 0.3, 0), panel(r3.Vec{X: 1}, 0.1, 0.3, 1.5), {Name: "n", Normal: r3.Vec{X: 2}, AreaM2: 1, Efficiency: 0.3, PackingFactor: 1},
	} {
		if _, err := NewArray(p); err == nil {
			t.Errorf("panel %+v accepted", p)
		}
	}
	if _, err := NewArray(); err == nil {
		t.Error("empty array accepted")
	}
}

// A square wave (sunlit 60 min at 10 W, eclipse 35 min) over 3 orbits and a
// bit: the orbit figures follow by hand.
func TestTrackerSquareWave(t *testing.T) {
	const step, period = 10.0, 95 * 60.0
	dur := 3*period + 1200
	k := NewTracker(step, period, dur)
	for i := 0; float64(i)*step < dur; i++ {
		tt := float64(i) * step
		p := 0.0
		if math.Mod(tt, period) < 3600 {
			p = 10
		}
		k.Add(tt, p)
	}
	s := k.Finish()
	if s.Orbits != 3 || math.Abs(s.OrbitMeanWh-10) > 1e-9 || math.Abs(s.OrbitWorstWh-10) > 1e-9 {
		t.Errorf("orbits %d, mean %g Wh, worst %g Wh; want 3, 10, 10", s.Orbits, s.OrbitMeanWh, s.OrbitWorstWh)
	}
	if len(s.PerOrbitW) != 3 || math.Abs(s.PerOrbitW[1]-10*3600/period) > 1e-9 {
		t.Errorf("per-orbit mean power %v W, want 3 orbits of %g W", s.PerOrbitW, 10*3600/period)
	}
	if s.PeakW != 10 || math.Abs(s.LongestNoPowerS-35*60) > 1e-9 {
		t.Errorf("peak %g W, longest no-power %g s; want 10 W, 2100 s", s.PeakW, s.LongestNoPowerS)
	}
	wantMean := 10 * (3*3600 + 1200) / dur
	if math.Abs(s.MeanW-wantMean) > 1e-9 || math.Abs(s.GapEnergyWh-wantMean*2100/3600) > 1e-9 {
		t.Errorf("mean %g W gap %g Wh; want %g W, %g Wh", s.MeanW, s.GapEnergyWh, wantMean, wantMean*2100/3600)
	}
}

func TestTrackerAllocatesNothing(t *testing.T) {
	k := NewTracker(1, 100, 1e6)
	arr, _ := NewArray(panel(r3.Vec{X: 1}, 0.1, 0.3, 0.9))
	i := 0.0
	if n := testing.AllocsPerRun(1000, func() { k.Add(i, arr.Power(r3.Vec{X: 1}, 1361)); i++ }); n != 0 {
		t.Errorf("%g allocations per step", n)
	}
}
