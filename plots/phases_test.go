package plots

import (
	"strings"
	"testing"
)

// A timeline with mission phases gets a phase band on top: one bar per
// span, the phases named in the legend (and in the bar where it is wide
// enough), slews unnamed, and the data panels move down by one.
func TestTimelinePhaseBand(t *testing.T) {
	f := Timeline{
		T:             []float64{0, 600, 1200, 1800, 2400, 3000, 3600},
		SensorsSeeing: []int{2, 3, 2, 1, 1, 2, 2},
		Valid:         []bool{true, true, true, false, true, true, true},
		Phases: []PhaseSpan{{Name: "deployment", Start: 0, End: 1500}, {Name: "slew to sun", Start: 1500, End: 1600, Slew: true},
			{Name: "sun hold", Start: 1600, End: 3600}},
	}
	c, err := f.Plot(Caption{})
	if err != nil {
		t.Fatal(err)
	}
	if len(c.Panels) != 3 {
		t.Fatalf("%d panels, want the phase band and two data panels", len(c.Panels))
	}
	svg := mustSVG(t, c)
	wantText(t, svg, "Mission phases (slews grey)", "deployment", "sun hold", "Sensors seeing the sun")
	if strings.Contains(svg, "slew to sun") {
		t.Error("the slew is named on the band; slews are the grey bars")
	}
	if c.drawn[0].Panel != 1 {
		t.Errorf("sensors drawn on panel %d, want 1 (below the phases)", c.drawn[0].Panel)
	}
}
