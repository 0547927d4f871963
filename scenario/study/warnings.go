package study

import (
	"fmt"
	"math"
	"time"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// MaxTLEAgeDays is the largest gap between a TLE's epoch and any time of
// the run before a warning. The TLE's mean elements are carried with the
// secular J2 rates only (no drag, no SGP4 theory), and a LEO element set's
// along-track error grows by roughly 1–3 km per day even with SGP4 (Vallado
// et al. 2006, AIAA 2006-6753, from memory); past two weeks the orbit's
// phase, and so the eclipse times, are no longer known to minutes (common
// practice, no source). Fractions and eclipse durations are affected much
// less than times.
const MaxTLEAgeDays = 14

// Warnings returns what a user should know before trusting a run of s:
// epochs outside the sun model's stated validity, a TLE older than
// MaxTLEAgeDays, and a run shorter than one orbit (res, when not nil, adds
// how many eclipses the run's ends cut). Each is one sentence.
func Warnings(s *scenario.Scenario, res *sim.Result) []string {
	var out []string
	end := s.Epoch.Add(time.Duration(s.Duration.Seconds() * float64(time.Second)))
	if first, last, ok := ephem.SunModelValidity(s.SunModel); ok {
		if s.Epoch.Year() < first || end.Year() > last {
			out = append(out, fmt.Sprintf("the run (%d to %d) leaves %d–%d, where the %s sun model's stated accuracy (0.01°) holds; its error grows outside that span",
				s.Epoch.Year(), end.Year(), first, last, s.SunModel))
		}
	}
	if t := s.Orbit.TLE; s.Orbit.Kind == scenario.OrbitTLE && t != nil {
		age := math.Max(math.Abs(s.Epoch.Sub(t.Epoch).Hours()), math.Abs(end.Sub(t.Epoch).Hours())) / 24
		if age > MaxTLEAgeDays {
			out = append(out, fmt.Sprintf("the TLE's epoch %s is %.0f days from the run (more than %d): its elements are carried with secular J2 only, so the orbit's phase and the eclipse times are uncertain by minutes or more; use a TLE near the run",
				t.Epoch.Format(time.RFC3339), age, MaxTLEAgeDays))
		}
	}
	if el, err := MeanElements(s); err == nil {
		if T := orbit.Period(el.SemiMajorAxisKm); s.Duration.Seconds() < T {
			msg := fmt.Sprintf("the run (%s) is shorter than one orbit (%.1f min): eclipses are cut by the run's ends, and eclipse means and maxima count complete eclipses only", s.Duration, T/60)
			if res != nil && res.EclipseStats.Count > 0 {
				msg += fmt.Sprintf(" (%d of %d eclipses here are cut)", res.EclipseStats.Count-res.EclipseStats.Complete, res.EclipseStats.Count)
			}
			out = append(out, msg)
		}
	}
	return append(out, filterWarnings(res)...)
}
