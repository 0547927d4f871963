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

// MinSamplesPerOrbit is the fewest steps per orbital period before a
// warning: at 30 a step is 12° of orbit, about 3 min in LEO, a tenth of an
// eclipse, and the time shares, gaps and percentiles of the step loop move
// by several per cent with the phase of the samples (common practice, no
// source). The eclipse list comes from an event search to 1 ms and does not
// depend on the step.
const MinSamplesPerOrbit = 30

// Warnings returns what a user should know before trusting a run of s:
// epochs outside the sun model's stated validity, a TLE older than
// MaxTLEAgeDays, a run shorter than one orbit (res, when not nil, adds
// how many eclipses the run's ends cut) and a step too long for the orbit
// (MinSamplesPerOrbit). Each is one sentence.
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
		age := max(math.Abs(s.Epoch.Sub(t.Epoch).Hours()), math.Abs(end.Sub(t.Epoch).Hours())) / 24
		if age > MaxTLEAgeDays {
			out = append(out, fmt.Sprintf("the TLE's epoch %s is %.0f days from the run (more than %d): its elements are carried with secular J2 only, so the orbit's phase and the eclipse times are uncertain by minutes or more; use a TLE near the run",
				t.Epoch.Format(time.RFC3339), age, MaxTLEAgeDays))
		}
	}
	if el, err := MeanElements(s); err == nil {
		T := orbit.Period(el.SemiMajorAxisKm)
		if s.Duration.Seconds() < T {
			msg := fmt.Sprintf("the run (%s) is shorter than one orbit (%.1f min): eclipses are cut by the run's ends, and eclipse means and maxima count complete eclipses only", s.Duration, T/60)
			if res != nil && res.EclipseStats.Count > 0 {
				msg += fmt.Sprintf(" (%d of %d eclipses here are cut)", res.EclipseStats.Count-res.EclipseStats.Complete, res.EclipseStats.Count)
			}
			out = append(out, msg)
		}
		if s.Step.Seconds() > T/MinSamplesPerOrbit {
			out = append(out, fmt.Sprintf("the step (%s) samples each orbit (%.1f min) at fewer than %d points: the time shares, gaps and error percentiles are coarse and depend on where the samples fall (the eclipse list does not: it comes from an event search); use a step of at most %.0f s",
				s.Step, T/60, MinSamplesPerOrbit, math.Floor(T/MinSamplesPerOrbit)))
		}
	}
	return append(out, filterWarnings(res)...)
}
