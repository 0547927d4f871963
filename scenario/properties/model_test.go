package properties

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/internal/randscenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// muEarth is the Earth's gravitational parameter (km³/s², EGM96, from memory).
const muEarth = 398600.4418

// simpleFile is a short run of one ideal cosine sensor on a circular orbit.
func simpleFile(altKm, incDeg, raanDeg float64, epoch, shadow string, orbits float64) *randscenario.File {
	a := earthRadiusKm + altKm
	period := 2 * math.Pi * math.Sqrt(a*a*a/muEarth)
	h, i, o := altKm, incDeg, raanDeg
	return &randscenario.File{
		Name: "closed-form case", Epoch: epoch, Seed: 1,
		Duration: fmt.Sprintf("%.0fs", math.Round(orbits*period)), Step: "10s",
		Orbit:    randscenario.Orbit{AltitudeKm: &h, InclinationDeg: &i, RAANDeg: &o, Propagator: "two-body"},
		SunModel: "low-precision", Shadow: shadow,
		Attitude: randscenario.Law{Law: "nadir"},
		Body:     randscenario.Body{Sensors: []randscenario.Sensor{{Name: "s", Kind: "cosine", Face: "+X"}}},
		Albedo:   randscenario.Albedo{Model: "none"},
	}
}

// Circular orbit, cylindrical shadow: each complete eclipse lasts
// T·2·acos(√(1−(R/r)²)/cos β)/(2π) (elementary geometry), β taken at
// mid-eclipse from the propagated state and the sun, to ≤ 0.5 s once the
// sun's own motion during the eclipse is allowed for. The same
// file with the conical shadow gives umbra ≤ cylindrical ≤ penumbra.
func TestCylindricalEclipseClosedForm(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 6))
	checked, worst := 0, 0.0
	for k := range 12 {
		alt := 300 + 1700*r.Float64()
		if k%4 == 3 {
			alt = 5000 + 30000*r.Float64()
		}
		f := simpleFile(math.Round(alt), math.Round(180*r.Float64()), math.Round(360*r.Float64()), "2026-03-20T00:00:00Z", "cylindrical", 2.2)
		t.Run(fmt.Sprintf("alt%.0f", alt), func(t *testing.T) {
			showOnFailure(t, f.YAML())
			b, res := mustRun(t, f)
			g := f.Clone()
			g.Shadow = "conical"
			_, con := mustRun(t, g)
			p := b.cfg.NewPropagator()
			a := earthRadiusKm + *f.Orbit.AltitudeKm
			period := 2 * math.Pi * math.Sqrt(a*a*a/muEarth)
			crit := math.Asin(earthRadiusKm / a)
			for _, e := range res.Eclipses {
				if e.StartCut || e.EndCut {
					continue
				}
				mid := (e.PenumbraStart + e.PenumbraEnd) / 2
				s := p.StateAt(mid)
				sun, _ := b.cfg.Sun.Position(b.jd(mid))
				beta := math.Asin(r3.Dot(r3.Unit(sun), r3.Unit(r3.Cross(s.R, s.V))))
				if math.Abs(beta) >= crit {
					t.Errorf("eclipse at β = %.3f° beyond the critical %.3f°", beta*180/math.Pi, crit*180/math.Pi)
					continue
				}
				x := math.Sqrt(1-math.Pow(earthRadiusKm/a, 2)) / math.Cos(beta)
				// The closed form holds for a fixed sun. The shadow
				// turns in the orbit plane at ω☉·(k̂·ĥ), k̂ the ecliptic
				// pole (obliquity 23.439°, mean sun 360°/365.2422 d,
				// from memory), which matters for the long eclipses of
				// high orbits (≈ 9 s at GEO): divide the half-angle by
				// the relative rate instead of the mean motion.
				const obliquity = 23.439 * math.Pi / 180
				k := r3.Vec{Y: -math.Sin(obliquity), Z: math.Cos(obliquity)}
				rel := 2*math.Pi/period - 2*math.Pi/(365.2422*86400)*r3.Dot(k, r3.Unit(r3.Cross(s.R, s.V)))
				want := 2 * math.Acos(x) / rel
				d := e.Duration() - want
				worst = math.Max(worst, math.Abs(d))
				if math.Abs(d) > 0.5 {
					t.Errorf("eclipse at %.0f s: %.2f s long, closed form %.2f s (β %.3f°)", e.PenumbraStart, e.Duration(), want, beta*180/math.Pi)
				}
				checked++
				for _, ce := range con.Eclipses {
					if ce.PenumbraEnd < e.PenumbraStart || ce.PenumbraStart > e.PenumbraEnd || !ce.Complete() {
						continue
					}
					if !(ce.UmbraDuration() <= e.Duration()+1e-3 && e.Duration() <= ce.Duration()+1e-3) {
						t.Errorf("eclipse at %.0f s: conical umbra %.2f s, cylindrical %.2f s, conical penumbra %.2f s not ordered",
							e.PenumbraStart, ce.UmbraDuration(), e.Duration(), ce.Duration())
					}
				}
			}
		})
	}
	t.Logf("%d eclipses, largest difference to the closed form %.3f s", checked, worst)
	if checked < 5 {
		t.Errorf("only %d eclipses checked against the closed form", checked)
	}
}

// jd is the TT Julian date of t seconds into the run, through the engine's
// own epoch conversion (the sun model's argument).
func (b *built) jd(t float64) float64 {
	return julianTT(b.cfg) + t/86400
}

// A polar orbit facing the sun near a solstice keeps |β| above asin(R/r): no eclipse
// and full sun in both shadow models (elementary geometry).
func TestNoEclipseAboveCriticalBeta(t *testing.T) {
	for _, shadow := range []string{"cylindrical", "conical"} {
		// Polar orbit whose normal points at the June-solstice sun's right
		// ascension (90°): β ≈ 90° − 23.4°.
		f := simpleFile(800, 90, 180, "2026-06-21T00:00:00Z", shadow, 3)
		t.Run(shadow, func(t *testing.T) {
			showOnFailure(t, f.YAML())
			_, res := mustRun(t, f)
			u := res.Nominal
			crit := math.Asin(earthRadiusKm/(earthRadiusKm+800)) * 180 / math.Pi
			if !(u.BetaMinDeg > crit+1 || u.BetaMaxDeg < -crit-1) {
				t.Fatalf("β range [%.2f°, %.2f°] does not clear ±%.2f°: the case does not test the claim", u.BetaMinDeg, u.BetaMaxDeg, crit)
			}
			if len(res.Eclipses) != 0 || u.SunlitFraction != 1 {
				t.Errorf("β in [%.2f°, %.2f°], critical %.2f°: %d eclipses, sunlit %g", u.BetaMinDeg, u.BetaMaxDeg, crit, len(res.Eclipses), u.SunlitFraction)
			}
		})
	}
}

// At β ≈ 0 a higher circular orbit has a shorter longest eclipse, from 300
// to 1200 km. (The closed form T·asin(R/r)/π has its minimum near 1400 km
// and grows above it, so the claim holds for low LEO only: elementary
// geometry.)
func TestHigherOrbitShorterEclipseAtZeroBeta(t *testing.T) {
	prev := math.Inf(1)
	for _, alt := range []float64{300, 500, 700, 900, 1100} {
		// Near the March equinox the sun lies close to ECI +X; RAAN 0 puts
		// it in the orbit plane for any inclination.
		f := simpleFile(alt, 51.6, 0, "2026-03-20T14:00:00Z", "conical", 3)
		_, res := mustRun(t, f)
		u := res.Nominal
		if math.Max(math.Abs(u.BetaMinDeg), math.Abs(u.BetaMaxDeg)) > 2 {
			t.Fatalf("%.0f km: β range [%.2f°, %.2f°] is not near 0", alt, u.BetaMinDeg, u.BetaMaxDeg)
		}
		m := res.EclipseStats.MaxS
		if !(m < prev) {
			t.Errorf("%.0f km: longest eclipse %.1f s, not shorter than %.1f s lower down", alt, m, prev)
		}
		prev = m
	}
}

// Six face-normal sensors cover the whole sphere exactly when their
// half-angle reaches acos(1/√3) = 54.7356° (the cube's diagonals are the
// last directions covered: elementary geometry), with and without a cube
// bus outline.
func TestSixFacesCoverSphereAt54_7356(t *testing.T) {
	lat, err := sky.Fibonacci(200000)
	if err != nil {
		t.Fatal(err)
	}
	crit := math.Acos(1/math.Sqrt(3)) * 180 / math.Pi
	diag := r3.Unit(r3.Vec{X: 1, Y: -1, Z: 1})
	for _, outline := range []bool{false, true} {
		for _, half := range []float64{crit - 0.05, crit + 0.01} {
			f := simpleFile(500, 51.6, 0, "2026-03-20T00:00:00Z", "conical", 0.2)
			f.Body.Sensors = nil
			for i, face := range randscenario.Faces {
				h := half
				f.Body.Sensors = append(f.Body.Sensors, randscenario.Sensor{Name: fmt.Sprint("f", i), Kind: "cosine", Face: face, HalfAngleDeg: &h})
			}
			if outline {
				f.Body.SizeM = []float64{0.1, 0.1, 0.1}
			}
			b, err := build(f)
			if err != nil {
				t.Fatal(err)
			}
			cov, err := sky.Coverage(b.cfg.Viewers, lat)
			if err != nil {
				t.Fatal(err)
			}
			seenDiag := 0
			for _, v := range b.cfg.Viewers {
				if v.Sees(diag) {
					seenDiag++
				}
			}
			label := fmt.Sprintf("half-angle %.4f°, bus outline %v", half, outline)
			if half < crit {
				if cov.AtLeast[1] >= 1 || seenDiag != 0 {
					t.Errorf("%s: sphere share %.6f, diagonal seen by %d: want a hole at the diagonals", label, cov.AtLeast[1], seenDiag)
				}
			} else if cov.AtLeast[1] != 1 || seenDiag != 3 {
				t.Errorf("%s: sphere share %.6f, diagonal seen by %d: want all of the sphere, the diagonal by 3", label, cov.AtLeast[1], seenDiag)
			}
		}
	}
}

// albedoGeometry draws a spacecraft position, a sun direction and distance.
func albedoGeometry(r *rand.Rand) (rSat, sun r3.Vec, dist float64) {
	u := func() r3.Vec { return r3.Unit(r3.Vec{X: r.NormFloat64(), Y: r.NormFloat64(), Z: r.NormFloat64()}) }
	alt := 300 + 35500*math.Pow(r.Float64(), 3)
	return r3.Scale(earthRadiusKm+alt, u()), u(), albedo.AUKm * (0.983 + 0.034*r.Float64())
}

// Albedo irradiance is linear in reflectance (uniform and zonal, kept
// below 1 where a reflectance is capped), and a
// nadir-facing plate never gets more than ρ·S·(R/r)² (the view factor of a
// sphere to a facing plate, Howell's catalogue case C-5 from memory) times
// the sun-distance factor (AU/d)².
func TestAlbedoLinearAndNadirBound(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 8))
	newModel := func(refl albedo.Reflectance) *albedo.Model {
		m, err := albedo.New(albedo.Config{Reflectance: refl, Cells: 600})
		if err != nil {
			t.Fatal(err)
		}
		return m
	}
	worst := 0.0
	for k := range 300 {
		rSat, sun, dist := albedoGeometry(r)
		if k%5 == 0 {
			// Sun at the zenith of the sub-satellite point: the bound is
			// approached most closely.
			sun = r3.Unit(rSat)
		}
		rho := 0.05 + 0.4*r.Float64()
		nadir := r3.Scale(-1/r3.Norm(rSat), rSat)
		sens := []albedo.Sensor{{Normal: nadir, HalfAngle: math.Pi / 2}, {Normal: r3.Unit(r3.Add(nadir, r3.Vec{X: 0.3})), HalfAngle: 1.2}}
		out := func(refl albedo.Reflectance) []albedo.Result {
			dst := make([]albedo.Result, len(sens))
			newModel(refl).Irradiance(dst, rSat, sun, dist, 1.3, 2461120.5, sens)
			return dst
		}
		for _, pair := range []struct {
			a, b albedo.Reflectance
		}{{albedo.Uniform{Albedo: rho}, albedo.Uniform{Albedo: 2 * rho}}, {albedo.KnockeZonal().Scaled(0.25), albedo.KnockeZonal().Scaled(0.5)}} {
			x, y := out(pair.a), out(pair.b)
			for i := range x {
				if math.Abs(y[i].Irradiance-2*x[i].Irradiance) > 1e-12*math.Max(1, y[i].Irradiance) {
					t.Fatalf("reflectance doubled: irradiance %.15g → %.15g (sensor %d, %T)", x[i].Irradiance, y[i].Irradiance, i, pair.a)
				}
			}
		}
		e := out(albedo.Uniform{Albedo: rho})[0].Irradiance
		q := earthRadiusKm / r3.Norm(rSat)
		bound := rho * albedo.SolarIrradiance1AU * math.Pow(albedo.AUKm/dist, 2) * q * q
		worst = math.Max(worst, e/bound)
		if e > bound*(1+1e-9) {
			t.Errorf("nadir plate at %.0f km: %.6g W/m² above the bound ρ·S·(R/r)² = %.6g W/m²", r3.Norm(rSat)-earthRadiusKm, e, bound)
		}
	}
	t.Logf("largest nadir-plate irradiance / bound: %.4f", worst)
	if worst < 0.5 {
		t.Errorf("largest ratio to the bound %.3f: the sub-solar cases should come close to it", worst)
	}
}

// No errors, ≥ 3 non-coplanar cosine sensors seeing the sun ⇒ least squares
// recovers the sun to < 1e-6°; six ideal 90° faces ⇒ opposite pairs always
// valid and exact (both by the definitions of the estimators).
func TestIdealEstimatorsExact(t *testing.T) {
	r := rand.New(rand.NewPCG(9, 10))
	unit := func() r3.Vec { return r3.Unit(r3.Vec{X: r.NormFloat64(), Y: r.NormFloat64(), Z: r.NormFloat64()}) }
	newArray := func(bs []r3.Vec) *sensor.Array {
		var ss []sensor.Sensor
		for i, b := range bs {
			m, err := sensor.VectorMount(b, r3.Vec{})
			if err != nil {
				t.Fatal(err)
			}
			c, err := sensor.NewCosine(sensor.CosineSpec{Name: fmt.Sprint("c", i), Mount: m, HalfAngle: math.Pi / 2, Threshold: 1e-6})
			if err != nil {
				t.Fatal(err)
			}
			ss = append(ss, c)
		}
		a, err := sensor.NewArray(ss...)
		if err != nil {
			t.Fatal(err)
		}
		return a
	}
	valid, worst := 0, 0.0
	for range 300 {
		n := 3 + r.IntN(6)
		bs := make([]r3.Vec, n)
		for i := range bs {
			bs[i] = unit()
		}
		arr := newArray(bs)
		rd := make([]sensor.Reading, n)
		for range 20 {
			s := unit()
			arr.Read(rd, s, sensor.SolarConstant, nil, nil)
			e := (sensor.LeastSquares{}).Estimate(arr, rd)
			if !e.Valid {
				continue
			}
			valid++
			d := angleDeg(e.Dir, s)
			worst = math.Max(worst, d)
		}
	}
	t.Logf("least squares: %d valid estimates, worst error %.3g°", valid, worst)
	if valid < 500 || worst >= 1e-6 {
		t.Errorf("least squares: %d valid estimates, worst error %.3g° (want many, < 1e-6°)", valid, worst)
	}
	faces := []r3.Vec{{X: 1}, {X: -1}, {Y: 1}, {Y: -1}, {Z: 1}, {Z: -1}}
	arr := newArray(faces)
	rd := make([]sensor.Reading, 6)
	worst = 0
	for range 5000 {
		s := unit()
		arr.Read(rd, s, sensor.SolarConstant, nil, nil)
		e := (sensor.OppositePairs{}).Estimate(arr, rd)
		if !e.Valid {
			t.Fatalf("opposite pairs invalid for sun %v", s)
		}
		worst = math.Max(worst, angleDeg(e.Dir, s))
	}
	t.Logf("opposite pairs: worst error %.3g° over 5000 sun directions", worst)
	if worst >= 1e-6 {
		t.Errorf("opposite pairs on six ideal faces: worst error %.3g°", worst)
	}
}

// julianTT is the TT Julian date of the run's epoch.
func julianTT(cfg sim.Config) float64 {
	return ephem.JulianDateTT(cfg.Epoch)
}

// angleDeg is the angle between two unit vectors in degrees, accurate near
// 0 (atan2 of |a×b| and a·b; an arccosine loses half the digits there).
func angleDeg(a, b r3.Vec) float64 {
	return math.Atan2(r3.Norm(r3.Cross(a, b)), r3.Dot(a, b)) * 180 / math.Pi
}
