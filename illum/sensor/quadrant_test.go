package sensor

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
)

func quadSpec(t testing.TB, s QuadrantSpec) *Quadrant {
	t.Helper()
	if s.Name == "" {
		s.Name = "q"
	}
	if s.Mount == (Mount{}) {
		s.Mount, _ = FaceMount(FacePlusZ, 0, FaceNone, 0)
	}
	q, err := NewQuadrant(s)
	if err != nil {
		t.Fatal(err)
	}
	return q
}

// Elementary geometry (square aperture over square cells, own calculation):
// w = c = 2, g = 0.2, h = 1, aperture offset (0.1, −0.05), sun at tangents
// (0.3, −0.2). Spot centre (0.1 − 0.3, −0.05 + 0.2) = (−0.2, 0.15): in x
// [−1.2, 0.8] against cells [−2.1, −0.1] and [0.1, 2.1] gives lit lengths
// 1.1 and 0.7; in y [−0.85, 1.15] gives 0.75 (bottom) and 1.05 (top).
// A = 1.1·1.05, B = 0.7·1.05, C = 0.7·0.75, D = 1.1·0.75; total (w − g)².
func TestQuadrantApertureOverlapClosedForm(t *testing.T) {
	q := quadSpec(t, QuadrantSpec{ApertureSide: 2, Height: 1, CellSide: 2, Gap: 0.2})
	got := q.cellAreas(r3.Vec{X: 0.3, Y: -0.2, Z: 1}, 0.1, -0.05)
	want := [4]float64{1.1 * 1.05, 0.7 * 1.05, 0.7 * 0.75, 1.1 * 0.75}
	for i := range got {
		if math.Abs(got[i]-want[i]) > 1e-12 {
			t.Errorf("cell %c: area %.12f, closed form %.12f", 'A'+i, got[i], want[i])
		}
	}
	if s := got[0] + got[1] + got[2] + got[3]; math.Abs(s-1.8*1.8) > 1e-12 {
		t.Errorf("lit area %.12f, want (w − g)² = 3.24", s)
	}
	// The cell responses are cos θ · area / w².
	d := r3.Unit(r3.Vec{X: 0.3, Y: -0.2, Z: 1})
	r := q.CellResponse(d)
	a0 := q.cellAreas(d, 0, 0)
	for i := range r {
		if math.Abs(r[i]-d.Z*a0[i]/4) > 1e-15 {
			t.Errorf("cell response %c %.15f, want cos θ·area/w² %.15f", 'A'+i, r[i], d.Z*a0[i]/4)
		}
	}
}

// Elementary geometry of a cross-shaped wall (own calculation): c = 2,
// d = 0.5, H = 1, wall offset (0.1, −0.05), sun at tangents (1.2, −0.9).
// The x wall's shadow runs from its foot at 0.1 to 0.1 − 1.2 = −1.1 and cuts
// 0.6 from the −x cells [−2.5, −0.5] (lit 1.4, +x lit 2). The y wall's
// shadow runs from −0.05 to 0.85 and cuts 0.35 from the +y cells [0.5, 2.5]
// (top lit 1.65, bottom 2). A = 1.4·1.65, B = 2·1.65, C = 2·2, D = 1.4·2.
func TestQuadrantWallOverlapClosedForm(t *testing.T) {
	q := quadSpec(t, QuadrantSpec{Geometry: GeometryWall, Height: 1, CellSide: 2, WallDistance: 0.5})
	got := q.cellAreas(r3.Vec{X: 1.2, Y: -0.9, Z: 1}, 0.1, -0.05)
	want := [4]float64{1.4 * 1.65, 2 * 1.65, 2 * 2, 1.4 * 2}
	for i := range got {
		if math.Abs(got[i]-want[i]) > 1e-12 {
			t.Errorf("cell %c: area %.12f, closed form %.12f", 'A'+i, got[i], want[i])
		}
	}
	// The wall geometry's sum is normalised by the whole detector, 4c².
	if s := q.sum(r3.Vec{Z: 1}, 0, 0); math.Abs(s-1) > 1e-15 {
		t.Errorf("normal-incidence sum %.15f, want 1", s)
	}
}

// Dead zone of a shade wall: the shadow reaches the cells only beyond
// atan(d/H); d/H = tan 30° gives 30° (geometry; a 30° dead zone for a hobby
// four-quadrant shade is a fact of the trade, common practice, no source).
// The transfer is exactly flat inside and falls outside.
func TestQuadrantWallDeadZone(t *testing.T) {
	const h = 4.0
	q := quadSpec(t, QuadrantSpec{Geometry: GeometryWall, Height: h, CellSide: 3, WallDistance: h * math.Tan(30*deg)})
	if got := q.DeadZoneHalfAngle() / deg; math.Abs(got-30) > 1e-12 {
		t.Errorf("dead zone %.14f°, want 30°", got)
	}
	if x := q.Transfer(math.Tan(29.999 * deg)); x != 0 {
		t.Errorf("X(29.999°) = %g, want 0 inside the dead zone", x)
	}
	if x := q.Transfer(math.Tan(30.01 * deg)); !(x < 0) {
		t.Errorf("X(30.01°) = %g, want < 0 (shadow on the −x cells)", x)
	}
	// Noise-free: the reading says straight above anywhere inside.
	for _, a := range []float64{0, 10, 20, 29.9} {
		r := q.Read(sunAt(a*deg, 0), SolarConstant, Albedo{}, nil)
		if !r.Valid || angle(r.Dir, r3.Vec{Z: 1}) > 1e-15 || r.Sigma < math.Atan(math.Tan(30*deg)/math.Sqrt(3)) {
			t.Errorf("%g° inside the dead zone: %+v, want straight above with the dead zone's σ", a, r)
		}
	}
	// With the no-sun choice the dead zone gives no reading.
	spec := q.Spec()
	spec.DeadZone = DeadZoneNoSun
	qn := quadSpec(t, spec)
	if r := qn.Read(sunAt(20*deg, 35*deg), SolarConstant, Albedo{}, nil); r.Valid {
		t.Errorf("no-sun dead zone: %+v, want not valid", r)
	}
	// Outside the dead zone and inside the linear range (to atan((d + c)/H)
	// = 47.5°) the inversion is exact.
	worst := 0.0
	for ax := 31.0; ax <= 47; ax += 2 {
		for _, sx := range []float64{-1, 1} {
			for ay := 31.0; ay <= 47; ay += 4 {
				s := sunAt(sx*ax*deg, -ay*deg)
				r := q.Read(s, SolarConstant, Albedo{}, nil)
				if !r.Valid {
					t.Fatalf("(%g°, %g°): not valid: %+v", sx*ax, -ay, r)
				}
				worst = math.Max(worst, angle(r.Dir, s))
			}
		}
	}
	if worst > 1e-9 {
		t.Errorf("worst inversion error outside the dead zone %.3g rad", worst)
	}
	if got, want := q.DetectionHalfAngle(), math.Pi/2; got != want {
		t.Errorf("detection %.3f°, want 90° (far cells lit to grazing)", got/deg)
	}
}

// Outside the dead zone the estimate meets its stated accuracy: with
// realistic dark offsets, noise, gain mismatch and misalignment, 500 units,
// the per-axis error stays within 3 σ/cos θ (σ the derived Sigma, which
// holds at normal incidence and grows as the signal falls) for ≥ 99 % of
// the readings.
func TestQuadrantWallAccuracyOutsideDeadZone(t *testing.T) {
	const h = 4.0
	errs := Errors{DarkSigma: 0.002, NoiseSigma: 0.001, GainSigma: 0.01, MisalignSigma: 0.1 * deg}
	q := quadSpec(t, QuadrantSpec{Geometry: GeometryWall, Height: h, CellSide: 3, WallDistance: h * math.Tan(30*deg),
		ImbalanceMargin: 0.05, DeadZoneImbalance: 0.01, SignalMargin: 0.2, Errors: errs})
	sigma := q.Sigma()
	t.Logf("derived σ %.3f° per axis; linear range to %.2f°, dead zone %.2f°", sigma/deg, q.LinearHalfAngle()/deg, q.DeadZoneHalfAngle()/deg)
	rng := rand.New(rand.NewPCG(3, 4))
	n, bad := 0, 0
	for range 500 {
		u := q.Draw(rng).(*Quadrant)
		for range 20 {
			ax := (33 + 11*rng.Float64()) * deg * float64(1-2*rng.IntN(2))
			ay := (33 + 11*rng.Float64()) * deg * float64(1-2*rng.IntN(2))
			s := sunAt(ax, ay)
			r := u.Read(s, SolarConstant, Albedo{}, rng)
			if !r.Valid || r.Sigma > 0 {
				continue // no sun, or a dead-zone reading with its own σ
			}
			n++
			ex := math.Atan(r.Dir.X/r.Dir.Z) - ax
			ey := math.Atan(r.Dir.Y/r.Dir.Z) - ay
			if lim := 3 * sigma / s.Z; math.Abs(ex) > lim || math.Abs(ey) > lim {
				bad++
			}
		}
	}
	t.Logf("%d valid readings, %d beyond 3σ/cos θ", n, bad)
	if n < 9000 || float64(bad) > 0.01*float64(n) {
		t.Errorf("%d of %d readings beyond 3σ/cos θ (σ %.3f°)", bad, n, sigma/deg)
	}
}

// The validity gate: no edge-of-range direction. Beyond the linear range
// less the imbalance margin there is no sun; a partial spot or a strong
// albedo fails the signal gate; a cell at full scale gives no sun.
func TestQuadrantValidityGate(t *testing.T) {
	q := quadSpec(t, QuadrantSpec{ApertureSide: 2, Height: 1, CellSide: 2, Gap: 0.1, ImbalanceMargin: 0.05,
		SignalMargin: 0.2, Threshold: 0.01})
	lin := q.LinearHalfAngle()
	// Closed form: |X| = 0.95 at tan α = 0.95·(w − g)/2h.
	if want := math.Atan(0.95 * 1.9 / 2); math.Abs(lin-want) > 1e-12 {
		t.Errorf("linear half-angle %.6f°, closed form %.6f°", lin/deg, want/deg)
	}
	if r := q.Read(sunAt(lin-1e-6, 0), SolarConstant, Albedo{}, nil); !r.Valid {
		t.Errorf("just inside the linear range: %+v, want valid", r)
	}
	if r := q.Read(sunAt(lin+1e-6, 0), SolarConstant, Albedo{}, nil); r.Valid {
		t.Errorf("just outside the linear range: %+v, want no sun", r)
	}
	if q.SeesSun(sunAt(lin+1e-6, 0)) || !q.SeesSun(sunAt(lin-1e-6, 0)) {
		t.Error("SeesSun disagrees with the reading at the linear range's edge")
	}
	// With a small dark offset the saturated ring (spot on one column of
	// cells) must stay invalid: the edge test alone would pass it.
	u := *q
	u.unit.dark = [4]float64{0.0005, 0.0002, 0.0007, 0.0001}
	for a := lin + 0.01; a < q.DetectionHalfAngle(); a += 0.01 {
		if r := u.Read(sunAt(a, 0.1), SolarConstant, Albedo{}, nil); r.Valid {
			t.Fatalf("dark offsets, %.2f° beyond the linear range: valid %+v", a/deg, r)
		}
	}
	// Penumbra at 70 % of the sun: the cell sum is 30 % below expectation.
	if r := q.Read(sunAt(10*deg, 5*deg), 0.7*SolarConstant, Albedo{}, nil); r.Valid {
		t.Errorf("penumbra at 70 %%: %+v, want no sun (signal gate)", r)
	}
	// Albedo of 30 % of the sun on the cells fails the signal gate; 10 %
	// passes with a pulled direction.
	alb := Albedo{Cells: [4]float64{0, 0, 0.15 * SolarConstant, 0.15 * SolarConstant}}
	if r := q.Read(sunAt(0, 0), SolarConstant, alb, nil); r.Valid {
		t.Errorf("30 %% albedo: %+v, want no sun", r)
	}
	// Light on the bottom cells means a spot moved toward −y: a sun toward +y.
	alb = Albedo{Cells: [4]float64{0, 0, 0.05 * SolarConstant, 0.05 * SolarConstant}}
	if r := q.Read(sunAt(0, 0), SolarConstant, alb, nil); !r.Valid || r.Dir.Y <= 0 {
		t.Errorf("10 %% albedo on the bottom cells: %+v, want valid, pulled toward +y", r)
	}
	// Albedo alone whose mean direction lights no cell adds nothing (never
	// an even split).
	if r := q.Read(sunAt(0, 0), 0, Albedo{Irradiance: 400, Dir: sunAt(85*deg, 0)}, nil); r.Signal != 0 {
		t.Errorf("albedo from outside the detection range: signal %g, want 0", r.Signal)
	}
	// A cell at full scale gives no sun.
	spec := q.Spec()
	spec.Errors = Errors{FullScale: 0.2}
	qs := quadSpec(t, spec)
	if r := qs.Read(sunAt(0, 0), SolarConstant, Albedo{}, nil); r.Valid || !r.Saturated {
		t.Errorf("cells at full scale: %+v, want saturated, no sun", r)
	}
}

// Twist about the boresight turns the measured direction about it: a drawn
// twist of δ moves a sun at α off the boresight by 2·sin(α)·sin(δ/2) in
// angle (closed form) within the linear range.
func TestQuadrantTwist(t *testing.T) {
	q := quadSpec(t, QuadrantSpec{ApertureSide: 2, Height: 1, CellSide: 2, TwistSigma: 1 * deg})
	u := q.Draw(rand.New(rand.NewPCG(1, 2))).(*Quadrant)
	x, _, _ := u.actual.Axes()
	delta := math.Atan2(x.Y, x.X)
	s := sunAt(20*deg, 0)
	r := u.Read(s, SolarConstant, Albedo{}, nil)
	th := math.Acos(s.Z)
	want := 2 * math.Asin(math.Sin(th)*math.Sin(math.Abs(delta)/2))
	if delta == 0 || math.Abs(angle(r.Dir, s)-want) > 1e-9 {
		t.Errorf("twist %.4f°: error %.6f°, closed form %.6f°", delta/deg, angle(r.Dir, s)/deg, want/deg)
	}
}

// Every derived range agrees with the transfer curve: the dead zone ends
// where X leaves 0, the detection range where the light leaves the cells.
func TestQuadrantRangesMatchTransfer(t *testing.T) {
	for _, s := range []QuadrantSpec{
		{ApertureSide: 2, Height: 1, CellSide: 2, Gap: 0.1},
		{ApertureSide: 3, Height: 1, CellSide: 1},
		{ApertureSide: 1.5, Height: 2, CellSide: 1, Gap: 0.2},
		{Geometry: GeometryWall, Height: 3, CellSide: 2, WallDistance: 1},
	} {
		q := quadSpec(t, s)
		if dz := q.DeadZoneHalfAngle(); dz > 0 {
			if q.Transfer(math.Tan(dz)*(1-1e-9)) != 0 || q.Transfer(math.Tan(dz)*(1+1e-6)) == 0 {
				t.Errorf("%+v: dead zone %.4f° does not bound X = 0", s, dz/deg)
			}
		}
		if det := q.DetectionHalfAngle(); det < math.Pi/2 {
			if q.Response(sunAt(det*(1-1e-6), 0)) == 0 || q.Response(sunAt(det*(1+1e-6), 0)) != 0 {
				t.Errorf("%+v: detection %.4f° does not bound the response", s, det/deg)
			}
		}
		lin := q.LinearHalfAngle()
		if !q.SeesSun(sunAt(lin*(1-1e-6), 0)) || q.SeesSun(sunAt(lin*(1+1e-6)+1e-9, 0)) {
			t.Errorf("%+v: linear range %.4f° does not bound the valid readings", s, lin/deg)
		}
	}
}

// Reading a quadrant sensor (either geometry, with albedo cells and noise)
// allocates nothing: it runs in the step loop.
func TestQuadrantReadAllocatesNothing(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	errs := Errors{DarkSigma: 0.001, NoiseSigma: 0.001, GainSigma: 0.01, ADCBits: 12, FullScale: 1.5}
	for _, s := range []QuadrantSpec{
		{ApertureSide: 2, Height: 1, CellSide: 2, Gap: 0.1, SignalMargin: 0.2, ImbalanceMargin: 0.05, Errors: errs},
		{Geometry: GeometryWall, Height: 4, CellSide: 3, WallDistance: 2.31, SignalMargin: 0.2, ImbalanceMargin: 0.05, Errors: errs},
	} {
		q := quadSpec(t, s).Draw(rng)
		alb := Albedo{Irradiance: 100, Cells: [4]float64{20, 30, 25, 25}}
		if n := testing.AllocsPerRun(200, func() { q.Read(sunAt(20*deg, -10*deg), SolarConstant, alb, rng) }); n != 0 {
			t.Errorf("%v: %g allocations per read", s.Geometry, n)
		}
	}
}

func BenchmarkQuadrantGeometries(b *testing.B) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, s := range []QuadrantSpec{
		{ApertureSide: 2, Height: 1, CellSide: 2, Gap: 0.1, SignalMargin: 0.2, ImbalanceMargin: 0.05},
		{Geometry: GeometryWall, Height: 4, CellSide: 3, WallDistance: 2.31, SignalMargin: 0.2, ImbalanceMargin: 0.05},
	} {
		q := quadSpec(b, s)
		b.Run(s.Geometry.String(), func(b *testing.B) {
			sun := sunAt(20*deg, -35*deg)
			for b.Loop() {
				q.Read(sun, SolarConstant, Albedo{}, rng)
			}
		})
	}
}

// An aperture wider than a cell but narrower than the detector (c < w ≤
// 2c + g): once the spot's outer edge leaves the detector the far cell
// stays fully lit (r = c) while the near one's lit length l = w/2 − x₀ − g/2
// falls, so X = (c − l)/(c + l) still rises monotonically to 1 at
// tan α = (w − g)/(2h) (elementary geometry). The linear range therefore
// ends there, as for any w > c, and does not collapse toward 0 as w nears
// 2c + g (it printed ±0.0° at w = 4.0 mm over 2 mm cells, ±58.4° at 4.11).
func TestQuadrantWideApertureKeepsItsRange(t *testing.T) {
	const h, c, g = 1.2, 2.0, 0.1
	prev := 0.0
	for _, w := range []float64{2.5, 3, 3.5, 4.0, 4.1} {
		q := quad(t, w, h, c, g, Errors{})
		// Transfer against the closed form beyond the spot leaving the detector.
		x0 := (c + g/2 - w/2 + (w-g)/2) / 2 // halfway through the second phase
		l := w/2 - x0 - g/2
		if got, want := q.Transfer(x0/h), (c-l)/(c+l); math.Abs(math.Abs(got)-want) > 1e-12 {
			t.Errorf("w=%g: transfer %g at tan %g, want ±%g", w, got, x0/h, want)
		}
		if got := q.LinearImbalance(); got != 1 {
			t.Errorf("w=%g: linear range ends at X = %g, want 1", w, got)
		}
		lin := q.LinearHalfAngle() / deg
		if !(lin > prev) {
			t.Errorf("w=%g: valid range ±%.2f° is not wider than at the narrower aperture (±%.2f°)", w, lin, prev)
		}
		prev = lin
		// A noise-free reading in the second phase inverts exactly.
		a := math.Atan(x0 / h)
		sun := sunAt(a, 0)
		r := q.Read(sun, SolarConstant, Albedo{}, nil)
		if !r.Valid || angle(r.Dir, sun) > 1e-9 {
			t.Errorf("w=%g: sun at %.2f° reads valid %v, %g rad off", w, a/deg, r.Valid, angle(r.Dir, sun))
		}
	}
}

// The dead zone as the readings see it: a wall H = 4 mm high, cells 3 mm
// wide 2.31 mm from it, is flat to atan(2.31/4) = 30.0°, and its imbalance
// stays below dead_zone_imbalance 0.03 until the shadow reaches
// s = 2c·X/(1 + X) = 0.1748 mm into the near cell, tan α = (d + s)/H,
// 31.85° (closed form of X = s/(2c − s)). A reading there still says
// "straight above", and its own σ is taken over that wider zone.
func TestQuadrantDeadZoneAsRead(t *testing.T) {
	m, _ := FaceMount(FacePlusZ, 0, FaceNone, 0)
	q, err := NewQuadrant(QuadrantSpec{Name: "w", Mount: m, Geometry: GeometryWall, Height: 4, CellSide: 3, WallDistance: 2.31,
		Threshold: 1e-3, ImbalanceMargin: 0.05, DeadZoneImbalance: 0.03, Sigma: 0.5 * deg})
	if err != nil {
		t.Fatal(err)
	}
	s := 2 * 3 * 0.03 / 1.03
	want := math.Atan((2.31 + s) / 4)
	if got := q.DeadZoneReadHalfAngle(); math.Abs(got-want) > 1e-9 {
		t.Errorf("dead zone as read ±%.4f°, want ±%.4f°", got/deg, want/deg)
	}
	if got := q.DeadZoneHalfAngle(); math.Abs(got-math.Atan(2.31/4)) > 1e-12 {
		t.Errorf("flat part ±%.4f°, want ±%.4f°", got/deg, math.Atan(2.31/4)/deg)
	}
	r := q.Read(sunAt(want-0.05*deg, 0), SolarConstant, Albedo{}, nil)
	if !r.Valid || math.Abs(r.Sigma-math.Atan(math.Tan(want)/math.Sqrt(3))) > 1e-12 {
		t.Errorf("at %.2f°: %+v; want a straight-above reading with σ = atan(tan δ/√3) of the zone as read", (want-0.05*deg)/deg, r)
	}
	if !strings.Contains(ViewText(q), "dead zone ±31.8° (flat to ±30.0°") {
		t.Errorf("view text %q does not give the zone as read", ViewText(q))
	}
}

// The dead-zone keys on a geometry without a dead zone would change
// nothing: they are refused, naming the key and the fix; their defaults
// are accepted.
func TestQuadrantDeadZoneKeysNeedADeadZone(t *testing.T) {
	m, _ := FaceMount(FacePlusZ, 0, FaceNone, 0)
	base := func(geometryKeys map[string]float64) Params {
		p := Params{Num: map[string]float64{"shade_height_mm": 1, "cell_size_mm": 2, "gap_mm": 0.1, "aperture_mm": 0,
			"signal_margin": 0.2, "imbalance_margin": 0.05, "dead_zone_imbalance": 0.03}, Text: map[string]string{"dead_zone": "straight-above"}}
		for k, v := range geometryKeys {
			p.Num[k] = v
		}
		return p
	}
	c := Common{Name: "q", Mount: m, Threshold: 0.01}
	if _, err := buildQuadrant(c, base(nil)); err != nil {
		t.Fatalf("defaults refused: %v", err)
	}
	p := base(nil)
	p.Text["dead_zone"] = "no-sun"
	if _, err := buildQuadrant(c, p); err == nil || !strings.Contains(err.Error(), "dead_zone: this geometry has no dead zone") {
		t.Errorf("dead_zone no-sun on a one-cell aperture: %v", err)
	}
	p = base(map[string]float64{"dead_zone_imbalance": 0.1})
	if _, err := buildQuadrant(c, p); err == nil || !strings.Contains(err.Error(), "widen aperture_mm") {
		t.Errorf("dead_zone_imbalance on a one-cell aperture: %v", err)
	}
	p = base(map[string]float64{"aperture_mm": 5, "dead_zone_imbalance": 0.1})
	if _, err := buildQuadrant(c, p); err != nil {
		t.Errorf("dead_zone_imbalance on a 5 mm aperture (a dead zone): %v", err)
	}
	p = base(map[string]float64{"wall_distance_mm": 0, "dead_zone_imbalance": 0.1})
	if _, err := buildQuadrant(c, p); err == nil || !strings.Contains(err.Error(), "wall_distance_mm > 0") {
		t.Errorf("dead_zone_imbalance on a wall at distance 0: %v", err)
	}
}

// The printed valid range honours the threshold: one cell-wide aperture
// (w = c = 2, g = 0.1, h = 1.2) lights (w − g)²/w² = 0.9025 of the spot at
// normal incidence, and the sum along an axis is cos α·(w − g)/w·(w − g)/w
// while the spot stays on the detector, so a threshold of 0.8 ends the
// range at cos α = 0.8/0.9025, 27.56° (closed form), inside the linear
// range (36.9°); 0.95 is refused.
func TestQuadrantValidRangeHonoursThreshold(t *testing.T) {
	m, _ := FaceMount(FacePlusZ, 0, FaceNone, 0)
	spec := QuadrantSpec{Name: "q", Mount: m, ApertureSide: 2, Height: 1.2, CellSide: 2, Gap: 0.1, Threshold: 0.8,
		SignalMargin: 0.2, ImbalanceMargin: 0.05, Sigma: deg}
	q, err := NewQuadrant(spec)
	if err != nil {
		t.Fatal(err)
	}
	want := math.Acos(0.8 / 0.9025)
	if got := q.ValidHalfAngle(); math.Abs(got-want) > 1e-9 {
		t.Errorf("valid range ±%.4f°, want ±%.4f°", got/deg, want/deg)
	}
	if !q.Read(sunAt(want-0.1*deg, 0), SolarConstant, Albedo{}, nil).Valid || q.Read(sunAt(want+0.1*deg, 0), SolarConstant, Albedo{}, nil).Valid {
		t.Error("readings do not change validity at the printed edge")
	}
	if !strings.Contains(ViewText(q), "valid within ±27.6° per axis (where the cell sum falls below the threshold 0.8") {
		t.Errorf("view text %q", ViewText(q))
	}
	spec.Threshold = 0.95
	if _, err := NewQuadrant(spec); err == nil || !strings.Contains(err.Error(), "no reading can be valid; give a lower threshold") {
		t.Errorf("threshold 0.95: %v", err)
	}
}

// A straight-above reading off the diagonal passes the signal gate: a sun
// 38° off the boresight at 45° azimuth lies inside the wall's 30° dead zone
// on both axes (tan 38°/√2 = 0.5525 < 2.31/4) and sums cos 38° = 0.788,
// more than 20 % below the boresight's 1 but within the span the zone
// allows (its corner sums 0.708; closed form). It read as no sun.
func TestQuadrantDeadZoneDiagonalIsValid(t *testing.T) {
	m, _ := FaceMount(FacePlusZ, 0, FaceNone, 0)
	q, err := NewQuadrant(QuadrantSpec{Name: "w", Mount: m, Geometry: GeometryWall, Height: 4, CellSide: 3, WallDistance: 2.31,
		Threshold: 0.05, SignalMargin: 0.2, ImbalanceMargin: 0.05, DeadZoneImbalance: 0.03, Sigma: 0.5 * deg})
	if err != nil {
		t.Fatal(err)
	}
	tn := math.Tan(38*deg) / math.Sqrt2
	sun := vecmath.Unit(r3.Vec{X: tn, Y: tn, Z: 1})
	r := q.Read(sun, SolarConstant, Albedo{}, nil)
	if !r.Valid || angle(r.Dir, r3.Vec{Z: 1}) > 1e-12 {
		t.Errorf("38° on the diagonal: %+v; want a valid straight-above reading", r)
	}
	if !q.SeesSun(sun) {
		t.Error("coverage does not count the diagonal sun the reading reports")
	}
}
