package properties

import (
	"context"
	"fmt"
	"math"
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/internal/randscenario"
	"codeberg.org/sunsight/sunsight/scenario/budget"
)

// Calibrated residuals each ≤ the stated error ⇒ calibrated error ≤
// as-stated error: on random layouts whose sensors state errors, residuals
// of half the smallest stated value of each source give a p95 (mean over
// the Monte Carlo units) no larger than as stated, within the units'
// sampling spread (5 % and 0.05°), with the albedo source off in both (a
// case valid only with albedo has no such budget and is skipped).
func TestCalibratedNotWorseThanStated(t *testing.T) {
	done := 0
	for i := 0; done < 6 && i < 400; i++ {
		f := drawCase(t, 300+i)
		var minE randscenario.Errors
		first, cosine := true, 0
		for _, s := range f.Body.Sensors {
			if s.Errors == nil {
				continue
			}
			e := *s.Errors
			if s.Kind == "cosine" {
				cosine++
			}
			if first {
				minE, first = e, false
				continue
			}
			minE = randscenario.Errors{DarkOffset1Sigma: math.Min(minE.DarkOffset1Sigma, e.DarkOffset1Sigma), Gain1Sigma: math.Min(minE.Gain1Sigma, e.Gain1Sigma),
				Noise1Sigma: math.Min(minE.Noise1Sigma, e.Noise1Sigma), MisalignmentDeg1Sigma: math.Min(minE.MisalignmentDeg1Sigma, e.MisalignmentDeg1Sigma),
				ApertureOffsetMM1Sigma: math.Min(minE.ApertureOffsetMM1Sigma, e.ApertureOffsetMM1Sigma)}
		}
		if cosine < 3 {
			continue
		}
		half := func(v float64) float64 { return math.Floor(v/2*1e6) / 1e6 }
		f.Budget = &randscenario.Budget{ToleranceDeg: 5, Calibrated: randscenario.Errors{DarkOffset1Sigma: half(minE.DarkOffset1Sigma), Gain1Sigma: half(minE.Gain1Sigma),
			Noise1Sigma: half(minE.Noise1Sigma), MisalignmentDeg1Sigma: half(minE.MisalignmentDeg1Sigma), ApertureOffsetMM1Sigma: half(minE.ApertureOffsetMM1Sigma)}}
		f.MonteCarlo = &randscenario.MonteCarlo{Units: 6}
		done++
		t.Run(fmt.Sprint("case", 300+i), func(t *testing.T) {
			showOnFailure(t, f.YAML())
			b, err := build(f)
			if err != nil {
				t.Fatal(err)
			}
			r, err := budget.NewRunner(b.s, budget.Options{})
			if err != nil {
				t.Fatal(err)
			}
			ctx := context.Background()
			// Calibration acts on the sensors' errors: compare with the albedo
			// source off. With it on, a fixed albedo bias that each unit's
			// random errors partly cancel dominates the p95, and a six-unit
			// mean of it moves by degrees (case 322: 25.2° over 6 units, 30.2°
			// over 40, for a floor of 1.7° without albedo).
			sensorsOnly := budget.All()
			sensorsOnly.Scale[budget.Albedo] = 0
			as, err := r.Run(ctx, sensorsOnly)
			if err != nil && strings.Contains(err.Error(), "no valid sun vector") {
				t.Skipf("valid only with albedo (a false sun), no sensor-only budget: %v", err)
			}
			if err != nil {
				t.Fatal(err)
			}
			cal, err := r.Run(ctx, budget.Case{Scale: sensorsOnly.Scale, Calibrated: true})
			if err != nil {
				t.Fatal(err)
			}
			a, c := as.P95Deg(), cal.P95Deg()
			t.Logf("p95 as stated %.3f°, calibrated %.3f°", a, c)
			if !math.IsNaN(a) && !math.IsNaN(c) && c > a*1.05+0.05 {
				t.Errorf("calibrated p95 %.3f° above the as-stated %.3f°", c, a)
			}
		})
	}
	if done < 6 {
		t.Errorf("only %d random layouts with three cosine sensors stating errors", done)
	}
}
