package plots

import (
	"math"
	"regexp"
	"slices"
	"strconv"
	"testing"

	"gonum.org/v1/plot/vg"
)

// svgText is a text element of an SVG: its left x, baseline y and content.
type svgText struct {
	x, y float64
	s    string
}

var svgTextRe = regexp.MustCompile(`<text x="([-0-9.e]+)" y="([-0-9.e]+)"[^>]*>([^<]*)</text>`)

func svgTexts(svg string) []svgText {
	var out []svgText
	for _, m := range svgTextRe.FindAllStringSubmatch(svg, -1) {
		x, _ := strconv.ParseFloat(m[1], 64)
		y, _ := strconv.ParseFloat(m[2], 64)
		out = append(out, svgText{x, y, m[3]})
	}
	return out
}

// No two tick labels of the error figure's log axes overlap, whatever the
// span of the errors (the mission-6u report printed
// "0.0010.0020.0050.010.02" for errors down to 0.001°), and the 2 and 5
// labels stay where there is room. The widths are the font's own
// (draw.TextStyle.Width of the axis' tick style); the positions are read
// back from the drawn SVG (left edge of each text).
func TestErrorAxisLabelsDoNotOverlap(t *testing.T) {
	for _, c := range []struct {
		lo, hi float64
		want   []string // labels that must be there
	}{
		{0.1, 8, []string{"0.1", "0.2", "0.5", "1", "2", "5", "10"}},
		{0.01, 30, []string{"0.01", "0.1", "1", "10", "5"}},
		{0.001, 15, []string{"0.001", "0.01", "0.1", "1", "10"}},
		{0.0001, 170, []string{"0.0001", "0.001", "0.01", "0.1", "1", "10", "100"}},
		{1e-6, 90, []string{"1", "10"}},
	} {
		var e []float64
		for i := range 200 {
			e = append(e, c.lo*math.Pow(c.hi/c.lo, float64(i)/199))
		}
		ch, err := ErrorDist{Series: []ErrSeries{{Label: "with albedo", ErrorsDeg: e}}}.Plot(Caption{})
		if err != nil {
			t.Fatal(err)
		}
		style := ch.Panels[0].X.Tick.Label
		rows := map[float64][]svgText{}
		for _, tx := range svgTexts(mustSVG(t, ch)) {
			if _, err := strconv.ParseFloat(tx.s, 64); err == nil {
				rows[tx.y] = append(rows[tx.y], tx)
			}
		}
		axes := 0
		for y, row := range rows {
			if len(row) < 4 {
				continue // a y-axis label: one per row
			}
			axes++
			slices.SortFunc(row, func(a, b svgText) int { return int(math.Copysign(1, a.x-b.x)) })
			var labels []string
			for i, tx := range row {
				labels = append(labels, tx.s)
				if i == 0 {
					continue
				}
				prev := row[i-1]
				if end := prev.x + float64(style.Width(prev.s)/vg.Points(1)); end+2 > tx.x {
					t.Errorf("%g…%g°: labels %q (ends at %.1f) and %q (starts at %.1f) touch on the axis at y %.1f",
						c.lo, c.hi, prev.s, end, tx.s, tx.x, y)
				}
			}
			for _, w := range c.want {
				if !slices.Contains(labels, w) {
					t.Errorf("%g…%g°: axis labels %v lack %q", c.lo, c.hi, labels, w)
				}
			}
		}
		if axes != 2 {
			t.Errorf("%g…%g°: found %d labelled x axes, want 2 (CDF and histogram)", c.lo, c.hi, axes)
		}
	}
}
