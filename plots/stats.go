package plots

import (
	"fmt"
	"image/color"
	"math"
	"slices"
	"sort"

	"gonum.org/v1/gonum/stat"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// YearView is one sample per day (or per orbit) over a year.
type YearView struct {
	Day         []float64 // day of year (1 = 1 January)
	BetaDeg     []float64 // beta angle, deg
	EclipseMin  []float64 // eclipse (umbra + penumbra) minutes per orbit
	EclipseFree []bool    // no eclipse on this day; nil when not known
}

// Plot draws beta angle and eclipse minutes per orbit versus day of year,
// with the eclipse-free season shaded.
func (f YearView) Plot(caption Caption) (*Chart, error) {
	n := len(f.Day)
	if n < 2 {
		return nil, fmt.Errorf("plots: year view: Day needs at least 2 samples, got %d", n)
	}
	for name, l := range map[string]int{"BetaDeg": len(f.BetaDeg), "EclipseMin": len(f.EclipseMin), "EclipseFree": len(f.EclipseFree)} {
		if l != 0 && l != n {
			return nil, fmt.Errorf("plots: year view: %s has %d samples, want %d (one per Day) or none", name, l, n)
		}
	}
	season := runs(f.Day, f.EclipseFree)
	var panels []*plot.Plot
	var rec []drawnSeries
	add := func(title, ylabel string, y []float64, c color.Color, legend string) error {
		p := newPlot(title, "", ylabel)
		p.Add(bands{season, colSeason})
		for _, seg := range segments(f.Day, y) {
			l, err := plotter.NewLine(seg)
			if err != nil {
				return fmt.Errorf("plots: year view: %w", err)
			}
			l.Color, l.Width = c, 2
			p.Add(l)
			rec = append(rec, drawnSeries{len(panels), legend, l.XYs})
		}
		if len(season) > 0 {
			p.Legend.Add("eclipse-free", swatch{colSeason})
		}
		p.X.Min, p.X.Max = f.Day[0], f.Day[n-1]
		panels = append(panels, p)
		return nil
	}
	if f.BetaDeg != nil {
		if err := add("Beta angle", "beta (deg)", f.BetaDeg, colBlue, "beta"); err != nil {
			return nil, err
		}
		panels[len(panels)-1].Add(hline{0, draw.LineStyle{Color: color.Gray{120}, Width: 0.8}})
	}
	if f.EclipseMin != nil {
		if err := add("Eclipse per orbit", "eclipse (min/orbit)", f.EclipseMin, colVermil, "eclipse"); err != nil {
			return nil, err
		}
		panels[len(panels)-1].Y.Min = 0
	}
	if len(panels) == 0 {
		return nil, fmt.Errorf("plots: year view: nothing to draw; fill BetaDeg or EclipseMin")
	}
	for i, p := range panels {
		p.Legend.Top, p.Legend.Left = true, false
		if i > 0 {
			p.Legend = plot.NewLegend()
		}
	}
	panels[len(panels)-1].X.Label.Text = "day of year"
	return &Chart{Panels: panels, Caption: caption, drawn: rec}, nil
}

// ErrSeries is one error distribution. Give either the samples ErrorsDeg
// (any order, NaN ignored) or a histogram: BinEdgesDeg (increasing, one
// more than BinCounts) with BinCounts.
type ErrSeries struct {
	Label       string
	ErrorsDeg   []float64
	BinEdgesDeg []float64
	BinCounts   []float64
}

// ErrorDist compares sun-vector error distributions (e.g. with and
// without albedo).
type ErrorDist struct {
	Series []ErrSeries
	// UnitP95Deg optionally holds the p95 of each Monte Carlo unit; shown
	// as ticks on the 95 % line of the CDF.
	UnitP95Deg []float64
}

// cdf returns the points of the empirical or binned CDF and the p95.
func (s ErrSeries) cdf() (plotter.XYs, float64, error) {
	if len(s.ErrorsDeg) > 0 {
		x := make([]float64, 0, len(s.ErrorsDeg))
		for _, v := range s.ErrorsDeg {
			if finite(v) {
				x = append(x, v)
			}
		}
		if len(x) == 0 {
			return nil, 0, fmt.Errorf("no finite samples")
		}
		slices.Sort(x)
		pts := make(plotter.XYs, len(x))
		for i, v := range x {
			pts[i] = plotter.XY{X: v, Y: float64(i+1) / float64(len(x))}
		}
		return pts, stat.Quantile(0.95, stat.Empirical, x, nil), nil
	}
	e, c := s.BinEdgesDeg, s.BinCounts
	if len(e) != len(c)+1 || len(c) == 0 {
		return nil, 0, fmt.Errorf("BinEdgesDeg needs one more entry than BinCounts (got %d and %d)", len(e), len(c))
	}
	total := 0.0
	for i, v := range c {
		if !(v >= 0) || !(e[i+1] > e[i]) {
			return nil, 0, fmt.Errorf("bin %d: counts must be ≥ 0 and edges increase", i)
		}
		total += v
	}
	if total == 0 {
		return nil, 0, fmt.Errorf("all bins are empty")
	}
	pts := plotter.XYs{{X: e[0], Y: 0}}
	cum, p95 := 0.0, e[len(e)-1]
	found := false
	for i, v := range c {
		prev := cum
		cum += v / total
		pts = append(pts, plotter.XY{X: e[i+1], Y: cum})
		if !found && cum >= 0.95 {
			// Linear within the bin (common practice, no source).
			p95 = e[i] + (0.95-prev)/(cum-prev)*(e[i+1]-e[i])
			found = true
		}
	}
	return pts, p95, nil
}

// Plot draws the CDFs (top) and histograms (bottom) with each p95 marked.
func (f ErrorDist) Plot(caption Caption) (*Chart, error) {
	if len(f.Series) == 0 {
		return nil, fmt.Errorf("plots: error distribution: Series is empty")
	}
	cdfP := newPlot("Sun-vector error: cumulative distribution", "", "fraction of valid samples")
	histP := newPlot("Sun-vector error: histogram", "sun-vector error (deg)", "fraction per bin")
	cdfP.Y.Min, cdfP.Y.Max = 0, 1.02
	var rec []drawnSeries
	top := 0.0
	for _, s := range f.Series {
		for _, v := range s.ErrorsDeg {
			if finite(v) {
				top = math.Max(top, v)
			}
		}
	}
	if top == 0 {
		top = 1
	}
	sharedEdges := make([]float64, 41)
	for i := range sharedEdges {
		sharedEdges[i] = top * float64(i) / 40
	}
	cdfP.Add(hline{0.95, draw.LineStyle{Color: color.Gray{140}, Width: 0.8, Dashes: []vg.Length{2, 2}}})
	for k, s := range f.Series {
		pts, p95, err := s.cdf()
		if err != nil {
			return nil, fmt.Errorf("plots: error distribution: Series[%d] (%q): %w", k, s.Label, err)
		}
		l, err := plotter.NewLine(pts)
		if err != nil {
			return nil, fmt.Errorf("plots: error distribution: %w", err)
		}
		l.Color, l.Width = seriesColour(k), 2
		cdfP.Add(l)
		rec = append(rec, drawnSeries{0, s.Label, l.XYs}, drawnSeries{0, "p95 " + s.Label, plotter.XYs{{X: p95, Y: 0.95}}})
		mark := vline{p95, draw.LineStyle{Color: seriesColour(k), Width: 1.2, Dashes: []vg.Length{5, 3}}}
		cdfP.Add(mark)
		cdfP.Legend.Add(s.Label, l)
		cdfP.Legend.Add(fmt.Sprintf("p95 %s = %.2f°", s.Label, p95), mark)

		var h *plotter.Histogram
		if len(s.ErrorsDeg) > 0 {
			// Shared bins for every sampled series, so bars compare.
			counts := make([]float64, len(sharedEdges)-1)
			for _, p := range pts {
				i := sort.SearchFloat64s(sharedEdges, p.X) - 1
				counts[max(0, min(i, len(counts)-1))]++
			}
			h, err = binnedHist(sharedEdges, counts)
		} else {
			h, err = binnedHist(s.BinEdgesDeg, s.BinCounts)
		}
		if err != nil {
			return nil, fmt.Errorf("plots: error distribution: Series[%d] (%q): %w", k, s.Label, err)
		}
		h.FillColor = withAlpha(seriesColour(k), 90)
		h.LineStyle.Color = seriesColour(k)
		histP.Add(h)
		histP.Add(vline{p95, mark.Style})
		histP.Legend.Add(s.Label, h)
	}
	if len(f.UnitP95Deg) > 0 {
		sc, err := plotter.NewScatter(xy(f.UnitP95Deg, constant(len(f.UnitP95Deg), 0.95)))
		if err != nil {
			return nil, fmt.Errorf("plots: error distribution: UnitP95Deg: %w", err)
		}
		sc.GlyphStyle = draw.GlyphStyle{Color: colBlack, Radius: 3, Shape: draw.PlusGlyph{}}
		cdfP.Add(sc)
		cdfP.Legend.Add("p95 of each Monte Carlo unit", sc)
	}
	cdfP.X.Min, histP.X.Min = 0, 0
	cdfP.X.Tick.Marker, histP.X.Tick.Marker = niceTicks{}, niceTicks{}
	cdfP.Legend.Left, cdfP.Legend.Top = false, false
	cdfP.Legend.XOffs, cdfP.Legend.YOffs = -4, 8
	histP.Y.Min = 0
	return &Chart{Panels: []*plot.Plot{cdfP, histP}, Caption: caption, Height: 7.5 * vg.Inch, drawn: rec}, nil
}

func binnedHist(edges, counts []float64) (*plotter.Histogram, error) {
	total := 0.0
	for _, c := range counts {
		total += c
	}
	bins := make([]plotter.HistogramBin, len(counts))
	for i, c := range counts {
		bins[i] = plotter.HistogramBin{Min: edges[i], Max: edges[i+1], Weight: c / total}
	}
	h := &plotter.Histogram{Bins: bins, Width: edges[1] - edges[0], FillColor: color.Gray{200}, LineStyle: plotter.DefaultLineStyle}
	return h, nil
}

func withAlpha(c color.Color, a uint8) color.Color {
	r, g, b, _ := c.RGBA()
	return color.NRGBA{uint8(r >> 8), uint8(g >> 8), uint8(b >> 8), a}
}

func constant(n int, v float64) []float64 {
	out := make([]float64, n)
	for i := range out {
		out[i] = v
	}
	return out
}

// Gaps are the sunlit spans without a valid sun vector.
type Gaps struct {
	DurationsS []float64 // one per gap, seconds
	LongestS   float64   // the longest gap, seconds (marked)
}

// Plot draws the histogram of gap durations with the longest marked.
func (f Gaps) Plot(caption Caption) (*Chart, error) {
	if len(f.DurationsS) == 0 {
		return nil, fmt.Errorf("plots: gaps: DurationsS is empty (a run with no gap needs no gap figure)")
	}
	div, unit := 1.0, "s"
	if f.LongestS > 600 {
		div, unit = 60, "min"
	}
	v := make(plotter.Values, 0, len(f.DurationsS))
	for i, d := range f.DurationsS {
		if !finite(d) || d < 0 {
			return nil, fmt.Errorf("plots: gaps: DurationsS[%d] = %g; durations must be finite and ≥ 0", i, d)
		}
		v = append(v, d/div)
	}
	p := newPlot("Sunlit gaps without a valid sun vector", fmt.Sprintf("gap duration (%s)", unit), "number of gaps")
	h, err := plotter.NewHist(v, min(30, max(5, len(v)/3)))
	if err != nil {
		return nil, fmt.Errorf("plots: gaps: %w", err)
	}
	h.FillColor = withAlpha(colBlue, 120)
	h.LineStyle.Color = colBlue
	p.Add(h)
	p.Legend.Add(fmt.Sprintf("%d gaps", len(v)), h)
	mark := vline{f.LongestS / div, draw.LineStyle{Color: colVermil, Width: 2, Dashes: []vg.Length{6, 3}}}
	p.Add(mark)
	p.Legend.Add(fmt.Sprintf("longest = %.0f s", f.LongestS), mark)
	p.Legend.Top, p.Legend.Left = true, false
	p.Y.Min = 0
	rec := []drawnSeries{{0, "longest", plotter.XYs{{X: mark.X}}}}
	for _, b := range h.Bins {
		rec = append(rec, drawnSeries{0, "bin", plotter.XYs{{X: b.Min, Y: b.Weight}, {X: b.Max, Y: b.Weight}}})
	}
	return &Chart{Panels: []*plot.Plot{p}, Caption: caption, drawn: rec}, nil
}

// Line is one labelled curve over a shared X.
type Line struct {
	Label string
	Y     []float64 // NaN leaves a gap
}

// Sweep is a set of curves versus a swept parameter (altitude, LTAN, layout
// index...).
type Sweep struct {
	Title  string
	XLabel string
	X      []float64
	Lines  []Line
	YLabel string
	// Target, when set, is drawn as a horizontal requirement line.
	Target *float64
	// TargetLabel names it ("requirement: 95 %").
	TargetLabel string
}

// Plot draws the sweep curves with markers at each computed point.
func (f Sweep) Plot(caption Caption) (*Chart, error) {
	p, rec, err := curves("sweep", f.Title, f.XLabel, f.YLabel, f.X, f.Lines)
	if err != nil {
		return nil, err
	}
	if f.Target != nil {
		h := hline{*f.Target, draw.LineStyle{Color: colBlack, Width: 1.5, Dashes: []vg.Length{8, 4}}}
		p.Add(h)
		lab := f.TargetLabel
		if lab == "" {
			lab = fmt.Sprintf("target %g", *f.Target)
		}
		p.Legend.Add(lab, h)
	}
	return &Chart{Panels: []*plot.Plot{p}, Caption: caption, drawn: rec}, nil
}

func curves(what, title, xLabel, yLabel string, x []float64, lines []Line) (*plot.Plot, []drawnSeries, error) {
	var rec []drawnSeries
	if len(x) == 0 || len(lines) == 0 {
		return nil, nil, fmt.Errorf("plots: %s: X and Lines must not be empty", what)
	}
	if title == "" {
		title = yLabel + " versus " + xLabel
	}
	p := newPlot(title, xLabel, yLabel)
	for k, ln := range lines {
		if len(ln.Y) != len(x) {
			return nil, nil, fmt.Errorf("plots: %s: Lines[%d] (%q) has %d values, want %d (one per X)", what, k, ln.Label, len(ln.Y), len(x))
		}
		var first *plotter.Line
		for _, seg := range segments(x, ln.Y) {
			l, s, err := plotter.NewLinePoints(seg)
			if err != nil {
				return nil, nil, fmt.Errorf("plots: %s: %w", what, err)
			}
			l.Color, l.Width = seriesColour(k), 2
			s.GlyphStyle = draw.GlyphStyle{Color: seriesColour(k), Radius: 3.5, Shape: glyphs[k%len(glyphs)]}
			p.Add(l, s)
			rec = append(rec, drawnSeries{0, ln.Label, l.XYs})
			if first == nil {
				first = l
				p.Legend.Add(ln.Label, l, s)
			}
		}
	}
	p.Legend.Top, p.Legend.Left = true, false
	// Head-room above the data for the legend rows (gonum legends have no
	// background, so a line under the legend would be unreadable).
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, ln := range lines {
		for _, v := range ln.Y {
			if !math.IsNaN(v) && !math.IsInf(v, 0) {
				lo, hi = math.Min(lo, v), math.Max(hi, v)
			}
		}
	}
	if lo <= hi {
		r := hi - lo
		if r == 0 {
			r = math.Max(math.Abs(hi), 1)
		}
		p.Y.Min = lo - 0.05*r
		p.Y.Max = hi + (0.05+0.07*float64(len(lines)))*r
	}
	return p, rec, nil
}

var glyphs = []draw.GlyphDrawer{draw.CircleGlyph{}, draw.SquareGlyph{}, draw.TriangleGlyph{}, draw.CrossGlyph{}, draw.PlusGlyph{}, draw.RingGlyph{}}

// BudgetBars is an error budget: one p95 contribution per term.
type BudgetBars struct {
	Title  string
	Labels []string
	P95Deg []float64
}

// Plot draws horizontal bars, one per budget term, largest kept in input
// order (the caller sorts).
func (f BudgetBars) Plot(caption Caption) (*Chart, error) {
	if len(f.Labels) == 0 || len(f.Labels) != len(f.P95Deg) {
		return nil, fmt.Errorf("plots: budget: Labels (%d) and P95Deg (%d) must be non-empty and the same length", len(f.Labels), len(f.P95Deg))
	}
	for i, v := range f.P95Deg {
		if !finite(v) || v < 0 {
			return nil, fmt.Errorf("plots: budget: P95Deg[%d] (%q) = %g; must be finite and ≥ 0", i, f.Labels[i], v)
		}
	}
	title := f.Title
	if title == "" {
		title = "Sun-vector error budget (p95 per term)"
	}
	p := newPlot(title, "p95 error (deg)", "")
	// Reverse so the first term is on top.
	n := len(f.Labels)
	vals := make(plotter.Values, n)
	names := make([]string, n)
	for i := range n {
		vals[i] = f.P95Deg[n-1-i]
		names[i] = f.Labels[n-1-i]
	}
	b, err := plotter.NewBarChart(vals, vg.Length(math.Min(40, 260/float64(n))))
	if err != nil {
		return nil, fmt.Errorf("plots: budget: %w", err)
	}
	b.Horizontal = true
	b.Color = withAlpha(colBlue, 200)
	b.LineStyle.Width = 0
	p.Add(b)
	p.NominalY(names...)
	p.X.Min = 0
	p.X.Max = slices.Max(f.P95Deg) * 1.08 // keep the longest bar off the frame
	rec := make([]drawnSeries, n)
	for i := range n {
		rec[i] = drawnSeries{0, names[i], plotter.XYs{{X: b.Values[i], Y: float64(i)}}}
	}
	return &Chart{Panels: []*plot.Plot{p}, Caption: caption, drawn: rec}, nil
}

// Sensitivity is the response of a figure of merit to one parameter, one
// curve per output, with the nominal value marked.
type Sensitivity struct {
	Title     string
	Parameter string // x-axis label with unit, e.g. "albedo coefficient"
	X         []float64
	Lines     []Line
	YLabel    string
	// Nominal is the baseline parameter value (marked when set).
	Nominal *float64
}

// Plot draws the sensitivity curves.
func (f Sensitivity) Plot(caption Caption) (*Chart, error) {
	p, rec, err := curves("sensitivity", f.Title, f.Parameter, f.YLabel, f.X, f.Lines)
	if err != nil {
		return nil, err
	}
	if f.Nominal != nil {
		v := vline{*f.Nominal, draw.LineStyle{Color: colBlack, Width: 1.2, Dashes: []vg.Length{4, 3}}}
		p.Add(v)
		p.Legend.Add(fmt.Sprintf("nominal %g", *f.Nominal), v)
	}
	return &Chart{Panels: []*plot.Plot{p}, Caption: caption, drawn: rec}, nil
}
