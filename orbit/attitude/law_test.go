package attitude

import (
	"math"
	"math/rand/v2"
	"sort"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/orbit"
)

// randomStates returns invented LEO-like states (demo data).
func randomStates(n int, seed uint64) []orbit.State {
	r := rand.New(rand.NewPCG(seed, 99))
	out := make([]orbit.State, n)
	for i := range out {
		rr := r3.Scale(6378+300+900*r.Float64(), r3.Unit(r3.Vec{X: r.NormFloat64(), Y: r.NormFloat64(), Z: r.NormFloat64()}))
		v := r3.Vec{X: r.NormFloat64(), Y: r.NormFloat64(), Z: r.NormFloat64()}
		out[i] = orbit.State{R: rr, V: r3.Scale(7.5, r3.Unit(v))}
	}
	return out
}

func randomUnit(r *rand.Rand) r3.Vec {
	return r3.Unit(r3.Vec{X: r.NormFloat64(), Y: r.NormFloat64(), Z: r.NormFloat64()})
}

func bodyToECI(a r3.Rotation, v r3.Vec) r3.Vec { return Inverse(a).Rotate(v) }

func TestNadirDefault(t *testing.T) {
	worstN, worstV := 0.0, 0.0
	for _, s := range randomStates(500, 1) {
		a := Nadir{}.Attitude(0, s, r3.Vec{})
		worstN = math.Max(worstN, r3.Norm(r3.Sub(a.Rotate(r3.Unit(r3.Scale(-1, s.R))), unitZ)))
		x := bodyToECI(a, unitX)
		worstV = math.Max(worstV, math.Abs(r3.Dot(x, r3.Unit(s.R))))
		// +X lies in the (r, v) plane on the velocity side.
		if math.Abs(r3.Dot(x, r3.Unit(r3.Cross(s.R, s.V)))) > tight || r3.Dot(x, s.V) <= 0 {
			t.Fatalf("+X not toward velocity in the orbit plane: %v", x)
		}
	}
	if worstN > tight || worstV > tight {
		t.Errorf("nadir axis error %g, velocity-axis radial component %g (want ≤ 1e-12)", worstN, worstV)
	}
	t.Logf("nadir axis worst %.3g, velocity axis radial %.3g", worstN, worstV)
}

// Circular orbit: +X along v exactly, +Y along −(r × v) (closed form LVLH).
func TestNadirCircularLVLH(t *testing.T) {
	s := orbit.State{R: r3.Vec{X: 7000}, V: r3.Vec{Y: 5, Z: 5}}
	a := Nadir{}.Attitude(0, s, r3.Vec{})
	if d := r3.Norm(r3.Sub(bodyToECI(a, unitX), r3.Unit(s.V))); d > tight {
		t.Errorf("+X off velocity by %g", d)
	}
	if d := r3.Norm(r3.Sub(bodyToECI(a, unitY), r3.Unit(r3.Cross(s.V, s.R)))); d > tight {
		t.Errorf("+Y off −h by %g", d)
	}
}

func TestNadirCustomAxesAndOffset(t *testing.T) {
	s := randomStates(1, 2)[0]
	n := Nadir{NadirAxis: r3.Vec{Y: -1}, VelocityAxis: unitZ}
	a := n.Attitude(0, s, r3.Vec{})
	if d := r3.Norm(r3.Sub(a.Rotate(r3.Unit(r3.Scale(-1, s.R))), r3.Vec{Y: -1})); d > tight {
		t.Errorf("−Y to nadir error %g", d)
	}
	// A 10° pitch offset (frame turn about +Y) tilts the nadir axis by 10°.
	off := FromEuler(Seq321, 0, 10*math.Pi/180, 0)
	b := Nadir{Offset: off}.Attitude(0, s, r3.Vec{})
	got := math.Acos(r3.Dot(b.Rotate(r3.Unit(r3.Scale(-1, s.R))), unitZ))
	if math.Abs(got-10*math.Pi/180) > 1e-12 {
		t.Errorf("offset tilt %g rad, want 10°", got)
	}
}

func TestSunPointing(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 8))
	states := randomStates(300, 3)
	worst := 0.0
	for i, s := range states {
		sun := randomUnit(r)
		for _, l := range []Sun{
			{},
			{Reference: TowardNadir, SunAxis: r3.Vec{X: -1}, SecondaryAxis: unitZ},
			{Reference: TowardInertial, InertialDir: unitZ},
			{SpinRate: 0.1, Phase: 0.3},
		} {
			a := l.Attitude(float64(i), s, sun)
			worst = math.Max(worst, r3.Norm(r3.Sub(a.Rotate(sun), orDefault(l.SunAxis, unitZ))))
		}
		// Default: +X in the plane of the sun and the orbit normal, on its side.
		a := Sun{}.Attitude(0, s, sun)
		x := bodyToECI(a, unitX)
		h := r3.Unit(r3.Cross(s.R, s.V))
		if math.Abs(r3.Dot(x, r3.Unit(r3.Cross(sun, h)))) > tight || r3.Dot(x, h) < 0 {
			t.Fatalf("+X not toward orbit normal: x=%v h=%v", x, h)
		}
	}
	if worst > tight {
		t.Errorf("sun axis worst error %g > 1e-12", worst)
	}
	t.Logf("sun axis worst error %.3g", worst)
	// β = 90°: orbit normal along the sun; a fallback keeps the result finite.
	s := orbit.State{R: r3.Vec{X: 7000}, V: r3.Vec{Y: 7.5}}
	a := Sun{}.Attitude(0, s, unitZ)
	if d := r3.Norm(r3.Sub(a.Rotate(unitZ), unitZ)); !(d < tight) {
		t.Errorf("degenerate reference: sun axis error %g", d)
	}
}

// Spin rate about the sun line: the attitude turns by rate·Δt.
func TestSunSpinRate(t *testing.T) {
	s := randomStates(1, 4)[0]
	l := Sun{SpinRate: 2 * math.Pi / 60}
	d := AngleBetween(l.Attitude(10, s, unitX), l.Attitude(12, s, unitX))
	if math.Abs(d-2*l.SpinRate) > 1e-12 {
		t.Errorf("turned %g rad in 2 s, want %g", d, 2*l.SpinRate)
	}
}

func TestSpinPeriod(t *testing.T) {
	l := Spin{Axis: r3.Vec{X: 1, Y: 2, Z: -0.5}, BodyAxis: unitX, Rate: 3 * math.Pi / 180, Phase: 0.4}
	period := 2 * math.Pi / l.Rate // 360° / rate
	a0 := l.Attitude(17, orbit.State{}, r3.Vec{})
	a1 := l.Attitude(17+period, orbit.State{}, r3.Vec{})
	if d := AngleBetween(a0, a1); d > 1e-9 {
		t.Errorf("after one period the attitude differs by %g rad", d)
	}
	half := l.Attitude(17+period/2, orbit.State{}, r3.Vec{})
	if d := AngleBetween(a0, half); math.Abs(d-math.Pi) > 1e-9 {
		t.Errorf("after half a period turned %g rad, want π", d)
	}
	if d := r3.Norm(r3.Sub(a0.Rotate(r3.Unit(l.Axis)), unitX)); d > tight {
		t.Errorf("spin axis error %g", d)
	}
}

func TestTumbleRates(t *testing.T) {
	maxRate := 10 * math.Pi / 180 // typical tip-off bound, common practice, no source
	var mags []float64
	for seed := range uint64(400) {
		l := NewTumble(seed, maxRate)
		w := r3.Norm(l.Rate)
		if w > maxRate {
			t.Fatalf("seed %d: rate %g > max %g", seed, w, maxRate)
		}
		mags = append(mags, w/maxRate)
		// Turned angle over a short step equals |ω|·Δt (closed form).
		dt := 0.5
		if d := AngleBetween(l.Attitude(3, orbit.State{}, r3.Vec{}), l.Attitude(3+dt, orbit.State{}, r3.Vec{})); math.Abs(d-w*dt) > 1e-12 {
			t.Fatalf("seed %d: turned %g, want %g", seed, d, w*dt)
		}
		// The rate vector is fixed in ECI too (rotation about itself).
		e0 := bodyToECI(l.Attitude(0, orbit.State{}, r3.Vec{}), l.Rate)
		e1 := bodyToECI(l.Attitude(100, orbit.State{}, r3.Vec{}), l.Rate)
		if d := r3.Norm(r3.Sub(e0, e1)); d > 1e-12 {
			t.Fatalf("seed %d: rate axis moved by %g in ECI", seed, d)
		}
	}
	// Magnitudes uniform on [0, 1]: KS against x (bound 1.63/√n, α = 0.01).
	if ks := ksStatistic(mags, func(x float64) float64 { return x }); ks > 1.63/math.Sqrt(float64(len(mags))) {
		t.Errorf("tumble rate magnitudes not uniform: KS D = %g", ks)
	}
	if NewTumble(42, maxRate) != NewTumble(42, maxRate) {
		t.Error("same seed gave different tumble")
	}
}

func ksStatistic(x []float64, cdf func(float64) float64) float64 {
	s := append([]float64(nil), x...)
	sort.Float64s(s)
	n := float64(len(s))
	d := 0.0
	for i, v := range s {
		f := cdf(v)
		d = math.Max(d, math.Max(float64(i+1)/n-f, f-float64(i)/n))
	}
	return d
}

// The rotation angle of a uniform random rotation has density
// (1 − cos θ)/π on [0, π], CDF (θ − sin θ)/π (closed form; Miles 1965,
// Biometrika 52, from memory). Kolmogorov–Smirnov with n = 20000 draws:
// the 0.1 % critical value is 1.95/√n ≈ 0.0138 (asymptotic KS table).
func TestIsotropicAngleDistribution(t *testing.T) {
	const n = 20000
	l := Isotropic{Seed: 2024}
	θs := make([]float64, n)
	for i := range θs {
		θs[i] = RotationAngle(l.Attitude(float64(i)*10, orbit.State{}, r3.Vec{}))
	}
	d := ksStatistic(θs, func(θ float64) float64 { return (θ - math.Sin(θ)) / math.Pi })
	bound := 1.95 / math.Sqrt(n)
	if d > bound {
		t.Errorf("KS D = %.4g > %.4g", d, bound)
	}
	t.Logf("rotation-angle KS D = %.4g (bound %.4g)", d, bound)
	// Directions of a body axis in ECI are uniform: mean of z ≈ 0, mean z² ≈ 1/3.
	var m1, m2 float64
	for i := range n {
		z := bodyToECI(l.Attitude(float64(i)+0.5, orbit.State{}, r3.Vec{}), unitZ).Z
		m1 += z / n
		m2 += z * z / n
	}
	if math.Abs(m1) > 4*math.Sqrt(1.0/3/n) || math.Abs(m2-1.0/3) > 4*math.Sqrt(4.0/45/n) {
		t.Errorf("body +Z not isotropic: <z> = %g, <z²> = %g", m1, m2)
	}
}

func TestIsotropicReproducible(t *testing.T) {
	a := Isotropic{Seed: 7}.Attitude(123.5, orbit.State{}, r3.Vec{})
	b := Isotropic{Seed: 7}.Attitude(123.5, orbit.State{}, r3.Vec{})
	c := Isotropic{Seed: 7}.Attitude(124.5, orbit.State{}, r3.Vec{})
	d := Isotropic{Seed: 8}.Attitude(123.5, orbit.State{}, r3.Vec{})
	if a != b {
		t.Error("same (seed, t) gave different attitudes")
	}
	if a == c || a == d {
		t.Error("different (seed, t) gave the same attitude")
	}
}

func TestSchedule(t *testing.T) {
	sc := Schedule{Sunlit: Sun{}, Eclipse: InertialFromEuler(Seq321, 0.1, 0.2, 0.3)}
	s := randomStates(1, 5)[0]
	sun := r3.Unit(r3.Vec{X: 1, Y: 1})
	lit := At(sc, 0, s, sun, false)
	ecl := At(sc, 0, s, sun, true)
	if lit != (Sun{}).Attitude(0, s, sun) {
		t.Error("sunlit branch not the Sun law")
	}
	if ecl != FromEuler(Seq321, 0.1, 0.2, 0.3) {
		t.Error("eclipse branch not the Inertial law")
	}
	if sc.Attitude(0, s, sun) != lit {
		t.Error("Attitude without flag should be the sunlit branch")
	}
	if At(Nadir{}, 0, s, sun, true) != (Nadir{}).Attitude(0, s, sun) {
		t.Error("At changed a law that ignores eclipses")
	}
}

// A spin built from a starting attitude starts there, keeps the body axis on
// one inertial direction, and has turned by |rate|·t about it (definition of
// a spin about a body axis): A(t) = R_b(rate·t) ∘ q0 as a frame rotation.
func TestSpinFromKeepsStartingAttitude(t *testing.T) {
	r := rand.New(rand.NewPCG(11, 12))
	for range 200 {
		q0 := randomRotation(r)
		b := r3.Unit(r3.Vec{X: r.NormFloat64(), Y: r.NormFloat64(), Z: r.NormFloat64()})
		rate := 0.2 * r.NormFloat64()
		l := SpinFrom(q0, b, rate)
		if d := sameRotation(l.Attitude(0, orbit.State{}, r3.Vec{}), q0); d > 1e-12 {
			t.Fatalf("start attitude off by %g rad", d)
		}
		for _, tt := range []float64{1, 10, 77} {
			a := l.Attitude(tt, orbit.State{}, r3.Vec{})
			want := then(q0, frameTurn(rate*tt, b))
			if d := sameRotation(a, want); d > 1e-9 {
				t.Fatalf("t = %g: attitude off by %g rad from the turn about the body axis", tt, d)
			}
		}
	}
}

// Nadir's matrix built directly from the axes is the matrix of its
// quaternion (closed form: the same rotation), for default, custom and
// offset body axes, to 1e-14.
func TestNadirRowsMatchAttitude(t *testing.T) {
	laws := []Nadir{{}, {NadirAxis: r3.Vec{X: 1}, VelocityAxis: r3.Vec{Y: -1}},
		{NadirAxis: r3.Vec{X: 0.3, Y: 0.2, Z: 0.9}, VelocityAxis: r3.Vec{X: 1, Z: -0.2}},
		{Offset: r3.Rotation{Real: math.Cos(0.1), Imag: math.Sin(0.1)}}}
	for li, law := range laws {
		for _, s := range randomStates(200, uint64(li)+7) {
			got := law.Rows(0, s, r3.Vec{X: 1})
			want := RowsOf(law.Attitude(0, s, r3.Vec{X: 1}))
			for i := range got {
				if d := r3.Norm(r3.Sub(got[i], want[i])); d > 1e-14 {
					t.Fatalf("law %d: row %d differs by %g: %v vs %v", li, i, d, got[i], want[i])
				}
			}
		}
	}
}

// The written-out nadir matrix is, bit for bit, the general path's
// (alignRows of the default axes) on random orbits from 200 km to GEO,
// retrograde and equatorial ones included (closed form: the same
// operations in the same order).
func TestNadirRowsWrittenOut(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	for k := range 20000 {
		r := r3.Scale(6578+rng.Float64()*40000, r3.Unit(r3.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64(), Z: rng.NormFloat64()}))
		v := r3.Scale(1+rng.Float64()*7, r3.Unit(r3.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64(), Z: rng.NormFloat64()}))
		if k%1000 == 0 {
			v = r3.Scale(2, r) // degenerate: velocity along the radius
		}
		got, okGot := nadirRows(r, v)
		want, okWant := alignRows(unitZ, r3.Scale(-1, r), unitX, v)
		if got != want || okGot != okWant {
			t.Fatalf("r %v v %v: written out %v (%v), general %v (%v)", r, v, got, okGot, want, okWant)
		}
		if m, ok := NadirRows(r, v); m != got || ok != okGot {
			t.Fatalf("r %v v %v: NadirRows %v (%v), nadirRows %v (%v)", r, v, m, ok, got, okGot)
		}
		for _, n := range []Nadir{{}, {NadirAxis: unitZ, VelocityAxis: unitX}} {
			if !n.Plain() {
				t.Fatalf("Nadir%+v is not Plain", n)
			}
			if okWant && n.Rows(0, orbit.State{R: r, V: v}, r3.Vec{X: 1}) != want {
				t.Fatalf("Nadir%+v.Rows differs from the general path", n)
			}
		}
	}
}

// TestNadirPlainOnlyForTheDefaultAxes: a step loop calls NadirRows in
// place of Rows only for the laws whose Rows are NadirRows (closed form:
// another axis, an offset or yaw steering gives another matrix).
func TestNadirPlainOnlyForTheDefaultAxes(t *testing.T) {
	s := orbit.State{R: r3.Vec{X: 7000, Y: 300, Z: -200}, V: r3.Vec{X: -0.4, Y: 6.1, Z: 4.2}}
	sun := r3.Unit(r3.Vec{X: 0.3, Y: -0.8, Z: 0.5})
	plain, _ := NadirRows(s.R, s.V)
	for _, n := range []Nadir{
		{NadirAxis: r3.Vec{X: -1}},
		{VelocityAxis: r3.Vec{Y: 1}},
		{YawToSun: true},
		{Offset: r3.NewRotation(0.2, r3.Vec{Z: 1})},
	} {
		if n.Plain() {
			t.Errorf("Nadir%+v counted Plain", n)
		}
		if n.Rows(0, s, sun) == plain {
			t.Errorf("Nadir%+v: Rows equal NadirRows, the test shows nothing", n)
		}
	}
}
