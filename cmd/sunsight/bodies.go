package main

import (
	"fmt"
	"io"

	"codeberg.org/sunsight/sunsight/scenario/sim"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// writeBodiesInView prints each sensor's shares of time with the Moon and
// with the lit Earth in its field of view, and the share its blinding rule
// dropped.
func writeBodiesInView(w io.Writer, ss []sim.SensorStats) {
	fmt.Fprintf(w, "\nMoon and Earth in the field of view (share of all time)\n  %-14s %12s %18s %10s\n", "sensor", "Moon in view", "lit Earth in view", "blinded")
	for _, s := range ss {
		fmt.Fprintf(w, "  %-14s %12s %18s %10s\n", s.Name, pct(s.MoonInViewFraction), pct(s.LitEarthInViewFraction), pct(s.BlindedFraction))
	}
	fmt.Fprintf(w, "  (Moon: its disc inside half-angle + its radius, not behind the Earth, the mounting face or the body; lit Earth: the Earth's\n")
	fmt.Fprintf(w, "   disc inside the cone while the sub-satellite point is sunlit; a square field of view counts the cone through its corners;\n")
	fmt.Fprintf(w, "   blinded: readings a digital sensor's blinding rule dropped, %s without a rule)\n", study.Missing)
}
