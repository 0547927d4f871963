package plots

import (
	"errors"
	"fmt"
	"image/color"
	"math"
	"slices"
	"sort"
	"time"

	"gonum.org/v1/gonum/stat"
	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// YearView is one sample per day (or per orbit) over a year.
type YearView struct {
	Day         []float64 // day of year (1 = 1 January)
	BetaDeg     []float64 // beta angle, deg
	EclipseMin  []float64 // eclipse (umbra + penumbra) minutes per orbit
	EclipseFree []bool    // no eclipse on this day; nil when not known
	// Year, when set, labels the axis with month starts of that year.
	Year int
	// Run is the span of the run in days of year (shaded and labelled);
	// zero when not shown.
	Run Interval
}

// monthTicks labels the first day of each month of year.
type monthTicks struct{ year int }

func (m monthTicks) Ticks(lo, hi float64) []plot.Tick {
	var ts []plot.Tick
	for mo := time.January; mo <= time.December; mo++ {
		d := float64(time.Date(m.year, mo, 1, 0, 0, 0, 0, time.UTC).YearDay())
		if d >= lo && d <= hi {
			ts = append(ts, plot.Tick{Value: d, Label: mo.String()[:3]})
		}
	}
	return ts
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
	run := f.Run
	if run.End < run.Start+1 && run != (Interval{}) {
		// A run shorter than a day is still shown a day wide.
		run.End = run.Start + 1
	}
	var panels []*plot.Plot
	var rec []drawnSeries
	add := func(title, ylabel string, y []float64, c color.Color, legend string) error {
		p := newPlot(title, "", ylabel)
		p.Add(bands{season, colSeason})
		if f.Run != (Interval{}) {
			p.Add(bands{[]Interval{run}, colRun})
		}
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
		if f.Run != (Interval{}) {
			p.Legend.Add(fmt.Sprintf("this run (days %.0f–%.0f)", math.Floor(f.Run.Start), math.Ceil(f.Run.End)), swatch{colRun})
		}
		p.X.Min, p.X.Max = f.Day[0], f.Day[n-1]
		if f.Year > 0 {
			p.X.Tick.Marker = monthTicks{f.Year}
		}
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
	if f.Year > 0 {
		panels[len(panels)-1].X.Label.Text = fmt.Sprintf("date in %d (ticks on the 1st of each month)", f.Year)
	}
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
	// P95Deg, when set, is the run's own p95 (deg): marked and labelled
	// (to 0.01°, as the report prints it) instead of the p95 of the
	// samples or bins given, which only approximate it.
	P95Deg *float64
}

// maxAngleDeg is the largest angle between two directions: the error
// axes end there.
const maxAngleDeg = 180

// ErrorDist compares sun-vector error distributions (e.g. with and
// without albedo).
type ErrorDist struct {
	Series []ErrSeries
	// UnitP95Deg optionally holds the p95 of each Monte Carlo unit; shown
	// as ticks on the 95 % line of the CDF.
	UnitP95Deg []float64
	// Target is the p95 requirement (deg) with its verdict, when set.
	Target *Target
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
			return nil, 0, errors.New("plots: no finite error samples")
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
		return nil, 0, fmt.Errorf("plots: bin edges need one more entry than bin counts (got %d and %d)", len(e), len(c))
	}
	total := 0.0
	for i, v := range c {
		if !(v >= 0) || !(e[i+1] > e[i]) {
			return nil, 0, fmt.Errorf("plots: bin %d: counts must be ≥ 0 and edges increase", i)
		}
		total += v
	}
	if total == 0 {
		return nil, 0, errors.New("plots: all bins are empty")
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

// Plot draws the CDFs (top, log error axis, so a 0.01° curve and a 10°
// curve both read) and step-outline histograms on log-spaced bins (bottom)
// with each p95 and the target marked.
func (f ErrorDist) Plot(caption Caption) (*Chart, error) {
	if len(f.Series) == 0 {
		return nil, fmt.Errorf("plots: error distribution: Series is empty")
	}
	cdfP := newPlot("Sun-vector error: cumulative distribution", "", "fraction of valid samples")
	histP := newPlot("Sun-vector error: histogram (log-spaced bins)", "sun-vector error (deg, log scale)", "fraction per bin")
	cdfP.Y.Min, cdfP.Y.Max = 0, 1.02
	var rec []drawnSeries
	type prepared struct {
		pts plotter.XYs
		p95 float64
	}
	var prep []prepared
	lo, hi := math.Inf(1), math.Inf(-1)
	for k, s := range f.Series {
		pts, p95, err := s.cdf()
		if err != nil {
			return nil, fmt.Errorf("plots: error distribution: Series[%d] (%q): %w", k, s.Label, err)
		}
		for _, p := range pts {
			if p.X > 0 {
				lo, hi = min(lo, p.X), max(hi, p.X)
			}
		}
		prep = append(prep, prepared{pts, p95})
	}
	if f.Target != nil && f.Target.Value > 0 {
		lo, hi = min(lo, f.Target.Value), max(hi, f.Target.Value)
	}
	if !(lo <= hi) {
		lo, hi = 0.01, 1
	}
	// Whole decades around the data, ending at 180° (no angle is larger);
	// zero errors sit on the left edge; at least a factor 100.
	xmin := math.Pow(10, math.Floor(math.Log10(lo)))
	xmax := min(math.Pow(10, math.Ceil(math.Log10(hi*1.0001))), maxAngleDeg)
	if xmax/xmin < 100 {
		if xmax = xmin * 100; xmax > maxAngleDeg {
			xmax, xmin = maxAngleDeg, min(xmin, 1) // 1° to 180°
		}
	}
	const nb = 40
	edges := make([]float64, nb+1)
	for i := range edges {
		edges[i] = xmin * math.Pow(xmax/xmin, float64(i)/nb)
	}
	cdfP.Add(hline{0.95, draw.LineStyle{Color: color.Gray{140}, Width: 0.8, Dashes: []vg.Length{2, 2}}})
	histTop := 0.0
	for k, s := range f.Series {
		pts := make(plotter.XYs, len(prep[k].pts))
		for i, p := range prep[k].pts {
			pts[i] = plotter.XY{X: max(p.X, xmin), Y: p.Y}
		}
		p95, p95Label := prep[k].p95, fmt.Sprintf("%.3g", prep[k].p95)
		if s.P95Deg != nil {
			p95, p95Label = *s.P95Deg, fmt.Sprintf("%.2f", *s.P95Deg)
		}
		l, err := plotter.NewLine(pts)
		if err != nil {
			return nil, fmt.Errorf("plots: error distribution: %w", err)
		}
		l.Color, l.Width = seriesColour(k), 2.2
		if k == 1 {
			l.Dashes = []vg.Length{7, 3}
		}
		cdfP.Add(l)
		rec = append(rec, drawnSeries{0, s.Label, l.XYs}, drawnSeries{0, "p95 " + s.Label, plotter.XYs{{X: p95, Y: 0.95}}})
		mark := vline{max(p95, xmin), draw.LineStyle{Color: seriesColour(k), Width: 1.2, Dashes: []vg.Length{2, 2}}}
		cdfP.Add(mark)
		cdfP.Legend.Add(s.Label, l)
		cdfP.Legend.Add(fmt.Sprintf("p95 %s = %s°", s.Label, p95Label), mark)

		// Fraction per log-spaced bin, drawn as a step outline so the
		// series overlap without mixing colours.
		counts := make([]float64, nb)
		total := 0.0
		if len(s.ErrorsDeg) > 0 {
			for _, p := range prep[k].pts {
				i := sort.SearchFloat64s(edges, p.X) - 1
				counts[max(0, min(i, nb-1))]++
				total++
			}
		} else {
			for i, c := range s.BinCounts {
				mid := (s.BinEdgesDeg[i] + s.BinEdgesDeg[i+1]) / 2
				j := sort.SearchFloat64s(edges, mid) - 1
				counts[max(0, min(j, nb-1))] += c
				total += c
			}
		}
		step := make(plotter.XYs, 0, 2*nb+2)
		step = append(step, plotter.XY{X: edges[0], Y: 0})
		for i, c := range counts {
			step = append(step, plotter.XY{X: edges[i], Y: c / total}, plotter.XY{X: edges[i+1], Y: c / total})
			histTop = max(histTop, c/total)
		}
		step = append(step, plotter.XY{X: edges[nb], Y: 0})
		h, err := plotter.NewLine(step)
		if err != nil {
			return nil, fmt.Errorf("plots: error distribution: %w", err)
		}
		h.Color, h.Width = seriesColour(k), 2
		if k == 1 {
			h.Dashes = []vg.Length{7, 3}
		}
		histP.Add(h)
		histP.Add(vline{mark.X, mark.Style})
		histP.Legend.Add(s.Label, h)
		rec = append(rec, drawnSeries{1, "hist " + s.Label, step})
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
	if tg := f.Target; tg != nil {
		v := vline{tg.Value, tg.style()}
		cdfP.Add(v)
		histP.Add(v)
		cdfP.Legend.Add(tg.text(), v)
		histP.Legend.Add("target p95 "+tg.Label, v)
	}
	for _, p := range []*plot.Plot{cdfP, histP} {
		p.X.Scale = plot.LogScale{}
		// Half the chart width: shorter than the drawn axis (the legend
		// takes the rest), so labels that fit here fit there.
		p.X.Tick.Marker = decadeTicks{label: p.X.Tick.Label, axis: DefaultWidth / 2}
		p.X.Min, p.X.Max = xmin, xmax
	}
	histP.Y.Min, histP.Y.Max = 0, histTop*1.08
	return &Chart{Panels: []*plot.Plot{cdfP, histP}, Caption: caption, Height: 7.5 * vg.Inch, drawn: rec}, nil
}

// decadeTicks labels 1, 2 and 5 × 10ⁿ on a log axis where their labels fit
// side by side, with minor ticks at the other integers. Labels are kept in
// turn — the decades from the largest down, then the fives, then the twos —
// each only when it leaves a gap of gapEm (em of the label font) to every
// label kept before, on an axis taken to be axis long: errors down to
// 0.001° printed "0.0010.0020.0050.010.02". A decade label a longer one
// beside it crowds out goes too (a span of eight decades labels every
// other one).
type decadeTicks struct {
	label text.Style // the axis' tick label style
	axis  vg.Length  // the axis length assumed (shorter than drawn)
}

// gapEm is the least space between two tick labels, in em (common
// practice, no source).
const gapEm = 0.5

func (d decadeTicks) Ticks(lo, hi float64) []plot.Tick {
	var ts []plot.Tick
	for e := math.Floor(math.Log10(lo)); e <= math.Ceil(math.Log10(hi)); e++ {
		p := math.Pow(10, e)
		for m := 1.0; m < 10; m++ {
			v := m * p
			if v < lo*(1-1e-9) || v > hi*(1+1e-9) {
				continue
			}
			ts = append(ts, plot.Tick{Value: v})
		}
	}
	if len(ts) == 0 || !(hi > lo) {
		return ts
	}
	span := math.Log10(hi / lo)
	pos := func(v float64) float64 { return float64(d.axis) * math.Log10(v/lo) / span }
	gap := gapEm * float64(d.label.Font.Size)
	type kept struct{ x, half float64 }
	var done []kept
	fits := func(x, half float64) bool {
		for _, k := range done {
			if math.Abs(x-k.x) < half+k.half+gap {
				return false
			}
		}
		return true
	}
	for _, lead := range []float64{1, 5, 2} {
		for i := len(ts) - 1; i >= 0; i-- {
			v := ts[i].Value
			if m := math.Round(v / math.Pow(10, math.Floor(math.Log10(v)+1e-9))); m != lead {
				continue
			}
			lab := tickLabel(v)
			x, half := pos(v), float64(d.label.Width(lab))/2
			if fits(x, half) {
				ts[i].Label = lab
				done = append(done, kept{x, half})
			}
		}
	}
	return ts
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
	// DurationsS are the gap durations, seconds; Counts, when set, is the
	// number of gaps of each duration (beside DurationsS), else each
	// duration is one gap.
	DurationsS []float64
	Counts     []int
	LongestS   float64 // the longest gap, seconds (marked)
	// StepS is the run's time step: gap durations are whole steps, so bins
	// are whole multiples of it (0 = free bins).
	StepS float64
	// Target is the longest-gap requirement (s) with its verdict.
	Target *Target
}

// gapBins returns bin edges for durations that are whole multiples of step:
// each bin holds the same whole number of steps, edges half a step off the
// possible values, at most about 30 bins.
func gapBins(longest, step float64) []float64 {
	if !(step > 0) {
		n := 20
		e := make([]float64, n+1)
		for i := range e {
			e[i] = longest * 1.05 * float64(i) / float64(n)
		}
		return e
	}
	steps := math.Round(longest/step) + 1
	per := max(1, math.Ceil(steps/30))
	var e []float64
	for v := 0.5 * step; ; v += per * step {
		e = append(e, v)
		if v > longest {
			break
		}
	}
	return e
}

// count is the number of gaps of the k-th duration.
func (f Gaps) count(k int) int {
	if f.Counts == nil {
		return 1
	}
	return f.Counts[k]
}

// Number is the number of gaps.
func (f Gaps) Number() int {
	n := 0
	for k := range f.DurationsS {
		n += f.count(k)
	}
	return n
}

// Plot draws the histogram of gap durations (seconds, bins of whole steps)
// as a step outline, with the longest gap and the target marked.
func (f Gaps) Plot(caption Caption) (*Chart, error) {
	if len(f.DurationsS) == 0 {
		return nil, fmt.Errorf("plots: gaps: DurationsS is empty (a run with no gap needs no gap figure)")
	}
	if f.Counts != nil && len(f.Counts) != len(f.DurationsS) {
		return nil, fmt.Errorf("plots: gaps: %d counts for %d durations; give one count per duration, or none", len(f.Counts), len(f.DurationsS))
	}
	for i, d := range f.DurationsS {
		if !finite(d) || d < 0 {
			return nil, fmt.Errorf("plots: gaps: DurationsS[%d] = %g; durations must be finite and ≥ 0", i, d)
		}
		if f.Counts != nil && f.Counts[i] < 1 {
			return nil, fmt.Errorf("plots: gaps: Counts[%d] = %d; a count must be ≥ 1", i, f.Counts[i])
		}
	}
	longest := max(f.LongestS, slices.Max(f.DurationsS))
	edges := gapBins(longest, f.StepS)
	counts := make([]float64, len(edges)-1)
	for k, d := range f.DurationsS {
		i := sort.SearchFloat64s(edges, d) - 1
		counts[max(0, min(i, len(counts)-1))] += float64(f.count(k))
	}
	xlabel := "gap duration (s)"
	if f.StepS > 0 {
		w := edges[1] - edges[0]
		xlabel = fmt.Sprintf("gap duration (s; bins of %.0f s = %.0f × the %.0f s step)", w, w/f.StepS, f.StepS)
	}
	p := newPlot("Sunlit gaps without a valid sun vector", xlabel, "number of gaps")
	step := plotter.XYs{{X: edges[0], Y: 0}}
	top := 0.0
	for i, c := range counts {
		step = append(step, plotter.XY{X: edges[i], Y: c}, plotter.XY{X: edges[i+1], Y: c})
		top = max(top, c)
	}
	step = append(step, plotter.XY{X: edges[len(edges)-1], Y: 0})
	h, err := plotter.NewLine(step)
	if err != nil {
		return nil, fmt.Errorf("plots: gaps: %w", err)
	}
	h.Color, h.Width = colBlue, 2
	h.FillColor = withAlpha(colBlue, 60)
	p.Add(h)
	p.Legend.Add(fmt.Sprintf("%d gaps", f.Number()), h)
	mark := vline{f.LongestS, draw.LineStyle{Color: colVermil, Width: 2, Dashes: []vg.Length{6, 3}}}
	p.Add(mark)
	p.Legend.Add(fmt.Sprintf("longest = %.0f s", f.LongestS), mark)
	if tg := f.Target; tg != nil {
		v := vline{tg.Value, tg.style()}
		p.Add(v)
		p.Legend.Add(tg.text(), v)
	}
	p.X.Min = 0
	p.Y.Min, p.Y.Max = 0, top*1.08
	p.Y.Tick.Marker = integerTicks{}
	rec := []drawnSeries{{0, "longest", plotter.XYs{{X: mark.X}}}}
	for i, c := range counts {
		rec = append(rec, drawnSeries{0, "bin", plotter.XYs{{X: edges[i], Y: c}, {X: edges[i+1], Y: c}}})
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
	// Fails, when set (one row per line, one entry per X), rings the
	// points that miss their target.
	Fails [][]bool
}

// Plot draws the sweep curves with markers at each computed point.
func (f Sweep) Plot(caption Caption) (*Chart, error) {
	p, rec, err := curves("sweep", f.Title, f.XLabel, f.YLabel, f.X, f.Lines)
	if err != nil {
		return nil, err
	}
	addPlainTarget(p, f.Target, f.TargetLabel)
	var failed plotter.XYs
	for k, row := range f.Fails {
		for i, bad := range row {
			if bad && k < len(f.Lines) && i < len(f.X) && i < len(f.Lines[k].Y) && finite(f.Lines[k].Y[i]) {
				failed = append(failed, plotter.XY{X: f.X[i], Y: f.Lines[k].Y[i]})
			}
		}
	}
	if len(failed) > 0 {
		sc, err := plotter.NewScatter(failed)
		if err != nil {
			return nil, fmt.Errorf("plots: sweep: %w", err)
		}
		sc.GlyphStyle = draw.GlyphStyle{Color: colBlack, Radius: 8, Shape: draw.RingGlyph{}}
		p.Add(sc)
		p.Legend.Add(fmt.Sprintf("misses its target (%d points)", len(failed)), sc)
		rec = append(rec, drawnSeries{0, "fails", failed})
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
	// The y axis starts at zero for figures that cannot go negative, so
	// differences are not exaggerated (the legend sits outside the data).
	lo, hi := math.Inf(1), math.Inf(-1)
	for _, ln := range lines {
		for _, v := range ln.Y {
			if !math.IsNaN(v) && !math.IsInf(v, 0) {
				lo, hi = min(lo, v), max(hi, v)
			}
		}
	}
	if lo <= hi {
		r := hi - lo
		if r == 0 {
			r = max(math.Abs(hi), 1)
		}
		p.Y.Min = lo - 0.05*r
		if lo >= 0 {
			p.Y.Min = 0
		}
		p.Y.Max = hi + 0.05*r
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
	b, err := plotter.NewBarChart(vals, vg.Length(min(40, 260/float64(n))))
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

// addTargetLine draws a requirement at y on the y axis as a horizontal line
// in the target style, with label in the legend.
func addTargetLine(p *plot.Plot, y float64, label string) {
	h := hline{y, Target{}.style()}
	p.Add(h)
	p.Legend.Add(label, h)
}

// addPlainTarget draws a requirement given as a value alone (nil: none),
// labelled "target V" unless label is set.
func addPlainTarget(p *plot.Plot, target *float64, label string) {
	if target == nil {
		return
	}
	if label == "" {
		label = fmt.Sprintf("target %g", *target)
	}
	addTargetLine(p, *target, label)
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
	// Target, when set, is the requirement on the figure of merit, drawn
	// as a horizontal line with TargetLabel (default "target V").
	Target      *float64
	TargetLabel string
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
	addPlainTarget(p, f.Target, f.TargetLabel)
	return &Chart{Panels: []*plot.Plot{p}, Caption: caption, drawn: rec}, nil
}
