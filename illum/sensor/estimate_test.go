package sensor

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/spatial/r3"
)

// Closed form: with the sun on +X and extra albedo α·S on the −Z sensor only,
// the pair differences are (1, 0, −α), so the error is atan(α)
// (5.711° at α = 0.1).
func TestOppositePairsAlbedoOnMinusZ(t *testing.T) {
	a := cube(t, Errors{})
	r := make([]Reading, a.Len())
	for _, alpha := range []float64{0.1, 0.26, 0.3} {
		alb := make([]Albedo, a.Len())
		alb[5] = Albedo{Irradiance: alpha * SolarConstant, Dir: r3.Vec{Z: -1}}
		a.Read(r, r3.Vec{X: 1}, SolarConstant, alb, nil)
		e := OppositePairs{}.Estimate(a, r)
		if !e.Valid || e.N != 6 {
			t.Fatalf("α=%g: estimate %+v", alpha, e)
		}
		got, want := angle(e.Dir, r3.Vec{X: 1}), math.Atan(alpha)
		if math.Abs(got-want) > 1e-12 {
			t.Errorf("α=%g: error %.6f°, closed form atan(α) = %.6f°", alpha, got/deg, want/deg)
		}
	}
}

// Own closed-form calculation: s = (1,1,1)/√3, 0.1·S extra on −Z. The pairs
// give (k, k, k−0.1) with k = 1/√3 → 4.952°; lit-only least squares uses
// +X, +Y, +Z and −Z (lit by albedo alone) → (k, k, (k−0.1)/2) → 18.970°.
func TestLitOnlyLeastSquaresBiasVersusPairs(t *testing.T) {
	a := cube(t, Errors{})
	r := make([]Reading, a.Len())
	s := r3.Unit(r3.Vec{X: 1, Y: 1, Z: 1})
	alb := make([]Albedo, a.Len())
	alb[5] = Albedo{Irradiance: 0.1 * SolarConstant, Dir: r3.Vec{Z: -1}}
	a.Read(r, s, SolarConstant, alb, nil)
	k := 1 / math.Sqrt(3)
	for _, c := range []struct {
		est  Estimator
		form r3.Vec
		deg  float64
	}{
		{LeastSquares{}, r3.Vec{X: k, Y: k, Z: (k - 0.1) / 2}, 18.970},
		{OppositePairs{}, r3.Vec{X: k, Y: k, Z: k - 0.1}, 4.952},
	} {
		e := c.est.Estimate(a, r)
		if !e.Valid {
			t.Fatalf("%s: invalid", c.est.Name())
		}
		got := angle(e.Dir, s)
		if want := angle(c.form, s); math.Abs(got-want) > 1e-12 {
			t.Errorf("%s: error %.6f°, closed form %.6f°", c.est.Name(), got/deg, want/deg)
		}
		if math.Abs(got/deg-c.deg) > 5e-4 {
			t.Errorf("%s: error %.4f°, want %.3f°", c.est.Name(), got/deg, c.deg)
		}
	}
}

// pyramid returns five cosine sensors: +Z and four tilted 45° from +Z.
func pyramid(t testing.TB, errs Errors) *Array {
	t.Helper()
	var ss []Sensor
	add := func(name string, m Mount, err error) {
		if err != nil {
			t.Fatal(err)
		}
		c, err := NewCosine(CosineSpec{Name: name, Mount: m, HalfAngle: 90 * deg, Threshold: 1e-6, Errors: errs})
		if err != nil {
			t.Fatal(err)
		}
		ss = append(ss, c)
	}
	m, err := FaceMount(FacePlusZ, 0, FaceNone, 0)
	add("top", m, err)
	for i, f := range []Face{FacePlusX, FaceMinusX, FacePlusY, FaceMinusY} {
		m, err := FaceMount(FacePlusZ, 45*deg, f, 0)
		add("side"+string(rune('a'+i)), m, err)
	}
	a, err := NewArray(ss...)
	if err != nil {
		t.Fatal(err)
	}
	return a
}

// Closed form: noiseless ideal cosine readings are linear in s on the lit
// sensors, so least squares returns s exactly (to rounding).
func TestLeastSquaresNoiseless(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, a := range []*Array{cube(t, Errors{}), pyramid(t, Errors{})} {
		r := make([]Reading, a.Len())
		worst, used := 0.0, 0
		for range 2000 {
			s := r3.Unit(r3.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64(), Z: rng.NormFloat64()})
			a.Read(r, s, SolarConstant, nil, nil)
			e := LeastSquares{}.Estimate(a, r)
			if !e.Valid {
				continue
			}
			used++
			worst = math.Max(worst, angle(e.Dir, s))
		}
		if used < 100 || worst > 1e-9 {
			t.Errorf("%d valid cases, worst error %.3g rad, want ≤ 1e-9", used, worst)
		}
	}
}

// Closed form (linearised covariance): with noise σ on each reading, the
// error of x = (NᵀN)⁻¹Nᵀm is σ²(NᵀN)⁻¹; the direction error perpendicular
// to s has E[θ²] = tr(P⊥ σ²(NᵀN)⁻¹ P⊥) with P⊥ = I − ssᵀ. NᵀN is inverted
// here with gonum mat (independent of the estimator's own 3×3 code).
// 20000 samples; E[θ²] must match within 4 standard errors of the sample mean.
func TestLeastSquaresNoiseMatchesCovariance(t *testing.T) {
	const sigma = 0.005
	a := pyramid(t, Errors{NoiseSigma: sigma})
	s := r3.Unit(r3.Vec{X: 0.2, Y: -0.1, Z: 1}) // all five sensors lit
	nt := mat.NewDense(a.Len(), 3, nil)
	for i, sn := range a.Sensors() {
		b := sn.Mount().Boresight()
		nt.SetRow(i, []float64{b.X, b.Y, b.Z})
	}
	var ntn, inv mat.Dense
	ntn.Mul(nt.T(), nt)
	if err := inv.Inverse(&ntn); err != nil {
		t.Fatal(err)
	}
	p := mat.NewDense(3, 3, nil)
	sv := []float64{s.X, s.Y, s.Z}
	for i := range 3 {
		for j := range 3 {
			d := 0.0
			if i == j {
				d = 1
			}
			p.Set(i, j, d-sv[i]*sv[j])
		}
	}
	var tmp, cov mat.Dense
	tmp.Mul(p, &inv)
	cov.Mul(&tmp, p)
	want := sigma * sigma * mat.Trace(&cov)

	rng := rand.New(rand.NewPCG(7, 8))
	r := make([]Reading, a.Len())
	const n = 20000
	var sum, sum2 float64
	for range n {
		a.Read(r, s, SolarConstant, nil, rng)
		e := LeastSquares{}.Estimate(a, r)
		if !e.Valid || e.N != 5 {
			t.Fatalf("estimate %+v", e)
		}
		th2 := math.Pow(angle(e.Dir, s), 2)
		sum += th2
		sum2 += th2 * th2
	}
	mean := sum / n
	se := math.Sqrt((sum2/n - mean*mean) / n)
	t.Logf("E[θ²]: sample %.4g, linearised %.4g, standard error %.2g (%.2f SE)", mean, want, se, (mean-want)/se)
	if math.Abs(mean-want) > 4*se {
		t.Errorf("E[θ²] = %.4g, linearised covariance gives %.4g ± %.2g (4 SE)", mean, want, 4*se)
	}
}

func TestLeastSquaresNeedsThreeNonCoplanar(t *testing.T) {
	a := cube(t, Errors{})
	r := make([]Reading, a.Len())
	a.Read(r, r3.Unit(r3.Vec{X: 1, Y: 1}), SolarConstant, nil, nil) // two lit sensors
	if e := (LeastSquares{}).Estimate(a, r); e.Valid || e.N != 2 {
		t.Errorf("two lit sensors: %+v, want invalid", e)
	}
	// Three normals in one plane (tilted toward the same face).
	var ss []Sensor
	for i, tilt := range []float64{-30, 0, 30} {
		m, err := FaceMount(FacePlusZ, tilt*deg, FacePlusX, 0)
		if err != nil {
			t.Fatal(err)
		}
		c, _ := NewCosine(CosineSpec{Name: string(rune('a' + i)), Mount: m, HalfAngle: 90 * deg})
		ss = append(ss, c)
	}
	b, _ := NewArray(ss...)
	r = make([]Reading, 3)
	b.Read(r, r3.Unit(r3.Vec{X: 0.1, Y: 0.3, Z: 1}), SolarConstant, nil, nil)
	if e := (LeastSquares{}).Estimate(b, r); e.Valid {
		t.Errorf("coplanar normals: %+v, want invalid", e)
	}
}

func TestEclipseGivesNoEstimate(t *testing.T) {
	a := cube(t, Errors{})
	r := make([]Reading, a.Len())
	a.Read(r, r3.Vec{X: 1}, 0, nil, nil)
	for _, name := range EstimatorNames() {
		e, err := EstimatorByName(name)
		if err != nil {
			t.Fatal(err)
		}
		if got := e.Estimate(a, r); got.Valid {
			t.Errorf("%s in eclipse: %+v, want invalid", name, got)
		}
	}
	if _, err := EstimatorByName("nope"); err == nil {
		t.Error("unknown estimator accepted")
	}
}

// Reference library: gonum mat.EigenSym.
func TestEigenAgainstGonum(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 4))
	for range 200 {
		var m sym3
		for range 4 {
			m.addOuter(r3.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64(), Z: rng.NormFloat64()}, rng.Float64())
		}
		s := mat.NewSymDense(3, []float64{m.xx, m.xy, m.xz, m.xy, m.yy, m.yz, m.xz, m.yz, m.zz})
		var es mat.EigenSym
		if !es.Factorize(s, false) {
			t.Fatal("factorize")
		}
		v := es.Values(nil) // ascending
		l1, l2, l3 := m.eigen()
		for i, got := range []float64{l3, l2, l1} {
			if math.Abs(got-v[i]) > 1e-10*math.Max(1, v[2]) {
				t.Errorf("eigenvalue %d: %g, gonum %g", i, got, v[i])
			}
		}
	}
}
