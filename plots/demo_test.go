package plots

import (
	"flag"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"testing"
)

// The tables below are invented demo data (no real mission): shapes only
// resemble what the simulation produces.

var demoDir = flag.String("demo", "", "write every demo figure as PNG and SVG into this folder")

func demoCaption() Caption {
	return Caption{
		Scenario:    "demo: 550 km sun-synchronous orbit, LTAN 10:30, nadir pointing, 6 coarse sensors (invented data)",
		Model:       "two-body + J2, low-precision sun, conical shadow, uniform albedo 0.3",
		Assumptions: "ideal cosine response, 60° half-angle fields of view, no sensor noise; an analysis aid, not flight verification",
	}
}

func demoSkyMap() SkyMap {
	var f SkyMap
	for a := -175.0; a < 180; a += 10 {
		f.AzDeg = append(f.AzDeg, a)
	}
	for e := -85.0; e < 90; e += 10 {
		f.ElDeg = append(f.ElDeg, e)
	}
	bs := []Marker{{"+X", 0, 0}, {"−X", 180, 0}, {"+Y", 90, 0}, {"−Y", -90, 0}, {"+Z", 0, 90}, {"tilted", 45, -40}}
	for _, e := range f.ElDeg {
		row := make([]int, len(f.AzDeg))
		for j, a := range f.AzDeg {
			for _, b := range bs {
				if angleDeg(a, e, b.AzDeg, b.ElDeg) < 70 {
					row[j]++
				}
			}
		}
		f.Counts = append(f.Counts, row)
	}
	f.Boresights = bs
	for k := 0; k < 200; k++ {
		t := float64(k) / 200 * 2 * math.Pi
		f.SunTrack = append(f.SunTrack, Point{wrapAz(t*180/math.Pi - 150), 25 * math.Sin(t)})
	}
	return f
}

func angleDeg(a1, e1, a2, e2 float64) float64 {
	r := math.Pi / 180
	c := math.Sin(e1*r)*math.Sin(e2*r) + math.Cos(e1*r)*math.Cos(e2*r)*math.Cos((a1-a2)*r)
	return math.Acos(math.Max(-1, math.Min(1, c))) / r
}

func demoTimeline() Timeline {
	const period = 5700.0
	var f Timeline
	rng := rand.New(rand.NewPCG(1, 2))
	for t := 0.0; t <= 3*period; t += 30 {
		f.T = append(f.T, t)
		ph := math.Mod(t, period) / period
		lit := ph < 0.62
		n := 0
		if lit {
			n = 1 + int(2.5*(1+math.Sin(7*ph*2*math.Pi))/2)
		}
		f.SensorsSeeing = append(f.SensorsSeeing, n)
		f.Valid = append(f.Valid, n >= 2)
		e0, e1 := math.NaN(), math.NaN()
		if n >= 2 {
			e0 = 0.3 + 0.1*rng.Float64()
			e1 = e0 + 3*math.Abs(math.Sin(ph*math.Pi*3))
		}
		f.ErrNoAlbedoDeg = append(f.ErrNoAlbedoDeg, e0)
		f.ErrAlbedoDeg = append(f.ErrAlbedoDeg, e1)
	}
	for k := 0.0; k < 3; k++ {
		s := k*period + 0.62*period
		f.Penumbra = append(f.Penumbra, Interval{s, s + 10}, Interval{s + 0.35*period, s + 0.35*period + 10})
		f.Umbra = append(f.Umbra, Interval{s + 10, s + 0.35*period})
	}
	return f
}

func demoYear() YearView {
	var f YearView
	for d := 1.0; d <= 365; d++ {
		b := 22 + 50*math.Sin(2*math.Pi*(d-80)/365)
		f.Day = append(f.Day, d)
		f.BetaDeg = append(f.BetaDeg, b)
		e := 0.0
		if math.Abs(b) < 66 {
			e = 35 * math.Sqrt(1-math.Pow(b/66, 2))
		}
		f.EclipseMin = append(f.EclipseMin, e)
		f.EclipseFree = append(f.EclipseFree, e == 0)
	}
	return f
}

func demoErrorDist() ErrorDist {
	rng := rand.New(rand.NewPCG(3, 4))
	var a, b []float64
	for range 2000 {
		v := math.Abs(rng.NormFloat64()) * 0.4
		a = append(a, v)
		b = append(b, v+math.Abs(rng.NormFloat64())*1.5)
	}
	var units []float64
	for range 20 {
		units = append(units, 2.6+0.6*rng.Float64())
	}
	return ErrorDist{Series: []ErrSeries{{Label: "without albedo", ErrorsDeg: a}, {Label: "with albedo", ErrorsDeg: b}}, UnitP95Deg: units}
}

func demoGaps() Gaps {
	rng := rand.New(rand.NewPCG(5, 6))
	var g Gaps
	for range 60 {
		d := 30 + rng.ExpFloat64()*240
		g.DurationsS = append(g.DurationsS, d)
		g.LongestS = math.Max(g.LongestS, d)
	}
	return g
}

func demoSweep() Sweep {
	target := 95.0
	s := Sweep{Title: "Sunlit time with a valid sun vector versus altitude", XLabel: "altitude (km)", YLabel: "valid (% of sunlit time)",
		Target: &target, TargetLabel: "requirement 95 %"}
	for h := 400.0; h <= 800; h += 50 {
		s.X = append(s.X, h)
	}
	for k, name := range []string{"4 sensors", "6 sensors", "6 sensors, tilted 20°"} {
		l := Line{Label: name}
		for _, h := range s.X {
			l.Y = append(l.Y, 80+5*float64(k)+0.01*(h-400)+2*float64(k))
		}
		s.Lines = append(s.Lines, l)
	}
	return s
}

func demoBudget() BudgetBars {
	return BudgetBars{Labels: []string{"albedo", "sensor misalignment", "ADC quantisation", "temperature drift", "sun ephemeris"}, P95Deg: []float64{3.1, 0.8, 0.25, 0.4, 0.01}}
}

func demoSensitivity() Sensitivity {
	nom := 0.3
	s := Sensitivity{Parameter: "albedo coefficient", YLabel: "p95 sun-vector error (deg)", Nominal: &nom}
	for a := 0.0; a <= 0.6; a += 0.05 {
		s.X = append(s.X, a)
	}
	for k, name := range []string{"coarse cosine", "four-quadrant"} {
		l := Line{Label: name}
		for _, a := range s.X {
			l.Y = append(l.Y, 0.3+a*(8-5*float64(k)))
		}
		s.Lines = append(s.Lines, l)
	}
	return s
}

// demoPower is an invented power trace: three 95-minute orbits with a
// 35-minute eclipse, and 30 orbit means drifting with the season.
func demoPower() PowerView {
	const period, eclipse = 5700.0, 2100.0
	var f PowerView
	for t := 0.0; t <= 3*period; t += 30 {
		u := math.Mod(t, period)
		w := 0.0
		if u < period-eclipse {
			w = 20 + 25*math.Sin(math.Pi*u/(period-eclipse))
		}
		f.T, f.W = append(f.T, t), append(f.W, w)
	}
	for k := range 3 {
		s := float64(k)*period + period - eclipse
		f.Umbra = append(f.Umbra, Interval{s + 8, s + eclipse - 8})
		f.Penumbra = append(f.Penumbra, Interval{s, s + 8}, Interval{s + eclipse - 8, s + eclipse})
	}
	for k := range 30 {
		f.OrbitW = append(f.OrbitW, 22+0.05*float64(k))
	}
	f.MeanW = 22.7
	f.Target = &Target{Value: 20, Label: "≥ 20.0 W", Got: "22.7 W", Pass: true}
	return f
}

type demoFigure struct {
	name  string
	chart func() (*Chart, error)
}

func demoFigures() []demoFigure {
	c := demoCaption()
	return []demoFigure{
		{"skymap", func() (*Chart, error) { return demoSkyMap().Plot(c) }},
		{"timeline", func() (*Chart, error) { return demoTimeline().Plot(c) }},
		{"year", func() (*Chart, error) { return demoYear().Plot(c) }},
		{"errordist", func() (*Chart, error) { return demoErrorDist().Plot(c) }},
		{"gaps", func() (*Chart, error) { return demoGaps().Plot(c) }},
		{"sweep", func() (*Chart, error) { return demoSweep().Plot(c) }},
		{"budget", func() (*Chart, error) { return demoBudget().Plot(c) }},
		{"sensitivity", func() (*Chart, error) { return demoSensitivity().Plot(c) }},
		{"power", func() (*Chart, error) { return demoPower().Plot(c) }},
	}
}

// TestDemoFigures renders every demo figure in PNG, SVG and PDF; with
// -demo DIR it also keeps the files for a reviewer to look at.
func TestDemoFigures(t *testing.T) {
	for _, d := range demoFigures() {
		ch, err := d.chart()
		if err != nil {
			t.Fatalf("%s: %v", d.name, err)
		}
		for _, format := range Formats {
			b, err := ch.Encode(format)
			if err != nil || len(b) < 1000 {
				t.Fatalf("%s.%s: %d bytes, %v", d.name, format, len(b), err)
			}
			if *demoDir != "" {
				if err := os.MkdirAll(*demoDir, 0o755); err != nil {
					t.Fatal(err)
				}
				if err := Save(ch, filepath.Join(*demoDir, d.name+"."+format), format); err != nil {
					t.Fatal(err)
				}
			}
		}
	}
}
