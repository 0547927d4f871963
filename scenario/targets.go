package scenario

import (
	"fmt"
	"math"

	"sunsight/illum/sky"
	"sunsight/scenario/sim"
)

// TargetCheck is one requirement of the scenario's targets judged against a
// run: what was required, what the run gave, and the verdict.
type TargetCheck struct {
	Label    string
	Required string
	Value    string
	Pass     bool
}

// CheckTargets judges the run's headline figures and the layout's sky
// coverage against the scenario's targets. Error targets use the realistic
// p95 (with albedo when an albedo model is set). A figure that is undefined
// (no valid estimate at all) fails its target.
func (s *Scenario) CheckTargets(h sim.Headline, cov sky.Result) []TargetCheck {
	t := s.Targets
	var out []TargetCheck
	pct := func(f float64) string {
		if math.IsNaN(f) {
			return "n/a"
		}
		return fmt.Sprintf("%.1f %%", 100*f)
	}
	if t.MinValidFraction > 0 {
		out = append(out, TargetCheck{Label: "sunlit time with a valid sun vector (" + h.Estimator + ")",
			Required: "≥ " + pct(t.MinValidFraction), Value: pct(h.ValidFraction), Pass: h.ValidFraction >= t.MinValidFraction})
	}
	if t.MaxErrorP95Rad > 0 {
		p95 := h.P95NoAlbedoDeg
		if !math.IsNaN(h.P95AlbedoDeg) {
			p95 = h.P95AlbedoDeg
		}
		lim := t.MaxErrorP95Rad * 180 / math.Pi
		v := "n/a"
		if !math.IsNaN(p95) {
			v = fmt.Sprintf("%.2f°", p95)
		}
		out = append(out, TargetCheck{Label: "p95 sun-vector error (" + h.Estimator + ")",
			Required: fmt.Sprintf("≤ %.2f°", lim), Value: v, Pass: p95 <= lim})
	}
	if t.MinCoverage > 0 && t.CoverageSensors > 0 {
		k := min(t.CoverageSensors, sky.MaxLevel)
		out = append(out, TargetCheck{Label: fmt.Sprintf("sky seen by ≥ %d sensors", k),
			Required: "≥ " + pct(t.MinCoverage), Value: pct(cov.AtLeast[k]), Pass: cov.AtLeast[k] >= t.MinCoverage})
		if t.SurviveOneFailure {
			out = append(out, TargetCheck{Label: fmt.Sprintf("sky seen by ≥ %d sensors, any one failed", k),
				Required: "≥ " + pct(t.MinCoverage), Value: pct(cov.WorstOneFailed[k]), Pass: cov.WorstOneFailed[k] >= t.MinCoverage})
		}
	}
	if t.MaxGap > 0 {
		out = append(out, TargetCheck{Label: "longest sunlit gap without a valid sun vector",
			Required: "≤ " + t.MaxGap.String(), Value: fmt.Sprintf("%.0f s", h.LongestGapS), Pass: h.LongestGapS <= t.MaxGap.Seconds()})
	}
	return out
}
