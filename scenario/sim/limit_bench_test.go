package sim

import (
	"context"
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/internal/vecmath"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// benchDaySteps is one day at 10 s, the span of the per-step benchmarks.
const benchDaySteps = 8640

// BenchmarkStepLimit is the floor of the no-albedo reference case (bench/
// README.md) on one core: only the arithmetic the job needs, in one tight
// loop — the circular J2-mean orbit by incremental rotation of the argument
// of latitude and the node, the interpolated sun, the cylindrical shadow, the
// nadir frame, six dot products for the face sensors (60° cones), the
// coverage counts, the opposite-pairs estimate and its error into a moment
// and quantile accumulator. It reports ns/step; the engine's figure is
// BenchmarkEngineStep's, in the same run.
func BenchmarkStepLimit(b *testing.B) {
	cfg := referenceCase(b, 1, false)
	p := cfg.NewPropagator().(*orbit.J2Mean)
	el := p.MeanElementsAt(0)
	dΩ, _, dM := orbit.J2Rates(el)
	a := el.SemiMajorAxisKm
	si, ci := math.Sincos(el.Inclination)
	const dt = 10.0
	sdu, cdu := math.Sincos(dM * dt) // circular: argument of latitude rate
	sdΩ, cdΩ := math.Sincos(dΩ * dt)
	cosHalf := math.Cos(60 * math.Pi / 180)
	re2 := illum.EarthRadiusKm * illum.EarthRadiusKm
	var m Moments
	q := NewQuantiles()
	var counts [4]int
	b.ResetTimer()
	for b.Loop() {
		sun := newSunCache(cfg.Sun, ephem.JulianDateTT(cfg.Epoch))
		su, cu := math.Sincos(el.ArgPerigee + el.MeanAnomaly)
		sΩ, cΩ := math.Sincos(el.RAAN)
		for k := range benchDaySteps {
			t := float64(k) * dt
			// Orbit: r = a (cos u P + sin u Q), v = n a (−sin u P + cos u Q).
			P := r3.Vec{X: cΩ, Y: sΩ}
			Q := r3.Vec{X: -sΩ * ci, Y: cΩ * ci, Z: si}
			r := r3.Vec{X: a * (cu*P.X + su*Q.X), Y: a * (cu*P.Y + su*Q.Y), Z: a * su * Q.Z}
			h := r3.Cross(P, Q) // orbit normal
			su, cu = su*cdu+cu*sdu, cu*cdu-su*sdu
			sΩ, cΩ = sΩ*cdΩ+cΩ*sdΩ, cΩ*cdΩ-sΩ*sdΩ
			s, _ := sun.at(t)
			// Cylindrical shadow.
			rs := r3.Dot(r, s)
			if rs < 0 && r3.Norm2(r)-rs*rs < re2 {
				continue
			}
			// Nadir frame: z = −r̂, y = −ĥ, x = y × z; the sun in body axes.
			z := r3.Scale(-1/math.Sqrt(r3.Norm2(r)), r)
			y := r3.Scale(-1, h)
			x := r3.Cross(y, z)
			bx, by, bz := r3.Dot(x, s), r3.Dot(y, s), r3.Dot(z, s)
			// Six face sensors: cosine inside the 60° cone.
			var sig [6]float64
			seen := 0
			for i, c := range [6]float64{bx, -bx, by, -by, bz, -bz} {
				if c >= cosHalf {
					sig[i] = c
					seen++
				}
			}
			counts[min(seen, 3)]++
			// Opposite pairs and the error to the true direction.
			ex, ey, ez := sig[0]-sig[1], sig[2]-sig[3], sig[4]-sig[5]
			n := math.Sqrt(ex*ex + ey*ey + ez*ez)
			if n == 0 {
				continue
			}
			cosErr := (ex*bx + ey*by + ez*bz) / n
			d := math.Acos(min(1, cosErr)) * (180 / math.Pi)
			m.Add(d)
			q.Add(d)
		}
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*benchDaySteps), "ns/step")
	if m.N == 0 || counts[0]+counts[1]+counts[2]+counts[3] == 0 {
		b.Fatal("nothing accumulated")
	}
}

// BenchmarkEngineStep runs the engine on the no-albedo reference case (one
// day, one worker, one unit) and reports ns/step, to set beside
// BenchmarkStepLimit.
func BenchmarkEngineStep(b *testing.B) {
	cfg := referenceCase(b, 1, false)
	cfg.Estimators = cfg.Estimators[:1] // opposite pairs, as the limit
	cfg.Workers = 1
	for b.Loop() {
		if _, err := Run(context.Background(), cfg); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*cfg.Steps()), "ns/step")
}

// BenchmarkStages times each stage of the engine's step on the reference
// case, one day, each stage alone over the inputs of the one before (ns/step).
func BenchmarkStages(b *testing.B) {
	cfg := referenceCase(b, 1, false)
	steps := cfg.Steps()
	report := func(b *testing.B) {
		b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*steps), "ns/step")
	}
	p := cfg.NewPropagator()
	states := make([]orbit.State, steps)
	p.Fill(states, 0, cfg.Step)
	jd0 := ephem.JulianDateTT(cfg.Epoch)
	sunU := make([]r3.Vec, steps)
	sunD := make([]float64, steps)
	b.Run("propagation", func(b *testing.B) {
		for b.Loop() {
			p.Fill(states, 0, cfg.Step)
		}
		report(b)
	})
	b.Run("sun", func(b *testing.B) {
		for b.Loop() {
			c := newSunCache(cfg.Sun, jd0)
			for k := range states {
				sunU[k], sunD[k] = c.at(float64(k) * cfg.Step)
			}
		}
		report(b)
	})
	region := make([]illum.Region, steps)
	b.Run("shadow", func(b *testing.B) {
		for b.Loop() {
			for k := range states {
				_, region[k] = shadow(cfg.Cylindrical, states[k].R, sunU[k], sunD[k])
			}
		}
		report(b)
	})
	sunBody := make([]r3.Vec, steps)
	rows := make([]bodyMatrix, steps)
	b.Run("attitude", func(b *testing.B) {
		g, err := newGeometry(&cfg, cfg.Array, 0, albedoTables{})
		if err != nil {
			b.Fatal(err)
		}
		for b.Loop() {
			for k := range states {
				g.attitude(&rows[k], float64(k)*cfg.Step, states[k], sunU[k], region[k])
				sunBody[k] = rows[k].toBody(sunU[k])
			}
		}
		report(b)
	})
	// The Moon and the Earth: the Moon from the spacecraft, its and the
	// lit Earth's place in each sensor's cone.
	b.Run("moon-earth", func(b *testing.B) {
		g, err := newGeometry(&cfg, cfg.Array, 0, albedoTables{})
		if err != nil {
			b.Fatal(err)
		}
		vw := newViewer(&cfg, cfg.Array)
		for b.Loop() {
			g.moon = newMoonCache(jd0)
			for k := range states {
				rn := vecmath.Norm(states[k].R)
				sg := stepGeom{t: float64(k) * cfg.Step, nadirBody: rows[k].toBody(r3.Scale(-1/rn, states[k].R))}
				g.bodies(&sg, &rows[k], states[k].R, rn, sunU[k], sunD[k])
				vw.bodiesInCones(&vw.v, &sg.bodies)
			}
		}
		report(b)
	})
	arr := cfg.Array
	n := arr.Len()
	reads := make([]sensor.Reading, steps*n)
	noise := rand.New(rand.NewPCG(1, 2))
	bank := sensor.NewCosineBank(allCosines(arr))
	b.Run("sensors", func(b *testing.B) {
		for b.Loop() {
			for k := range states {
				bank.Read(reads[k*n:(k+1)*n], sunBody[k], ephem.SolarIrradiance1AU, nil, noise)
			}
		}
		report(b)
	})
	est := sensor.OppositePairs{}
	b.Run("estimator", func(b *testing.B) {
		for b.Loop() {
			for k := range states {
				sinkEst = est.Estimate(arr, reads[k*n:(k+1)*n])
			}
		}
		report(b)
	})
	// The accumulators run the estimator themselves (unitAcc.step): this
	// stage includes the estimator's time.
	b.Run("accumulators", func(b *testing.B) {
		c := cfg
		c.Estimators = []sensor.Estimator{est}
		for b.Loop() {
			a := newUnitAcc(&c, arr, false, false, true, false, 0)
			for k := range states {
				a.step(k, float64(k)*cfg.Step, region[k], 1, 2, sunBody[k], r3.Vec{Z: 1}, 0.3, reads[k*n:(k+1)*n], nil, nil, false, arr, c.Estimators)
			}
		}
		report(b)
	})
}

var sinkEst sensor.Estimate

// BenchmarkUnits runs the reference case with a uniform albedo in a fixed
// inertial attitude (the boresight table) for 1 and for 10 Monte Carlo
// units of drawn errors on one worker, and reports ns per step: units share
// the geometry, so 10 units cost one geometry and ten readings per step.
func BenchmarkUnits(b *testing.B) {
	for _, units := range []int{1, 10} {
		b.Run(map[int]string{1: "1", 10: "10"}[units], func(b *testing.B) {
			// 12 days: enough steps for the table at one unit too
			// (steps × units ≥ 100 000).
			cfg := referenceCase(b, 12, true)
			cfg.Law = attitude.Inertial{Q: r3.Rotation{Real: 0.9, Imag: 0.1, Jmag: 0.3, Kmag: 0.3}}
			cfg.Estimators = cfg.Estimators[:1]
			cfg.Units, cfg.Workers = units, 1
			// Realistic errors (every unit its own draw): noise, dark
			// offset, gain, misalignment, a 12-bit converter.
			cfg.Array = faceArrayWith(b, 60, sensor.Errors{NoiseSigma: 0.005, DarkSigma: 0.005, GainSigma: 0.02,
				MisalignSigma: 0.5 * math.Pi / 180, ADCBits: 12, FullScale: 1.5})
			for b.Loop() {
				if _, err := Run(context.Background(), cfg); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*cfg.Steps()), "ns/step")
		})
	}
}

// BenchmarkUnitLimit is the floor of what one more Monte Carlo unit of
// BenchmarkUnits costs per step on one core, the geometry being shared:
// only its own arithmetic in one tight loop — six face sensors read with
// their drawn gain and dark offset, one noise draw each (the engine's
// generator), a 12-bit converter, without and with an albedo irradiance;
// the opposite-pairs estimate of both; their errors to the sun and to each
// other (atan2 of cross and dot, as the engine); each error into a moment
// and a quantile accumulator. The body sun turns at orbital rate about Y
// with 38 % of the orbit in shadow. It reports ns per unit-step; the
// engine's figure is (BenchmarkUnits/10 − BenchmarkUnits/1) / 9 in the
// same run. With the shared part G per step, 10 units / 1 can be no better
// than (G + 10·U)/(G + U) for this U.
func BenchmarkUnitLimit(b *testing.B) {
	const period, dt = 5740.0, 10.0
	cosHalf := math.Cos(60 * math.Pi / 180)
	faces := [6]r3.Vec{{X: 1}, {X: -1}, {Y: 1}, {Y: -1}, {Z: 1}, {Z: -1}}
	drawn := rand.New(rand.NewPCG(7, 8))
	var gain, dark [6]float64
	for i := range gain {
		gain[i], dark[i] = 1+0.02*drawn.NormFloat64(), 0.005*drawn.NormFloat64()
	}
	const ref, sigma, q = 1361.0, 0.003, 1.5 / 4096
	noise := rand.New(rand.NewPCG(1, 2))
	var mNo, mAlb, mPart Moments
	qNo, qAlb, qPart := NewQuantiles(), NewQuantiles(), NewQuantiles()
	read := func(i int, e, n float64) float64 {
		v := max(gain[i]*e/ref+dark[i]+n, 0)
		return math.Floor(v/q+0.5) * q
	}
	unit := func(x r3.Vec) r3.Vec { return r3.Scale(1/math.Sqrt(r3.Norm2(x)), x) }
	angle := func(a, b r3.Vec) float64 {
		return math.Atan2(math.Sqrt(r3.Norm2(r3.Cross(a, b))), r3.Dot(a, b)) * 180 / math.Pi
	}
	for b.Loop() {
		for k := range benchDaySteps {
			ph := 2 * math.Pi * math.Mod(float64(k)*dt, period) / period
			lit := ph < 0.62*2*math.Pi
			s, c := math.Sincos(ph)
			sun := r3.Vec{X: c, Z: s}
			direct := 0.0
			if lit {
				direct = ref
			}
			var no, alb [6]float64
			for i, f := range faces {
				ct := r3.Dot(f, sun)
				e := 0.0
				if ct >= cosHalf {
					e = direct * ct
				}
				n := sigma * noise.NormFloat64()
				no[i] = read(i, e, n)
				alb[i] = no[i]
				if lit && f.Z > 0 {
					alb[i] = read(i, e+200, n) // the nadir face sees the lit Earth
				}
			}
			if !lit {
				continue
			}
			eNo := unit(r3.Vec{X: no[0] - no[1], Y: no[2] - no[3], Z: no[4] - no[5]})
			eAlb := unit(r3.Vec{X: alb[0] - alb[1], Y: alb[2] - alb[3], Z: alb[4] - alb[5]})
			dNo, dAlb, dPart := angle(eNo, sun), angle(eAlb, sun), angle(eAlb, eNo)
			mNo.Add(dNo)
			qNo.Add(dNo)
			mAlb.Add(dAlb)
			qAlb.Add(dAlb)
			mPart.Add(dPart)
			qPart.Add(dPart)
		}
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*benchDaySteps), "ns/unit-step")
	if mNo.N == 0 || mPart.N == 0 || qAlb.N() == 0 {
		b.Fatal("nothing accumulated")
	}
}
