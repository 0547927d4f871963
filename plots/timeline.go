package plots

import (
	"fmt"
	"math"
	"strconv"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
)

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
	}{{"SensorsSeeing", len(f.SensorsSeeing)}, {"Valid", len(f.Valid)}, {"ErrNoAlbedoDeg", len(f.ErrNoAlbedoDeg)}, {"ErrAlbedoDeg", len(f.ErrAlbedoDeg)}} {
		if err := check(c.name, c.l); err != nil {
			return err
		}
	}
	return nil
}

// timeScale picks minutes for spans up to 12 h, hours beyond.
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
	div, unit := timeScale(f.T[len(f.T)-1] - f.T[0])
	t := make([]float64, len(f.T))
	for i, v := range f.T {
		t[i] = v / div
	}
	scaleSpans := func(s []Interval) []Interval {
		out := make([]Interval, len(s))
		for i, v := range s {
			out[i] = Interval{v.Start / div, v.End / div}
		}
		return out
	}
	umbra, penumbra := scaleSpans(f.Umbra), scaleSpans(f.Penumbra)
	xlabel := fmt.Sprintf("time since epoch (%s)", unit)

	var panels []*plot.Plot
	var rec []drawnSeries
	addPanel := func(title, ylabel string) *plot.Plot {
		p := newPlot(title, "", ylabel)
		p.Add(bands{penumbra, colPenumbra}, bands{umbra, colUmbra})
		p.X.Min, p.X.Max = t[0], t[len(t)-1]
		p.X.Tick.Marker = niceTicks{}
		panels = append(panels, p)
		return p
	}
	if f.SensorsSeeing != nil {
		p := addPanel("Sensors seeing the sun", "sensors")
		y := make([]float64, len(f.SensorsSeeing))
		top := 1
		for i, v := range f.SensorsSeeing {
			y[i] = float64(v)
			top = max(top, v)
		}
		l, err := plotter.NewLine(xy(t, y))
		if err != nil {
			return nil, fmt.Errorf("plots: timeline: %w", err)
		}
		l.StepStyle = plotter.PostStep
		l.Color, l.Width = colBlue, 1.5
		p.Add(l)
		rec = append(rec, drawnSeries{len(panels) - 1, "sensors seeing", l.XYs})
		p.Y.Min, p.Y.Max = 0, float64(top)+1.6 // head room for the legend
		p.Y.Tick.Marker = integerTicks{}
		p.Legend.Add("sensors seeing", l)
	}
	if f.Valid != nil {
		p := addPanel("Sun vector valid", "valid")
		y := make([]float64, len(f.Valid))
		for i, v := range f.Valid {
			if v {
				y[i] = 1
			}
		}
		l, err := plotter.NewLine(xy(t, y))
		if err != nil {
			return nil, fmt.Errorf("plots: timeline: %w", err)
		}
		l.StepStyle = plotter.PostStep
		l.Color, l.Width = colGreen, 1.5
		p.Add(l)
		rec = append(rec, drawnSeries{len(panels) - 1, "valid", l.XYs})
		p.Y.Min, p.Y.Max = -0.1, 1.1
		p.Y.Tick.Marker = plot.ConstantTicks([]plot.Tick{{Value: 0, Label: "no"}, {Value: 1, Label: "yes"}})
	}
	if f.ErrNoAlbedoDeg != nil || f.ErrAlbedoDeg != nil {
		p := addPanel("Sun-vector error", "error (deg)")
		p.Y.Min = 0
		defer func() { p.Y.Max *= 1.35 }() // head room for the legend
		for k, s := range []struct {
			label string
			y     []float64
		}{{"without albedo", f.ErrNoAlbedoDeg}, {"with albedo", f.ErrAlbedoDeg}} {
			if s.y == nil {
				continue
			}
			var first *plotter.Line
			for _, seg := range segments(t, s.y) {
				l, err := plotter.NewLine(seg)
				if err != nil {
					return nil, fmt.Errorf("plots: timeline: %w", err)
				}
				l.Color, l.Width = seriesColour(k), 1.5
				if k == 1 {
					l.Dashes = []vg.Length{6, 3}
				}
				p.Add(l)
				rec = append(rec, drawnSeries{len(panels) - 1, s.label, l.XYs})
				if first == nil {
					first = l
				}
			}
			if first != nil {
				p.Legend.Add(s.label, first)
			}
		}
	}
	if len(panels) == 0 {
		return nil, fmt.Errorf("plots: timeline: nothing to draw; fill SensorsSeeing, Valid or an error series")
	}
	top := panels[0]
	if len(f.Umbra) > 0 {
		top.Legend.Add("umbra", swatch{colUmbra})
	}
	if len(f.Penumbra) > 0 {
		top.Legend.Add("penumbra", swatch{colPenumbra})
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
	raw := (hi - lo) / 8
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
	step := math.Max(1, math.Ceil((hi-lo)/6))
	var ts []plot.Tick
	for v := math.Ceil(lo); v <= hi; v += step {
		ts = append(ts, plot.Tick{Value: v, Label: fmt.Sprintf("%.0f", v)})
	}
	return ts
}
