package plots

import (
	"fmt"
	"image/color"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg/draw"
)

// PhaseSpan is one span of a mission timeline on a Timeline figure: a
// phase, or the slew into one, in seconds since the epoch.
type PhaseSpan struct {
	Name       string
	Start, End float64
	Slew       bool
}

// phaseFills alternate between successive phases; slews are grey.
var phaseFills = []color.Color{withAlpha(colSky, 110), withAlpha(colOrange, 110), withAlpha(colGreen, 90), withAlpha(colPurple, 90), withAlpha(colVermil, 80)}

// phasePanel draws the mission phases as named bars over the time axis
// (x already divided by div) and returns the boundaries between them.
func phasePanel(spans []PhaseSpan, div, x0, x1 float64) (*plot.Plot, []float64, error) {
	p := newPlot("Mission phases (slews grey)", "", "")
	p.X.Min, p.X.Max = x0, x1
	p.X.Tick.Marker = niceTicks{}
	p.Y.Min, p.Y.Max = 0, 1
	p.Y.Tick.Marker = plot.ConstantTicks(nil)
	var cuts []float64
	var lab plotter.XYLabels
	k := 0
	for i, s := range spans {
		a, b := s.Start/div, s.End/div
		fill := color.Color(colPenumbra)
		if !s.Slew {
			fill = phaseFills[k%len(phaseFills)]
			k++
		}
		p.Add(bands{[]Interval{{a, b}}, fill})
		if !s.Slew {
			p.Legend.Add(s.Name, swatch{fill})
		}
		if i > 0 {
			cuts = append(cuts, a)
		}
		// A name is written where its bar is wide enough to hold it.
		if !s.Slew && (b-a) > 0.08*(x1-x0) {
			lab.XYs = append(lab.XYs, plotter.XY{X: (a + b) / 2, Y: 0.5})
			lab.Labels = append(lab.Labels, s.Name)
		}
	}
	if len(lab.XYs) > 0 {
		l, err := plotter.NewLabels(lab)
		if err != nil {
			return nil, nil, fmt.Errorf("plots: timeline phases: %w", err)
		}
		for i := range l.TextStyle {
			l.TextStyle[i].XAlign, l.TextStyle[i].YAlign = draw.XCenter, draw.YCenter
			l.TextStyle[i].Font.Size = 11
		}
		p.Add(l)
	}
	return p, cuts, nil
}
