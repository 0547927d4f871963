package plots

import (
	"fmt"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// PowerView is the solar-array power of a run: the instantaneous power
// over its first orbits and the mean power of every whole orbit.
type PowerView struct {
	T []float64 // s since the run epoch, increasing
	W []float64 // array power at T (W)
	// Umbra and Penumbra are eclipse spans in seconds since the epoch.
	Umbra, Penumbra []Interval
	// OrbitW is the mean power of each whole orbit in turn (W); MeanW the
	// time average over the run.
	OrbitW []float64
	MeanW  float64
	// Target is the orbit-average power requirement (W), drawn with its
	// verdict when set.
	Target *Target
}

func (f PowerView) validate() error {
	switch {
	case len(f.T) < 2 || len(f.T) != len(f.W):
		return fmt.Errorf("plots: power: T (%d) and W (%d) must hold the same number of samples, at least 2", len(f.T), len(f.W))
	case !(f.T[len(f.T)-1] > f.T[0]):
		return fmt.Errorf("plots: power: T must increase")
	}
	for i, w := range f.W {
		if !finite(w) || w < 0 {
			return fmt.Errorf("plots: power: W[%d] = %g; want a finite power ≥ 0", i, w)
		}
	}
	for i, w := range f.OrbitW {
		if !finite(w) || w < 0 {
			return fmt.Errorf("plots: power: OrbitW[%d] = %g; want a finite power ≥ 0", i, w)
		}
	}
	return nil
}

// Plot draws the power over the first orbits (eclipses shaded, the run
// average dashed) above the mean power per orbit (with the target).
func (f PowerView) Plot(caption Caption) (*Chart, error) {
	if err := f.validate(); err != nil {
		return nil, err
	}
	t, div, unit := scaledTimes(f.T)
	scale := func(s []Interval) []Interval { return scaleIntervals(s, div) }
	var rec []drawnSeries
	top := newPlot("Solar-array power over the first orbits", fmt.Sprintf("time since epoch (%s)", unit), "power (W)")
	top.Add(bands{scale(f.Penumbra), colPenumbra}, bands{scale(f.Umbra), colUmbra})
	top.X.Min, top.X.Max = t[0], t[len(t)-1]
	top.X.Tick.Marker = niceTicks{}
	l, err := plotter.NewLine(xy(t, f.W))
	if err != nil {
		return nil, fmt.Errorf("plots: power: %w", err)
	}
	l.Color, l.Width = colBlue, 1.6
	top.Add(l)
	top.Legend.Add("array power", l)
	rec = append(rec, drawnSeries{0, "array power", l.XYs})
	hi := 0.0
	for _, w := range f.W {
		hi = max(hi, w)
	}
	if finite(f.MeanW) {
		h := hline{f.MeanW, draw.LineStyle{Color: colBlack, Width: 1.2, Dashes: []vg.Length{4, 3}}}
		top.Add(h)
		top.Legend.Add(fmt.Sprintf("run average %.1f W", f.MeanW), h)
		hi = max(hi, f.MeanW)
	}
	if len(f.Umbra) > 0 {
		top.Legend.Add("umbra", swatch{colUmbra})
	}
	if len(f.Penumbra) > 0 {
		top.Legend.Add("penumbra", swatch{colPenumbra})
	}
	top.Y.Min, top.Y.Max = 0, 1.08*max(hi, 1e-3)
	panels := []*plot.Plot{top}

	if len(f.OrbitW) > 0 {
		p := newPlot(fmt.Sprintf("Mean power of each whole orbit (%d orbits)", len(f.OrbitW)), "orbit since epoch", "mean power (W)")
		x := make([]float64, len(f.OrbitW))
		lo, hi := math.Inf(1), math.Inf(-1)
		for i, w := range f.OrbitW {
			x[i] = float64(i + 1)
			lo, hi = min(lo, w), max(hi, w)
		}
		ln, sc, err := plotter.NewLinePoints(xy(x, f.OrbitW))
		if err != nil {
			return nil, fmt.Errorf("plots: power: %w", err)
		}
		ln.Color, ln.Width = colBlue, 1.6
		sc.GlyphStyle = draw.GlyphStyle{Color: colBlue, Radius: 2.5, Shape: draw.CircleGlyph{}}
		if len(f.OrbitW) > 60 {
			sc.GlyphStyle.Radius = 0
		}
		p.Add(ln, sc)
		p.Legend.Add("orbit mean", ln, sc)
		rec = append(rec, drawnSeries{1, "orbit mean", ln.XYs})
		if tg := f.Target; tg != nil {
			addTargetLine(p, tg.Value, tg.text())
			lo, hi = min(lo, tg.Value), max(hi, tg.Value)
		}
		// Start at zero unless the orbits differ by little against their level,
		// where a zero floor would flatten the season's trend to a line.
		r := hi - lo
		p.Y.Min, p.Y.Max = 0, 1.08*max(hi, 1e-3)
		if r > 0 && r < 0.2*hi {
			p.Y.Min, p.Y.Max = lo-0.5*r-0.01*hi, hi+0.5*r+0.01*hi
		}
		p.X.Min, p.X.Max = 0.5, float64(len(f.OrbitW))+0.5
		p.X.Tick.Marker = integerTicks{}
		panels = append(panels, p)
	}
	for _, p := range panels {
		p.Legend.Top, p.Legend.Left = true, false
		p.Legend.TextStyle.Font.Size = 11
	}
	return &Chart{Panels: panels, Caption: caption, drawn: rec}, nil
}
