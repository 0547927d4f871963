package plots

import (
	"bytes"
	"flag"
	"fmt"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"image/color"
	"math"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
)

var regen = flag.Bool("regen", false, "rewrite testdata/golden/*.svg from the current code")

// Hammer projection, Snyder 1987 USGS PP 1395 (from memory): closed-form
// values at the centre, the poles, the ±180° meridian and the equator.
func TestHammerKnownPoints(t *testing.T) {
	const tol = 1e-12
	r2 := math.Sqrt2
	cases := []struct {
		name       string
		λ, φ, x, y float64
	}{
		{"centre", 0, 0, 0, 0},                                              // closed form
		{"north pole", 0, math.Pi / 2, 0, r2},                               // closed form: y = √2
		{"south pole", 1, -math.Pi / 2, 0, -r2},                             // any λ, closed form
		{"east edge", math.Pi, 0, 2 * r2, 0},                                // closed form: x = 2√2
		{"west edge", -math.Pi, 0, -2 * r2, 0},                              // closed form
		{"equator 90°", math.Pi / 2, 0, 2 / math.Sqrt(1+math.Sqrt(0.5)), 0}, // 2√2·sin45°/√(1+cos45°)
	}
	for _, c := range cases {
		x, y := Hammer(c.λ, c.φ)
		if math.Abs(x-c.x) > tol || math.Abs(y-c.y) > tol {
			t.Errorf("%s: Hammer(%g, %g) = (%.15g, %.15g), want (%.15g, %.15g)", c.name, c.λ, c.φ, x, y, c.x, c.y)
		}
	}
	// The ±180° meridian maps onto the boundary ellipse x²/8 + y²/2 = 1
	// (closed form).
	worst := 0.0
	for φ := -89.0; φ <= 89; φ += 1 {
		for _, λ := range []float64{-math.Pi, math.Pi} {
			x, y := Hammer(λ, φ*math.Pi/180)
			worst = math.Max(worst, math.Abs(x*x/8+y*y/2-1))
		}
	}
	if worst > 1e-12 {
		t.Errorf("edge meridian off the boundary ellipse by %g", worst)
	}
}

// Equal-area property (own calculation): the projected area of every
// 10° × 10° cell, from the shoelace formula over a finely sampled outline,
// equals its area on the unit sphere, Δλ (sin φ₂ − sin φ₁); the whole map
// has the sphere's area 4π.
func TestHammerEqualArea(t *testing.T) {
	worst, total := 0.0, 0.0
	for a := -180.0; a < 180; a += 10 {
		for e := -90.0; e < 90; e += 10 {
			poly := cellPolygon(a, a+10, e, e+10, 200)
			area := 0.0
			for i := range poly {
				p, q := poly[i], poly[(i+1)%len(poly)]
				area += p.X*q.Y - q.X*p.Y
			}
			area = math.Abs(area) / 2
			sphere := 10 * math.Pi / 180 * (math.Sin((e+10)*math.Pi/180) - math.Sin(e*math.Pi/180))
			worst = math.Max(worst, math.Abs(area/sphere-1))
			total += area
		}
	}
	t.Logf("worst relative cell-area error %.2e, total %.6f (4π = %.6f)", worst, total, 4*math.Pi)
	if worst > 1e-3 {
		t.Errorf("cell areas differ from sphere areas by up to %.2e", worst)
	}
	if math.Abs(total/(4*math.Pi)-1) > 1e-4 {
		t.Errorf("total projected area %g, want 4π", total)
	}
}

func ExampleHammer() {
	x, y := Hammer(math.Pi, 0)
	fmt.Printf("%.6f %.6f\n", x, y)
	x, y = Hammer(0, math.Pi/2)
	fmt.Printf("%.6f %.6f\n", x, y)
	// Output:
	// 2.828427 0.000000
	// 0.000000 1.414214
}

func mustSVG(t *testing.T, c *Chart) string {
	t.Helper()
	b, err := c.SVG()
	if err != nil {
		t.Fatal(err)
	}
	png, err := c.Encode("png")
	if err != nil || len(png) < 1000 {
		t.Fatalf("png: %d bytes, %v", len(png), err)
	}
	return string(b)
}

func wantText(t *testing.T, svg string, texts ...string) {
	t.Helper()
	for _, s := range texts {
		if !strings.Contains(svg, ">"+s+"<") {
			t.Errorf("figure lacks the text %q", s)
		}
	}
}

func TestSkyMapFigure(t *testing.T) {
	f := SkyMap{
		AzDeg:          []float64{-135, -45, 45, 135},
		ElDeg:          []float64{-45, 45},
		Counts:         [][]int{{0, 1, 2, 3}, {4, 7, 1, 0}},
		Boresights:     []Marker{{"sensor A", 10, 20}},
		SunTrack:       []Point{{0, 0}, {370, 10}},
		Nadir:          []Point{{0, 90}, {30, 89.5}},
		EarthRadiusDeg: 67,
		Obstructions:   []Marker{{"solar wing", 90, -30}},
	}
	c, err := f.Plot(Caption{Scenario: "test scenario"})
	if err != nil {
		t.Fatal(err)
	}
	svg := mustSVG(t, c)
	wantText(t, svg, "0 sensors (blind)", "1 sensor", "2 sensors", "3 sensors", "4+ sensors", "sun at start", "sun track, arrow: time",
		"sensor boresight", "sensor A", "Scenario: test scenario", "-120°", "+30°", "+X", "−Y", "+Z", "−Z",
		"nadir, Earth 67° radius", "solar wing", "obstruction")
	if !strings.Contains(svg, "<image") || strings.Count(svg, "<path") > 400 {
		t.Errorf("sky fill not one raster image (%d paths)", strings.Count(svg, "<path"))
	}
	// Read back the raster: the pixel at each cell centre has its class
	// colour (7 clamped to 4+; hatch stripes aside).
	img := c.sky.Fill
	for i, el := range f.ElDeg {
		for j, az := range f.AzDeg {
			x, y := Hammer(az*math.Pi/180, el*math.Pi/180)
			px := int((x/(2*math.Sqrt2) + 1) / 2 * float64(img.Bounds().Dx()))
			py := int((1 - y/math.Sqrt2) / 2 * float64(img.Bounds().Dy()))
			want := coverageClass(f.Counts[i][j])
			var got color.Color = img.At(px, py)
			if want == 0 && got == color.Color(blindHatch) {
				continue
			}
			if got != color.Color(coverageColours[want]) {
				t.Errorf("cell (%g, %g): pixel %v, want class %d colour %v", el, az, got, want, coverageColours[want])
			}
		}
	}
	// 370° wraps to 10°.
	x, y := Hammer(10*math.Pi/180, 10*math.Pi/180)
	if p := c.sky.Track[1]; math.Abs(p.X-x) > 1e-12 || math.Abs(p.Y-y) > 1e-12 {
		t.Errorf("track point 1 at %v, want (%g, %g)", p, x, y)
	}
	// A nadir that stays within a few degrees is drawn as one disc.
	if len(c.sky.Earth) == 0 || c.sky.EarthCentre == nil || len(c.sky.NadirTrack) != 0 {
		t.Errorf("fixed nadir not drawn as a disc")
	}
	f.Nadir = []Point{{0, 0}, {90, 0}, {180, 0}}
	c, err = f.Plot(Caption{})
	if err != nil {
		t.Fatal(err)
	}
	if len(c.sky.Earth) != 0 || len(c.sky.NadirTrack) != 3 {
		t.Errorf("moving nadir not drawn as a track")
	}
}

// A cell across ±180° colours both edges of the map.
func TestSkyMapCellAcross180(t *testing.T) {
	f := SkyMap{AzDeg: []float64{0, 180}, ElDeg: []float64{0}, Counts: [][]int{{1, 2}}}
	g := newClassGrid(f)
	for _, c := range []struct{ az, want float64 }{{0, 1}, {89, 1}, {91, 2}, {179, 2}, {-179, 2}, {-91, 2}, {-89, 1}, {540, 2}} {
		if got := g.class(c.az, 0); float64(got) != c.want {
			t.Errorf("class at az %g = %d, want %g", c.az, got, c.want)
		}
	}
}

// The inverse projection undoes the projection (closed-form round trip)
// and refuses points outside the boundary ellipse.
func TestInverseHammer(t *testing.T) {
	worst := 0.0
	for lam := -179.0; lam <= 179; lam += 7 {
		for phi := -89.0; phi <= 89; phi += 7 {
			x, y := Hammer(lam*math.Pi/180, phi*math.Pi/180)
			l, p, ok := InverseHammer(x, y)
			if !ok {
				t.Fatalf("(%g, %g) projected outside the map", lam, phi)
			}
			worst = math.Max(worst, math.Max(math.Abs(l*180/math.Pi-lam), math.Abs(p*180/math.Pi-phi)))
		}
	}
	if worst > 1e-9 {
		t.Errorf("round trip off by %g°", worst)
	}
	if _, _, ok := InverseHammer(2.8, 1.0); ok {
		t.Error("point outside the ellipse accepted")
	}
}

func TestTimelineFigure(t *testing.T) {
	nan := math.NaN()
	f := Timeline{
		T:              []float64{0, 60, 120, 180, 240},
		SensorsSeeing:  []int{2, 3, 0, 0, 1},
		Valid:          []bool{true, true, false, false, false},
		Umbra:          []Interval{{130, 170}},
		Penumbra:       []Interval{{120, 130}, {170, 180}},
		ErrNoAlbedoDeg: []float64{0.5, 0.6, nan, nan, 0.7},
		ErrAlbedoDeg:   []float64{1.5, 2.6, nan, 3, 4},
	}
	c, err := f.Plot(Caption{Model: "m"})
	if err != nil {
		t.Fatal(err)
	}
	svg := mustSVG(t, c)
	wantText(t, svg, "Sensors seeing the sun", "Sun vector valid", "Sun-vector error", "time since epoch (min)",
		"error (deg)", "sensors", "umbra", "penumbra", "without albedo", "with albedo", "Model: m")
	// Read back: times in minutes; the NaN gap splits each error series.
	var got []string
	for _, d := range c.drawn {
		got = append(got, fmt.Sprintf("%d %s %v", d.Panel, d.Label, d.XYs))
	}
	want := []string{
		"0 sensors seeing [{0 2} {1 3} {2 0} {3 0} {4 1}]",
		"1 valid [{0 1} {1 1} {2 0} {3 0} {4 0}]",
		"2 without albedo [{0 0.5} {1 0.6}]",
		"2 without albedo [{4 0.7}]",
		"2 with albedo [{0 1.5} {1 2.6}]",
		"2 with albedo [{3 3} {4 4}]",
	}
	if strings.Join(got, "\n") != strings.Join(want, "\n") {
		t.Errorf("drawn series:\n%s\nwant:\n%s", strings.Join(got, "\n"), strings.Join(want, "\n"))
	}
}

// The on-board corrected error is a third series of the error panel, in
// its own colour and a dotted line (the other two are solid and dashed),
// read back as drawn; a length unlike T's is refused.
func TestTimelineDrawsTheCorrectedError(t *testing.T) {
	nan := math.NaN()
	f := Timeline{
		T:               []float64{0, 60, 120, 180},
		ErrNoAlbedoDeg:  []float64{0.5, 0.6, nan, 0.7},
		ErrAlbedoDeg:    []float64{1.5, 2.6, nan, 3},
		ErrCorrectedDeg: []float64{0.55, nan, nan, 0.8},
	}
	c, err := f.Plot(Caption{})
	if err != nil {
		t.Fatal(err)
	}
	wantText(t, mustSVG(t, c), "without albedo", "with albedo", "on-board corrected")
	var got []string
	for _, d := range c.drawn {
		if d.Label == "on-board corrected" {
			got = append(got, fmt.Sprint(d.XYs))
		}
	}
	if want := "[{0 0.55}] [{3 0.8}]"; strings.Join(got, " ") != want {
		t.Errorf("corrected series drawn as %v, want %s", got, want)
	}
	if slices.Equal(errDashes[2], errDashes[1]) || errDashes[2] == nil || seriesColour(2) == seriesColour(1) {
		t.Error("the corrected series is drawn like another one")
	}
	f.ErrCorrectedDeg = f.ErrCorrectedDeg[:3]
	if _, err := f.Plot(Caption{}); err == nil || !strings.Contains(err.Error(), "ErrCorrectedDeg") {
		t.Errorf("short corrected series: %v", err)
	}
}

func TestYearViewFigure(t *testing.T) {
	f := YearView{Day: []float64{1, 2, 3, 4}, BetaDeg: []float64{10, 40, 70, 75}, EclipseMin: []float64{30, 20, 0, 0},
		EclipseFree: []bool{false, false, true, true}}
	c, err := f.Plot(Caption{})
	if err != nil {
		t.Fatal(err)
	}
	svg := mustSVG(t, c)
	wantText(t, svg, "Beta angle", "Eclipse per orbit", "beta (deg)", "eclipse (min/orbit)", "day of year", "eclipse-free")
	if got := fmt.Sprint(c.drawn[1].XYs); got != "[{1 30} {2 20} {3 0} {4 0}]" {
		t.Errorf("eclipse series %s", got)
	}
	if r := runs(f.Day, f.EclipseFree); len(r) != 1 || r[0] != (Interval{2.5, 4}) {
		t.Errorf("eclipse-free season %v, want [{2.5 4}]", r)
	}
}

func TestErrorDistFigure(t *testing.T) {
	// 100 samples 0.01…1.00 deg: empirical p95 is the 95th value, 0.95
	// (gonum stat.Quantile, Empirical).
	var a []float64
	for i := 100; i >= 1; i-- {
		a = append(a, float64(i)/100)
	}
	f := ErrorDist{Series: []ErrSeries{
		{Label: "without albedo", ErrorsDeg: append(a, math.NaN())},
		{Label: "with albedo", BinEdgesDeg: []float64{0, 1, 2, 3}, BinCounts: []float64{50, 40, 10}},
	}, UnitP95Deg: []float64{0.9, 1.0}, Target: &Target{Value: 2, Label: "≤ 2.00°", Got: "2.50°", Pass: false}}
	c, err := f.Plot(Caption{})
	if err != nil {
		t.Fatal(err)
	}
	svg := mustSVG(t, c)
	wantText(t, svg, "sun-vector error (deg, log scale)", "fraction of valid samples", "without albedo", "with albedo",
		"p95 without albedo = 0.95°", "p95 with albedo = 2.5°", "p95 of each Monte Carlo unit",
		"target ≤ 2.00°: FAIL (2.50°)", "0.01", "0.1", "1", "10")
	if _, ok := c.Panels[0].X.Scale.(plot.LogScale); !ok {
		t.Error("CDF error axis is not logarithmic")
	}
	cdf := c.drawn[0].XYs
	if len(cdf) != 100 || cdf[0] != (struct{ X, Y float64 }{0.01, 0.01}) || cdf[99].Y != 1 {
		t.Errorf("CDF read back %v…%v (%d points)", cdf[0], cdf[len(cdf)-1], len(cdf))
	}
	// Binned: 95 % falls half-way into the last bin (2…3, 90 % → 100 %).
	if p := c.drawn[4].XYs[0].X; c.drawn[4].Label != "p95 with albedo" || math.Abs(p-2.5) > 1e-12 {
		t.Errorf("binned p95 %g, want 2.5", p)
	}
}

// The error axis ends at 180° however large the errors (no angle is
// larger): errors of 18–37° drew an axis to 1000°.
func TestErrorDistAxisEndsAt180(t *testing.T) {
	for _, c := range []struct {
		errs       []float64
		xmin, xmax float64
		targetDeg  float64
	}{
		{[]float64{18, 25, 37}, 1, 180, 0},
		{[]float64{0.5, 120, 179.9}, 0.1, 180, 0},
		{[]float64{0.02, 0.3}, 0.01, 1, 0},
		{[]float64{3, 8}, 1, 100, 0},
		{[]float64{20, 30}, 1, 180, 150},
	} {
		f := ErrorDist{Series: []ErrSeries{{Label: "x", ErrorsDeg: c.errs}}}
		if c.targetDeg > 0 {
			f.Target = &Target{Value: c.targetDeg, Label: "≤", Got: "-", Pass: true}
		}
		ch, err := f.Plot(Caption{})
		if err != nil {
			t.Fatal(err)
		}
		for _, p := range ch.Panels[:2] {
			if p.X.Min != c.xmin || p.X.Max != c.xmax {
				t.Errorf("errors %v: axis %g…%g, want %g…%g", c.errs, p.X.Min, p.X.Max, c.xmin, c.xmax)
			}
		}
	}
}

// Gaps given as a histogram (durations with counts) draw the same bins as
// the same gaps listed one by one.
func TestGapsFigureFromCounts(t *testing.T) {
	listed := Gaps{DurationsS: []float64{10, 10, 10, 20, 50, 50}, LongestS: 50, StepS: 10}
	counted := Gaps{DurationsS: []float64{10, 20, 50}, Counts: []int{3, 1, 2}, LongestS: 50, StepS: 10}
	a, err := listed.Plot(Caption{})
	if err != nil {
		t.Fatal(err)
	}
	b, err := counted.Plot(Caption{})
	if err != nil {
		t.Fatal(err)
	}
	if fmt.Sprint(a.drawn) != fmt.Sprint(b.drawn) {
		t.Errorf("bins from counts %v, from the list %v", b.drawn, a.drawn)
	}
	if counted.Number() != 6 {
		t.Errorf("Number %d, want 6", counted.Number())
	}
	wantText(t, mustSVG(t, b), "6 gaps")
	for _, bad := range []Gaps{{DurationsS: []float64{10}, Counts: []int{0}}, {DurationsS: []float64{10}, Counts: []int{1, 2}}} {
		if _, err := bad.Plot(Caption{}); err == nil || !strings.Contains(err.Error(), "count") {
			t.Errorf("%+v: error %v, want one naming the counts", bad, err)
		}
	}
}

func TestGapsFigure(t *testing.T) {
	f := Gaps{DurationsS: []float64{10, 20, 30, 40, 50, 60}, LongestS: 60, StepS: 10,
		Target: &Target{Value: 45, Label: "≤ 45 s", Got: "60 s"}}
	c, err := f.Plot(Caption{})
	if err != nil {
		t.Fatal(err)
	}
	svg := mustSVG(t, c)
	wantText(t, svg, "gap duration (s; bins of 10 s = 1 × the 10 s step)", "number of gaps", "6 gaps", "longest = 60 s",
		"target ≤ 45 s: FAIL (60 s)")
	// Durations are whole steps: with one step per bin every bin holds one
	// gap and no bin is empty by construction.
	for _, d := range c.drawn[1:] {
		w := d.XYs[1].X - d.XYs[0].X
		if math.Abs(w/10-math.Round(w/10)) > 1e-9 || d.XYs[0].Y != 1 {
			t.Errorf("bin %v…%v (width %g s) holds %g gaps, want 1 in a whole-step bin", d.XYs[0].X, d.XYs[1].X, w, d.XYs[0].Y)
		}
	}
	total := 0.0
	for _, d := range c.drawn[1:] {
		total += d.XYs[0].Y
	}
	if total != 6 || c.drawn[0].XYs[0].X != 60 {
		t.Errorf("histogram holds %g gaps (want 6), longest at %g", total, c.drawn[0].XYs[0].X)
	}
}

func TestSweepBudgetSensitivityFigures(t *testing.T) {
	c, err := demoSweep().Plot(Caption{})
	if err != nil {
		t.Fatal(err)
	}
	wantText(t, mustSVG(t, c), "altitude (km)", "valid (% of sunlit time)", "4 sensors", "6 sensors", "requirement 95 %")
	if d := c.drawn[1]; d.Label != "6 sensors" || d.XYs[0].X != 400 || d.XYs[0].Y != demoSweep().Lines[1].Y[0] {
		t.Errorf("sweep read back %v", d)
	}
	c, err = demoBudget().Plot(Caption{})
	if err != nil {
		t.Fatal(err)
	}
	wantText(t, mustSVG(t, c), "p95 error (deg)", "albedo", "sun ephemeris")
	// Bars reversed so the first term is on top.
	if d := c.drawn[len(c.drawn)-1]; d.Label != "albedo" || d.XYs[0].X != 3.1 {
		t.Errorf("top bar %v, want albedo 3.1", d)
	}
	c, err = demoSensitivity().Plot(Caption{})
	if err != nil {
		t.Fatal(err)
	}
	wantText(t, mustSVG(t, c), "albedo coefficient", "p95 sun-vector error (deg)", "nominal 0.3", "coarse cosine")
}

func TestBadInputNamesTheField(t *testing.T) {
	cases := []struct {
		name string
		run  func() (*Chart, error)
		want string
	}{
		{"sky rows", func() (*Chart, error) {
			return SkyMap{AzDeg: []float64{0}, ElDeg: []float64{0, 10}, Counts: [][]int{{1}}}.Plot(Caption{})
		}, "Counts has 1 rows"},
		{"sky el", func() (*Chart, error) {
			return SkyMap{AzDeg: []float64{0}, ElDeg: []float64{95}, Counts: [][]int{{1}}}.Plot(Caption{})
		}, "ElDeg[0]"},
		{"timeline len", func() (*Chart, error) {
			return Timeline{T: []float64{0, 1}, Valid: []bool{true}}.Plot(Caption{})
		}, "Valid has 1 samples"},
		{"timeline order", func() (*Chart, error) { return Timeline{T: []float64{0, 0}}.Plot(Caption{}) }, "T[1]"},
		{"year len", func() (*Chart, error) {
			return YearView{Day: []float64{1, 2}, BetaDeg: []float64{1}}.Plot(Caption{})
		}, "BetaDeg has 1"},
		{"errdist bins", func() (*Chart, error) {
			return ErrorDist{Series: []ErrSeries{{Label: "x", BinEdgesDeg: []float64{0, 1}, BinCounts: []float64{1, 2}}}}.Plot(Caption{})
		}, `Series[0] ("x")`},
		{"gaps", func() (*Chart, error) { return Gaps{DurationsS: []float64{-1}}.Plot(Caption{}) }, "DurationsS[0]"},
		{"sweep", func() (*Chart, error) {
			return Sweep{X: []float64{1, 2}, Lines: []Line{{Label: "a", Y: []float64{1}}}}.Plot(Caption{})
		}, `Lines[0] ("a") has 1 values`},
		{"budget", func() (*Chart, error) {
			return BudgetBars{Labels: []string{"a"}, P95Deg: []float64{math.NaN()}}.Plot(Caption{})
		}, "P95Deg[0]"},
	}
	for _, c := range cases {
		_, err := c.run()
		if err == nil || !strings.Contains(err.Error(), c.want) || !strings.HasPrefix(err.Error(), "plots: ") {
			t.Errorf("%s: error %v, want one containing %q", c.name, err, c.want)
		}
	}
}

func TestSaveLeavesNoPartialFile(t *testing.T) {
	dir := t.TempDir()
	c, err := demoGaps().Plot(Caption{})
	if err != nil {
		t.Fatal(err)
	}
	if err := Save(c, filepath.Join(dir, "g.bmp"), ""); err == nil || !strings.Contains(err.Error(), "png, svg, pdf") {
		t.Errorf("unsupported format: %v", err)
	}
	if err := Save(c, filepath.Join(dir, "missing", "g.png"), "png"); err == nil {
		t.Error("save into a missing folder succeeded")
	}
	if err := Save(c, filepath.Join(dir, "g.svg"), ""); err != nil {
		t.Fatal(err)
	}
	ents, _ := os.ReadDir(dir)
	if len(ents) != 1 || ents[0].Name() != "g.svg" {
		t.Errorf("folder holds %v, want only g.svg", ents)
	}
}

// Golden SVG files (the gonum/plot cmpimg pattern): every figure kind,
// drawn from fixed demo data, byte for byte. Run
// `go test ./plots -run Golden -regen` after an intended change and look at
// the new files (and their PNGs with -demo DIR) before committing.
func TestGoldenFigures(t *testing.T) {
	for _, d := range demoFigures() {
		c, err := d.chart()
		if err != nil {
			t.Fatalf("%s: %v", d.name, err)
		}
		got, err := c.SVG()
		if err != nil {
			t.Fatal(err)
		}
		path := filepath.Join("testdata", "golden", d.name+".svg")
		if *regen {
			if err := os.MkdirAll(filepath.Dir(path), 0o755); err != nil {
				t.Fatal(err)
			}
			if err := os.WriteFile(path, got, 0o644); err != nil {
				t.Fatal(err)
			}
		}
		want, err := os.ReadFile(path)
		if err != nil {
			t.Fatalf("%v (run with -regen to create it)", err)
		}
		if !bytes.Equal(got, want) {
			t.Errorf("%s: SVG differs from %s (%d vs %d bytes); rerun with -regen if intended", d.name, path, len(got), len(want))
		}
	}
}

func TestTickLabelsHaveNoRoundOff(t *testing.T) {
	for _, tk := range (niceTicks{}).Ticks(0, 0.2) {
		if tk.Label != "" && len(tk.Label) > 5 {
			t.Errorf("tick %v labelled %q", tk.Value, tk.Label)
		}
	}
	if got := tickLabel(35 * 0.005); got != "0.175" {
		t.Errorf("tickLabel(35×0.005) = %q, want 0.175", got)
	}
}

// A power figure refuses what it cannot draw truthfully: negative or
// undefined power, samples and times that do not match.
func TestPowerViewRefuses(t *testing.T) {
	for name, f := range map[string]PowerView{
		"one sample":      {T: []float64{0}, W: []float64{1}},
		"lengths":         {T: []float64{0, 1}, W: []float64{1}},
		"negative power":  {T: []float64{0, 1}, W: []float64{1, -1}},
		"undefined power": {T: []float64{0, 1}, W: []float64{math.NaN(), 1}},
		"orbit mean":      {T: []float64{0, 1}, W: []float64{1, 1}, OrbitW: []float64{math.Inf(1)}},
	} {
		if _, err := f.Plot(Caption{}); err == nil || !strings.Contains(err.Error(), "plots: power") {
			t.Errorf("%s: error %v", name, err)
		}
	}
}

// Boresights less than a degree apart share one mark and one label, their
// names joined in order; the same azimuth through a pole (any azimuth at
// −90° elevation is one direction) counts as one direction (closed form:
// the angle between unit vectors).
func TestMergeMarkers(t *testing.T) {
	got := mergeMarkers([]Marker{{"a", 0, -90}, {"b", 10, 0}, {"c", 135, -90}, {"d", 10.5, 0.2}, {"e", 12, 0}}, sameMarkDeg)
	want := []Marker{{"a, c", 0, -90}, {"b, d", 10, 0}, {"e", 12, 0}}
	if fmt.Sprint(got) != fmt.Sprint(want) {
		t.Errorf("merged %v, want %v", got, want)
	}
}

// A label placed to the right of a boresight next to a sun fixed in body
// axes would run under the sun's marker: underSun says so, and not for a
// label clear of it (closed form on the label rectangle).
func TestLabelUnderFixedSun(t *testing.T) {
	r := vg.Rectangle{Min: vg.Point{X: 0, Y: -4}, Max: vg.Point{X: 30, Y: 8}}
	if !underSun(r, vg.Point{X: 100, Y: 50}, vg.Point{X: 115, Y: 52}) {
		t.Error("a sun 15 pt into a 30 pt label is not under it")
	}
	if underSun(r, vg.Point{X: 100, Y: 50}, vg.Point{X: 145, Y: 52}) {
		t.Error("a sun 15 pt past the label's end counts as under it")
	}
}

// A thinned timeline says so in its error panel (the window maxima and
// peaks drawn are of the drawn steps only), and eclipses too many to draw
// at the figure's scale are not shaded, which the figure says, instead of
// painting every panel grey (a 20-day run has about 300).
func TestTimelineThinnedAndDenseEclipses(t *testing.T) {
	f := Timeline{
		T:              []float64{0, 60, 120, 180, 240},
		Valid:          []bool{true, true, false, false, false},
		Umbra:          []Interval{{130, 170}},
		ErrNoAlbedoDeg: []float64{0.5, 0.6, math.NaN(), math.NaN(), 0.7},
		StepsPerSample: 3,
	}
	if !f.ShadesEclipses() {
		t.Error("one eclipse not shaded")
	}
	c, err := f.Plot(Caption{})
	if err != nil {
		t.Fatal(err)
	}
	wantText(t, mustSVG(t, c), "Sun-vector error, one step in 3 drawn", "umbra")
	f.StepsPerSample = 0
	f.Umbra = nil
	for i := range maxShadedSpans + 1 {
		a := 240 * float64(i) / (maxShadedSpans + 1)
		f.Umbra = append(f.Umbra, Interval{a, a + 1})
	}
	if f.ShadesEclipses() {
		t.Errorf("%d eclipses shaded", len(f.Umbra))
	}
	c, err = f.Plot(Caption{})
	if err != nil {
		t.Fatal(err)
	}
	svg := mustSVG(t, c)
	wantText(t, svg, "eclipses not shaded (too many)")
	if strings.Contains(svg, "one step in") {
		t.Error("an unthinned timeline says it is thinned")
	}
}

// A series given the run's own p95 marks and labels that figure, not the
// p95 of the samples it draws (the review draws 400 quantiles of the run's
// errors; their p95 is not the run's to the digits the report prints).
func TestErrorDistUsesTheRunsP95(t *testing.T) {
	var a []float64
	for i := 1; i <= 100; i++ {
		a = append(a, float64(i)/100)
	}
	p95 := 0.9712
	c, err := ErrorDist{Series: []ErrSeries{{Label: "with albedo", ErrorsDeg: a, P95Deg: &p95}}}.Plot(Caption{})
	if err != nil {
		t.Fatal(err)
	}
	wantText(t, mustSVG(t, c), "p95 with albedo = 0.97°")
	if d := c.drawn[1]; d.Label != "p95 with albedo" || d.XYs[0].X != p95 {
		t.Errorf("p95 marked at %v (%s), want %g", d.XYs, d.Label, p95)
	}
}

// A sensitivity figure with a target draws it and names it in the legend
// (a caption that cites a target the figure does not draw misleads).
func TestSensitivityDrawsTarget(t *testing.T) {
	s := demoSensitivity()
	tgt := 2.5
	s.Target, s.TargetLabel = &tgt, "target p95 ≤ 2.5°"
	c, err := s.Plot(Caption{})
	if err != nil {
		t.Fatal(err)
	}
	wantText(t, mustSVG(t, c), "target p95 ≤ 2.5°", "nominal 0.3")
	s.Target = nil
	c, err = s.Plot(Caption{})
	if err != nil {
		t.Fatal(err)
	}
	if strings.Contains(mustSVG(t, c), "target p95") {
		t.Error("no target given, but one is drawn")
	}
}
