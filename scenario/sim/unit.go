package sim

import (
	"context"
	"math"
	"math/rand/v2"
	"sync/atomic"

	"gonum.org/v1/gonum/num/quat"
	"gonum.org/v1/gonum/spatial/r3"

	"sunsight/ephem"
	"sunsight/illum"
	"sunsight/illum/albedo"
	"sunsight/illum/sensor"
	"sunsight/scenario/attitude"
)

// solarIrradiance returns the direct solar irradiance (W/m²) at a distance
// from the sun in km: S₀·(AU/d)² with S₀ at 1 AU (ephem.SolarIrradiance1AU).
func solarIrradiance(distKm float64) float64 {
	q := ephem.AUKm / distKm
	return ephem.SolarIrradiance1AU * q * q
}

// degOf converts radians to degrees.
func degOf(rad float64) float64 { return rad * 180 / math.Pi }

// angleBetween returns the angle (rad) between two unit vectors, accurate
// near 0 and π (atan2 of |a×b| and a·b).
func angleBetween(a, b r3.Vec) float64 {
	return math.Atan2(vecNorm(r3.Cross(a, b)), r3.Dot(a, b))
}

// runChunk simulates the steps [tk.k0, tk.k1) of unit tk.unit, whose
// sensors (with their drawn errors) are arr.
func runChunk(ctx context.Context, cfg *Config, arr *sensor.Array, tk task, done *atomic.Int64, total int, table *localAlbedo) (*unitAcc, error) {
	u := tk.unit
	noiseSrc := rand.NewPCG(0, 0)
	noise := rand.New(noiseSrc)
	n := arr.Len()
	nEst := len(cfg.Estimators)

	prop := cfg.NewPropagator()
	var alb *albedo.Model
	if cfg.NewAlbedo != nil {
		m, err := cfg.NewAlbedo()
		if err != nil {
			return nil, err
		}
		alb = m
	}
	var corr *albedo.Model
	if alb != nil && cfg.NewCorrection != nil {
		m, err := cfg.NewCorrection()
		if err != nil {
			return nil, err
		}
		corr = m
	}
	jd0 := ephem.JulianDateTT(cfg.Epoch)
	jdUT0 := ephem.JulianDateUT1(cfg.Epoch)

	// Per-step buffers, allocated once.
	readNo := make([]sensor.Reading, n)
	readAlb := make([]sensor.Reading, n)
	var albIn []albedo.Sensor
	var albOut []albedo.Result
	var albBody []sensor.Albedo
	var corrOut []albedo.Result
	var sunBlocked []bool
	if cfg.Blocked != nil {
		sunBlocked = make([]bool, n)
	}
	cosine := make([]bool, n)
	for i, s := range arr.Sensors() {
		cosine[i] = s.Kind() == sensor.KindCosine
	}
	if alb != nil {
		albIn = make([]albedo.Sensor, n)
		albOut = make([]albedo.Result, n)
		corrOut = make([]albedo.Result, n)
		albBody = make([]sensor.Albedo, n)
		for i, s := range arr.Sensors() {
			albIn[i].HalfAngle = s.HalfAngle()
			if cfg.AlbedoResponse != nil {
				albIn[i].Response = cfg.AlbedoResponse[i]
			}
		}
	}
	sees := make([]func(r3.Vec) bool, n)
	for i, s := range arr.Sensors() {
		if cfg.Viewers != nil {
			sees[i] = cfg.Viewers[i].Sees
		} else {
			sees[i] = s.InFOV
		}
	}

	sun := newSunCache(cfg.Sun, jd0)
	acc := newUnitAcc(cfg, arr, alb != nil, u == 0, float64(tk.k0)*cfg.Step)
	acc.unit = u
	law := cfg.Law
	if cfg.LawForUnit != nil {
		law = cfg.LawForUnit(u)
	}
	eclAware, _ := law.(attitude.EclipseAware)
	var noiseSaved rand.PCG

	for k := tk.k0; k < tk.k1; k++ {
		if k&1023 == 0 && k > tk.k0 {
			if ctx.Err() != nil {
				return nil, ctx.Err()
			}
			if d := done.Add(1024); cfg.Progress != nil {
				cfg.Progress(float64(d) / float64(total))
			}
		}
		if k == tk.k0 || k%noiseBlockSteps == 0 {
			seedNoise(noiseSrc, cfg.Seed, u, k)
		}
		t := float64(k) * cfg.Step
		st := prop.StateAt(t)
		jd := jd0 + t/86400
		sunU, sunD := sun.at(t)
		lit, region := shadow(cfg.Cylindrical, st.R, sunU, sunD)
		inEclipse := region != illum.Sunlit
		var A attitudeRot
		if eclAware != nil {
			A = attitudeRot(eclAware.AttitudeInEclipse(t, st, sunU, inEclipse))
		} else {
			A = attitudeRot(law.Attitude(t, st, sunU))
		}
		sunBody := A.toBody(sunU)
		direct := solarIrradiance(sunD) * lit

		// Readings without albedo, then with it, on the same noise draws.
		// A sensor whose view of the sun is blocked by the body gets no
		// direct light.
		for i := range sunBlocked {
			sunBlocked[i] = cfg.Blocked[i] != nil && cfg.Blocked[i](sunBody)
		}
		noiseSaved = *noiseSrc
		readAll(readNo, arr, sunBody, direct, nil, noise, sunBlocked)
		if alb != nil {
			for i, s := range arr.Sensors() {
				albIn[i].Normal = A.toECI(s.Mount().Boresight())
			}
			gmst := ephem.GMST(jdUT0 + t/86400)
			if table == nil || !table.irradiance(albOut, st, sunU, sunD) {
				alb.Irradiance(albOut, st.R, sunU, sunD, gmst, jd, albIn)
			}
			if corr != nil {
				corr.Irradiance(corrOut, st.R, sunU, sunD, gmst, jd, albIn)
			}
			for i := range albOut {
				albBody[i] = sensor.Albedo{Irradiance: albOut[i].Irradiance}
				if albOut[i].Irradiance > 0 {
					albBody[i].Dir = A.toBody(albOut[i].Dir)
				}
				if corr != nil && cosine[i] {
					albBody[i].Irradiance -= corrOut[i].Irradiance
				}
				// Obstructions: the albedo is dropped when its mean
				// arrival direction is blocked (a first approximation;
				// a partly blocked Earth is not split).
				if cfg.Blocked != nil && cfg.Blocked[i] != nil && albOut[i].Irradiance > 0 && cfg.Blocked[i](albBody[i].Dir) {
					albBody[i] = sensor.Albedo{}
				}
			}
			*noiseSrc = noiseSaved
			readAll(readAlb, arr, sunBody, direct, albBody, noise, sunBlocked)
		}

		seen := 0
		if region == illum.Sunlit {
			for i := range n {
				if sees[i](sunBody) {
					seen++
					acc.inView[i]++
				}
			}
		}
		nadirBody := A.toBody(r3.Scale(-1/vecNorm(st.R), st.R))
		sinBeta := illum.SinBetaAngle(st.R, st.V, sunU)
		acc.step(k, t, region, lit, seen, sunBody, nadirBody, sinBeta, readNo, readAlb, arr, cfg.Estimators[:nEst])
	}
	acc.end(float64(tk.k1) * cfg.Step)
	return acc, nil
}

// readAll reads every sensor; blocked[i] (nil: none blocked) cuts sensor i's
// direct sunlight.
func readAll(dst []sensor.Reading, arr *sensor.Array, sun r3.Vec, direct float64, alb []sensor.Albedo, noise *rand.Rand, blocked []bool) {
	if blocked == nil {
		arr.Read(dst, sun, direct, alb, noise)
		return
	}
	for i, s := range arr.Sensors() {
		d := direct
		if blocked[i] {
			d = 0
		}
		var a sensor.Albedo
		if alb != nil {
			a = alb[i]
		}
		dst[i] = s.Read(sun, d, a, noise)
	}
}

// attitudeRot is a body ← ECI rotation with named directions of use.
type attitudeRot r3.Rotation

// toBody expresses an ECI vector in body axes.
func (a attitudeRot) toBody(v r3.Vec) r3.Vec { return r3.Rotation(a).Rotate(v) }

// toECI expresses a body vector in ECI axes (the conjugate rotation).
func (a attitudeRot) toECI(v r3.Vec) r3.Vec {
	q := quat.Conj(quat.Number(a))
	return r3.Rotation(q).Rotate(v)
}

// shadow evaluates the configured shadow model. The day side (r·ŝ ≥ 0) of an
// orbit above 100 km is always in full sun: there the Earth's centre is at
// least 90° − 0.02° from the sun while the Earth's and sun's apparent radii
// add up to less than 80° (closed form), so the conical test is skipped.
func shadow(cylindrical bool, r, sunU r3.Vec, sunD float64) (float64, illum.Region) {
	if r3.Dot(r, sunU) >= 0 && r3.Norm2(r) > (illum.EarthRadiusKm+100)*(illum.EarthRadiusKm+100) {
		return 1, illum.Sunlit
	}
	if cylindrical {
		lit := illum.ShadowCylindrical(r, sunU)
		if lit > 0 {
			return 1, illum.Sunlit
		}
		return 0, illum.Umbra
	}
	return illum.ShadowConical(r, r3.Scale(sunD, sunU))
}
