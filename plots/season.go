package plots

import (
	"fmt"
	"image/color"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// SeasonScan is a worst-season scan: one short case per epoch, the figures
// of each, and the worst case of each criterion.
type SeasonScan struct {
	Day []float64 // days since the start of the scan, increasing
	// ValidPct, P95Deg and EclipseMin are each case's valid share (% of
	// sunlit time), p95 error (deg, NaN when undefined) and longest eclipse
	// (min).
	ValidPct, P95Deg, EclipseMin []float64
	// Refined marks the cases added around a coarse worst.
	Refined []bool
	// WorstValid, WorstP95 and WorstEclipse index the worst cases (-1:
	// none).
	WorstValid, WorstP95, WorstEclipse int
}

// Plot draws the three figures over the span, coarse cases as dots, refined
// ones as rings, the worst of each marked.
func (f SeasonScan) Plot(caption Caption) (*Chart, error) {
	n := len(f.Day)
	if n < 2 || len(f.ValidPct) != n || len(f.P95Deg) != n || len(f.EclipseMin) != n || len(f.Refined) != n {
		return nil, fmt.Errorf("plots: season scan: Day, ValidPct, P95Deg, EclipseMin and Refined need the same length ≥ 2")
	}
	var panels []*plot.Plot
	var rec []drawnSeries
	worstStyle := draw.LineStyle{Color: colVermil, Width: 1.5, Dashes: []vg.Length{5, 3}}
	for k, s := range []struct {
		title, ylabel string
		y             []float64
		worst         int
		c             color.Color
	}{{"Valid share (lowest is worst)", "valid (% of sunlit)", f.ValidPct, f.WorstValid, colGreen},
		{"p95 sun-vector error (largest is worst)", "p95 (deg)", f.P95Deg, f.WorstP95, colBlue},
		{"Longest eclipse of the case", "eclipse (min)", f.EclipseMin, f.WorstEclipse, colPurple}} {
		p := newPlot(s.title, "", s.ylabel)
		for _, seg := range segments(f.Day, s.y) {
			l, err := plotter.NewLine(seg)
			if err != nil {
				return nil, fmt.Errorf("plots: season scan: %w", err)
			}
			l.Color, l.Width = s.c, 1.2
			p.Add(l)
			rec = append(rec, drawnSeries{k, s.ylabel, l.XYs})
		}
		var coarse, fine plotter.XYs
		for i := range f.Day {
			if !finite(s.y[i]) {
				continue
			}
			if f.Refined[i] {
				fine = append(fine, plotter.XY{X: f.Day[i], Y: s.y[i]})
			} else {
				coarse = append(coarse, plotter.XY{X: f.Day[i], Y: s.y[i]})
			}
		}
		for j, pts := range []plotter.XYs{coarse, fine} {
			if len(pts) == 0 {
				continue
			}
			sc, err := plotter.NewScatter(pts)
			if err != nil {
				return nil, fmt.Errorf("plots: season scan: %w", err)
			}
			sc.Color, sc.Radius = s.c, 3
			sc.Shape = draw.CircleGlyph{}
			label := "coarse case"
			if j == 1 {
				sc.Shape, label = draw.RingGlyph{}, "refined case"
			}
			p.Add(sc)
			if k == 0 {
				p.Legend.Add(label, sc)
			}
		}
		if s.worst >= 0 {
			v := vline{f.Day[s.worst], worstStyle}
			p.Add(v)
			p.Legend.Add(fmt.Sprintf("worst: day %.1f", f.Day[s.worst]), v)
		}
		p.Legend.Top, p.Legend.Left = true, false
		panels = append(panels, p)
	}
	panels[len(panels)-1].X.Label.Text = "days since the start of the scan"
	return &Chart{Panels: panels, Caption: caption, Height: 7.5 * vg.Inch, drawn: rec}, nil
}

// EclipseMonths is the eclipse duration distribution per month: for each
// month the share of its orbits without eclipse and in each duration bin.
type EclipseMonths struct {
	Months []string // labels, e.g. "2026-03"
	BinMin float64  // bin width (min); bin k is (k·BinMin, (k+1)·BinMin]
	// Orbits, Without and Counts[month][bin] are numbers of orbits.
	Orbits, Without []int
	Counts          [][]int
}

// Plot draws one stacked bar per month (100 % of its orbits).
func (f EclipseMonths) Plot(caption Caption) (*Chart, error) {
	n := len(f.Months)
	if n == 0 || len(f.Orbits) != n || len(f.Without) != n || len(f.Counts) != n || !(f.BinMin > 0) {
		return nil, fmt.Errorf("plots: eclipse months: Months, Orbits, Without and Counts need the same length ≥ 1 and BinMin > 0")
	}
	bins := 0
	for _, c := range f.Counts {
		bins = max(bins, len(c))
	}
	p := newPlot("Eclipse duration per orbit, by month", "", "orbits (%)")
	w := vg.Length(min(36, 420/float64(n)))
	var below *plotter.BarChart
	share := func(k, m int) float64 {
		if f.Orbits[m] == 0 {
			return 0
		}
		return 100 * float64(k) / float64(f.Orbits[m])
	}
	var rec []drawnSeries
	for b := -1; b < bins; b++ {
		vals := make(plotter.Values, n)
		for m := range n {
			switch {
			case b < 0:
				vals[m] = share(f.Without[m], m)
			case b < len(f.Counts[m]):
				vals[m] = share(f.Counts[m][b], m)
			}
		}
		bar, err := plotter.NewBarChart(vals, w)
		if err != nil {
			return nil, fmt.Errorf("plots: eclipse months: %w", err)
		}
		bar.LineStyle.Width = 0
		label := "no eclipse"
		bar.Color = color.NRGBA{230, 230, 230, 255}
		if b >= 0 {
			label = fmt.Sprintf("%g–%g min", float64(b)*f.BinMin, float64(b+1)*f.BinMin)
			bar.Color = ramp(float64(b) / float64(max(bins-1, 1)))
		}
		if below != nil {
			bar.StackOn(below)
		}
		p.Add(bar)
		p.Legend.Add(label, bar)
		var xy plotter.XYs
		for m, v := range vals {
			xy = append(xy, plotter.XY{X: float64(m), Y: v})
		}
		rec = append(rec, drawnSeries{0, label, xy})
		below = bar
	}
	p.NominalX(f.Months...)
	p.Y.Min, p.Y.Max = 0, 100
	p.Legend.Top, p.Legend.Left = true, false
	p.Legend.XOffs = 0
	return &Chart{Panels: []*plot.Plot{p}, Caption: caption, drawn: rec}, nil
}

// ramp runs from a light yellow (short eclipses) through teal to a dark
// purple (long ones), the end and middle colours of the viridis map (van
// der Walt and Smith, 2015, from memory): ordered in lightness for readers
// with a colour-vision deficiency.
func ramp(x float64) color.Color {
	stops := [3][3]float64{{253, 231, 37}, {33, 145, 140}, {68, 1, 84}}
	x = min(max(x, 0), 1) * 2
	i := min(int(x), 1)
	f := x - float64(i)
	var c [3]uint8
	for k := range 3 {
		c[k] = uint8(stops[i][k] + f*(stops[i+1][k]-stops[i][k]) + 0.5)
	}
	return color.NRGBA{c[0], c[1], c[2], 255}
}
