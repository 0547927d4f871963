package plots

import (
	"math"
	"testing"
)

// The scan figure has a panel per criterion with the worst marked; the
// month figure stacks each month's orbits to 100 %.
func TestSeasonFigures(t *testing.T) {
	f := SeasonScan{Day: []float64{0, 30, 35, 60}, ValidPct: []float64{99, 97, 98, 99}, P95Deg: []float64{2, math.NaN(), 3, 2.5},
		EclipseMin: []float64{30, 34, 35, 33}, Refined: []bool{false, false, true, false}, WorstValid: 1, WorstP95: 2, WorstEclipse: 2}
	c, err := f.Plot(Caption{})
	if err != nil {
		t.Fatal(err)
	}
	if len(c.Panels) != 3 {
		t.Fatalf("%d panels, want 3", len(c.Panels))
	}
	wantText(t, mustSVG(t, c), "worst: day 30.0", "worst: day 35.0", "refined case", "days since the start of the scan")
	m := EclipseMonths{Months: []string{"Jan 27", "Feb"}, BinMin: 2, Orbits: []int{10, 4}, Without: []int{2, 4}, Counts: [][]int{{3, 5}, {0, 0}}}
	c, err = m.Plot(Caption{})
	if err != nil {
		t.Fatal(err)
	}
	wantText(t, mustSVG(t, c), "no eclipse", "0–2 min", "2–4 min", "Jan 27")
	// Stacked shares add to 100 % in each month.
	for month := range 2 {
		sum := 0.0
		for _, d := range c.drawn {
			sum += d.XYs[month].Y
		}
		if math.Abs(sum-100) > 1e-9 {
			t.Errorf("month %d stacks to %g %%", month, sum)
		}
	}
	if _, err := (EclipseMonths{}).Plot(Caption{}); err == nil {
		t.Error("an empty month figure was drawn")
	}
}
