package plots

import (
	"fmt"
	"image/color"
	"math"
	"strconv"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// finiteMask marks the finite values of y.
func finiteMask(y []float64) []bool {
	m := make([]bool, len(y))
	for i, v := range y {
		m[i] = finite(v)
	}
	return m
}

// inSpans reports whether x lies in one of the spans.
func inSpans(x float64, spans []Interval) bool {
	for _, s := range spans {
		if x >= s.Start && x <= s.End {
			return true
		}
	}
	return false
}

// Timeline is a few orbits of samples. All slices are indexed like T;
// a nil slice leaves its panel out.
type Timeline struct {
	T             []float64 // seconds since the run epoch, increasing
	SensorsSeeing []int     // sensors with the sun in their field of view
	Valid         []bool    // a sun vector could be formed
	// Umbra and Penumbra are eclipse spans in seconds since the epoch.
	Umbra, Penumbra []Interval
	// Sun-vector error without and with albedo, deg; NaN where undefined
	// (eclipse or no valid vector).
	ErrNoAlbedoDeg, ErrAlbedoDeg []float64
	// ErrCorrectedDeg is the error after the on-board albedo correction,
	// deg (NaN where undefined); nil without an on-board model.
	ErrCorrectedDeg []float64
	// ErrorTarget (deg) and ValidTarget (fraction of sunlit time) are drawn
	// with their verdicts when set; ValidShare is the run's valid share
	// shown in the panel title.
	ErrorTarget, ValidTarget *Target
	ValidShare               float64
	// Phases, when set, are the spans of a mission timeline: a band of
	// named bars above the other panels, their boundaries marked in each.
	Phases []PhaseSpan
	// StepsPerSample is how many of the run's steps each sample stands
	// for (one step in StepsPerSample drawn); above 1 the error panel says
	// so, since its peaks are of the drawn steps only.
	StepsPerSample int
}

// maxShadedSpans is the number of umbra and penumbra spans (about three
// per eclipse) beyond which their shading would merge into one grey band
// over the figure's width (about 700 points); the timeline then leaves
// them unshaded and says so (common practice, no source).
const maxShadedSpans = 120

// ShadesEclipses reports whether the figure shades the eclipse spans: not
// when there are more than maxShadedSpans of them.
func (f Timeline) ShadesEclipses() bool {
	return len(f.Umbra)+len(f.Penumbra) <= maxShadedSpans
}

// errDashes and errDashesThin are the dash patterns of the error series
// (without albedo, with albedo, on-board corrected; solid, dashed, dotted):
// a reader without colour still tells them apart. The thin ones draw the
// window maxima of a fast timeline.
var (
	errDashes     = [3][]vg.Length{nil, {6, 3}, {1.5, 2.5}}
	errDashesThin = [3][]vg.Length{nil, {3, 2}, {1, 2}}
)

// fastChanges is the number of changes of the sensor count over the shown
// span beyond which the raw steps would merge into a solid band; the
// timeline then shows a rolling envelope and share instead.
const fastChanges = 150

// rollingWindows is the number of windows of the rolling envelope.
const rollingWindows = 240

// rolling returns window centres and the min, mean and max of y over
// windows of equal length, over the samples where use is true (all when
// use is nil); windows without samples give NaN.
func rolling(t, y []float64, use []bool, n int) (tc, lo, mean, hi []float64) {
	t0, t1 := t[0], t[len(t)-1]
	w := (t1 - t0) / float64(n)
	k := 0
	for i := range n {
		a, b := t0+float64(i)*w, t0+float64(i+1)*w
		mn, mx, sum, cnt := math.Inf(1), math.Inf(-1), 0.0, 0
		for ; k < len(t) && (t[k] < b || (i == n-1 && t[k] <= b)); k++ {
			if use != nil && !use[k] {
				continue
			}
			mn, mx, sum = min(mn, y[k]), max(mx, y[k]), sum+y[k]
			cnt++
		}
		tc = append(tc, (a+b)/2)
		if cnt == 0 {
			lo, mean, hi = append(lo, math.NaN()), append(mean, math.NaN()), append(hi, math.NaN())
			continue
		}
		lo, mean, hi = append(lo, mn), append(mean, sum/float64(cnt)), append(hi, mx)
	}
	return tc, lo, mean, hi
}

// envelope fills the area between lo and hi.
type envelope struct {
	X, Lo, Hi []float64
	Fill      color.Color
}

func (e envelope) Plot(c draw.Canvas, p *plot.Plot) {
	tx, ty := p.Transforms(&c)
	var run []vg.Point
	var back []vg.Point
	flush := func() {
		if len(run) > 1 {
			for i := len(back) - 1; i >= 0; i-- {
				run = append(run, back[i])
			}
			c.FillPolygon(e.Fill, c.ClipPolygonXY(run))
		}
		run, back = nil, nil
	}
	for i := range e.X {
		if !finite(e.Lo[i]) || !finite(e.Hi[i]) {
			flush()
			continue
		}
		run = append(run, vg.Point{X: tx(e.X[i]), Y: ty(e.Hi[i])})
		back = append(back, vg.Point{X: tx(e.X[i]), Y: ty(e.Lo[i])})
	}
	flush()
}

func (e envelope) Thumbnail(c *draw.Canvas) {
	pts := []vg.Point{{X: c.Min.X, Y: c.Min.Y}, {X: c.Max.X, Y: c.Min.Y}, {X: c.Max.X, Y: c.Max.Y}, {X: c.Min.X, Y: c.Max.Y}}
	c.FillPolygon(e.Fill, pts)
}

func (f Timeline) validate() error {
	n := len(f.T)
	if n < 2 {
		return fmt.Errorf("plots: timeline: T needs at least 2 samples, got %d", n)
	}
	for i := 1; i < n; i++ {
		if !(f.T[i] > f.T[i-1]) {
			return fmt.Errorf("plots: timeline: T[%d] = %g does not increase", i, f.T[i])
		}
	}
	check := func(name string, l int) error {
		if l != 0 && l != n {
			return fmt.Errorf("plots: timeline: %s has %d samples, want %d (one per T) or none", name, l, n)
		}
		return nil
	}
	for _, c := range []struct {
		name string
		l    int
	}{{"SensorsSeeing", len(f.SensorsSeeing)}, {"Valid", len(f.Valid)}, {"ErrNoAlbedoDeg", len(f.ErrNoAlbedoDeg)}, {"ErrAlbedoDeg", len(f.ErrAlbedoDeg)}, {"ErrCorrectedDeg", len(f.ErrCorrectedDeg)}} {
		if err := check(c.name, c.l); err != nil {
			return err
		}
	}
	return nil
}

// timeScale picks minutes for spans up to 12 h, hours beyond.
// scaledTimes divides the sample times (s) by the unit timeScale picks for
// their span.
func scaledTimes(T []float64) (t []float64, div float64, unit string) {
	div, unit = timeScale(T[len(T)-1] - T[0])
	t = make([]float64, len(T))
	for i, v := range T {
		t[i] = v / div
	}
	return t, div, unit
}

// scaleIntervals divides each interval's ends by div.
func scaleIntervals(s []Interval, div float64) []Interval {
	out := make([]Interval, len(s))
	for i, v := range s {
		out[i] = Interval{v.Start / div, v.End / div}
	}
	return out
}

func timeScale(span float64) (div float64, unit string) {
	if span <= 12*3600 {
		return 60, "min"
	}
	return 3600, "h"
}

// Plot draws the stacked timeline: sensors seeing the sun, vector
// validity, and the sun-vector error with and without albedo, with eclipse
// spans shaded in every panel.
func (f Timeline) Plot(caption Caption) (*Chart, error) {
	if err := f.validate(); err != nil {
		return nil, err
	}
	t, div, unit := scaledTimes(f.T)
	umbra, penumbra := scaleIntervals(f.Umbra, div), scaleIntervals(f.Penumbra, div)
	shadeU, shadeP := umbra, penumbra
	if !f.ShadesEclipses() {
		shadeU, shadeP = nil, nil
	}
	xlabel := fmt.Sprintf("time since epoch (%s)", unit)

	var panels []*plot.Plot
	var rec []drawnSeries
	var cuts []float64
	if len(f.Phases) > 0 {
		pp, c, err := phasePanel(f.Phases, div, t[0], t[len(t)-1])
		if err != nil {
			return nil, err
		}
		panels, cuts = append(panels, pp), c
	}
	first := len(panels) // the first data panel
	cutStyle := draw.LineStyle{Color: colBlack, Width: 0.8, Dashes: []vg.Length{2, 2}}
	addPanel := func(title, ylabel string) *plot.Plot {
		p := newPlot(title, "", ylabel)
		p.Add(bands{shadeP, colPenumbra}, bands{shadeU, colUmbra})
		for _, x := range cuts {
			p.Add(vline{x, cutStyle})
		}
		p.X.Min, p.X.Max = t[0], t[len(t)-1]
		p.X.Tick.Marker = niceTicks{}
		panels = append(panels, p)
		return p
	}
	// A fast attitude changes the sensor count faster than the page can
	// show: draw the rolling envelope and share instead of raw steps.
	changes := 0
	for i := 1; i < len(f.SensorsSeeing); i++ {
		if f.SensorsSeeing[i] != f.SensorsSeeing[i-1] {
			changes++
		}
	}
	fast := changes > fastChanges
	window := (t[len(t)-1] - t[0]) / rollingWindows
	if f.SensorsSeeing != nil {
		y := make([]float64, len(f.SensorsSeeing))
		top := 1
		for i, v := range f.SensorsSeeing {
			y[i] = float64(v)
			top = max(top, v)
		}
		title := "Sensors seeing the sun"
		if fast {
			title += fmt.Sprintf(" (fast attitude: per %.3g %s window)", window, unit)
		}
		p := addPanel(title, "sensors")
		if fast {
			tc, lo, mean, hi := rolling(t, y, nil, rollingWindows)
			env := envelope{X: tc, Lo: lo, Hi: hi, Fill: withAlpha(colSky, 120)}
			p.Add(env)
			for k, seg := range segments(tc, mean) {
				l, err := plotter.NewLine(seg)
				if err != nil {
					return nil, fmt.Errorf("plots: timeline: %w", err)
				}
				l.Color, l.Width = colBlue, 1.8
				p.Add(l)
				rec = append(rec, drawnSeries{len(panels) - 1, "sensors seeing (mean)", l.XYs})
				if k == 0 {
					p.Legend.Add("mean per window", l)
				}
			}
			p.Legend.Add("min…max per window", env)
		} else {
			l, err := plotter.NewLine(xy(t, y))
			if err != nil {
				return nil, fmt.Errorf("plots: timeline: %w", err)
			}
			l.StepStyle = plotter.PostStep
			l.Color, l.Width = colBlue, 1.5
			p.Add(l)
			rec = append(rec, drawnSeries{len(panels) - 1, "sensors seeing", l.XYs})
			p.Legend.Add("sensors seeing", l)
		}
		p.Y.Min, p.Y.Max = 0, float64(top)+0.3
		p.Y.Tick.Marker = integerTicks{}
	}
	if f.Valid != nil {
		title := "Sun vector valid"
		if finite(f.ValidShare) && f.ValidShare > 0 {
			title += fmt.Sprintf(": %.1f %% of sunlit time", 100*f.ValidShare)
		}
		if fast || f.ValidTarget != nil {
			title += fmt.Sprintf(" (share per %.3g %s window)", window, unit)
		}
		p := addPanel(title, "valid")
		y := make([]float64, len(f.Valid))
		for i, v := range f.Valid {
			if v {
				y[i] = 1
			}
		}
		if fast || f.ValidTarget != nil {
			// Rolling share of sunlit samples with a valid vector, in %.
			sunlit := make([]bool, len(t))
			for i := range t {
				sunlit[i] = !inSpans(t[i], umbra) && !inSpans(t[i], penumbra)
				y[i] *= 100
			}
			tc, _, mean, _ := rolling(t, y, sunlit, rollingWindows)
			for k, seg := range segments(tc, mean) {
				l, err := plotter.NewLine(seg)
				if err != nil {
					return nil, fmt.Errorf("plots: timeline: %w", err)
				}
				l.Color, l.Width = colGreen, 1.8
				p.Add(l)
				rec = append(rec, drawnSeries{len(panels) - 1, "valid share", l.XYs})
				if k == 0 {
					p.Legend.Add("valid share", l)
				}
			}
			p.Y.Label.Text = "valid (% of sunlit)"
			p.Y.Min, p.Y.Max = 0, 102
			if tg := f.ValidTarget; tg != nil {
				addTargetLine(p, 100*tg.Value, tg.text())
			}
		} else {
			l, err := plotter.NewLine(xy(t, y))
			if err != nil {
				return nil, fmt.Errorf("plots: timeline: %w", err)
			}
			l.StepStyle = plotter.PostStep
			l.Color, l.Width = colGreen, 1.5
			p.Add(l)
			rec = append(rec, drawnSeries{len(panels) - 1, "valid", l.XYs})
			p.Legend.Add("valid", l)
			p.Y.Min, p.Y.Max = -0.1, 1.1
			p.Y.Tick.Marker = plot.ConstantTicks([]plot.Tick{{Value: 0, Label: "no"}, {Value: 1, Label: "yes"}})
		}
	}
	if f.ErrNoAlbedoDeg != nil || f.ErrAlbedoDeg != nil || f.ErrCorrectedDeg != nil {
		p := addPanel("Sun-vector error", "error (deg)")
		p.Y.Min = 0
		if tg := f.ErrorTarget; tg != nil {
			addTargetLine(p, tg.Value, tg.text())
			p.Title.Text += " (target is on the p95 over the run)"
		}
		if n := f.StepsPerSample; n > 1 {
			p.Title.Text += fmt.Sprintf(", one step in %d drawn", n)
		}
		for k, s := range []struct {
			label string
			y     []float64
		}{{"without albedo", f.ErrNoAlbedoDeg}, {"with albedo", f.ErrAlbedoDeg}, {"on-board corrected", f.ErrCorrectedDeg}} {
			if s.y == nil {
				continue
			}
			var first *plotter.Line
			y, x := s.y, t
			var hi []float64
			if fast {
				// Mean per window (thick) and the largest error per window
				// (thin), instead of a solid band of raw samples.
				var lo []float64
				x, lo, y, hi = rolling(t, s.y, finiteMask(s.y), rollingWindows)
				_ = lo
			}
			for _, seg := range segments(x, y) {
				l, err := plotter.NewLine(seg)
				if err != nil {
					return nil, fmt.Errorf("plots: timeline: %w", err)
				}
				l.Color, l.Width = seriesColour(k), 1.5
				if fast {
					l.Width = 2.2
				}
				l.Dashes = errDashes[k]
				p.Add(l)
				rec = append(rec, drawnSeries{len(panels) - 1, s.label, l.XYs})
				if first == nil {
					first = l
				}
			}
			label := s.label
			if fast {
				label += ", mean"
			}
			if first != nil {
				p.Legend.Add(label, first)
			}
			if fast {
				var firstHi *plotter.Line
				for _, seg := range segments(x, hi) {
					l, err := plotter.NewLine(seg)
					if err != nil {
						return nil, fmt.Errorf("plots: timeline: %w", err)
					}
					l.Color, l.Width = seriesColour(k), 0.8
					l.Dashes = errDashesThin[k]
					p.Add(l)
					if firstHi == nil {
						firstHi = l
					}
				}
				if firstHi != nil {
					p.Legend.Add(s.label+", max", firstHi)
				}
			}
		}
	}
	if len(panels) == first {
		return nil, fmt.Errorf("plots: timeline: nothing to draw; fill SensorsSeeing, Valid or an error series")
	}
	top := panels[first]
	switch {
	case !f.ShadesEclipses():
		top.Legend.Add("eclipses not shaded (too many)")
	default:
		if len(f.Umbra) > 0 {
			top.Legend.Add("umbra", swatch{colUmbra})
		}
		if len(f.Penumbra) > 0 {
			top.Legend.Add("penumbra", swatch{colPenumbra})
		}
	}
	panels[len(panels)-1].X.Label.Text = xlabel
	for _, p := range panels {
		p.Legend.Top, p.Legend.Left = true, false
		p.Legend.TextStyle.Font.Size = 11
	}
	h := DefaultHeight
	if len(panels) > 2 {
		h = 7.5 * vg.Inch
	}
	if len(panels) > 3 {
		h = 9 * vg.Inch
	}
	return &Chart{Panels: panels, Caption: caption, Height: h, drawn: rec}, nil
}

// tickLabel prints a tick value without binary round-off (35 × 0.005 is
// 0.17500000000000002 in float64; it prints 0.175).
func tickLabel(v float64) string {
	r, err := strconv.ParseFloat(strconv.FormatFloat(v, 'g', 12, 64), 64)
	if err != nil {
		r = v
	}
	return strconv.FormatFloat(r, 'f', -1, 64)
}

// niceTicks puts about eight labelled ticks on 1, 2, 2.5 or 5 × 10ⁿ steps,
// labelled without needless decimals, with four minor ticks between.
type niceTicks struct{}

func (niceTicks) Ticks(lo, hi float64) []plot.Tick {
	if !(hi > lo) {
		return []plot.Tick{{Value: lo, Label: strconv.FormatFloat(lo, 'g', 6, 64)}}
	}
	raw := (hi - lo) / 6
	mag := math.Pow(10, math.Floor(math.Log10(raw)))
	step := mag
	for _, m := range []float64{1, 2, 2.5, 5, 10} {
		if m*mag >= raw {
			step = m * mag
			break
		}
	}
	var ts []plot.Tick
	minor := step / 5
	for v := math.Ceil(lo/minor) * minor; v <= hi+minor*1e-9; v += minor {
		k := math.Round(v / minor)
		val := k * minor
		if int64(k)%5 == 0 {
			ts = append(ts, plot.Tick{Value: val, Label: tickLabel(val)})
		} else {
			ts = append(ts, plot.Tick{Value: val})
		}
	}
	return ts
}

// integerTicks labels whole numbers only.
type integerTicks struct{}

func (integerTicks) Ticks(lo, hi float64) []plot.Tick {
	step := max(1, math.Ceil((hi-lo)/6))
	var ts []plot.Tick
	for v := math.Ceil(lo); v <= hi; v += step {
		ts = append(ts, plot.Tick{Value: v, Label: fmt.Sprintf("%.0f", v)})
	}
	return ts
}
