package review

import (
	"errors"
	"fmt"
	"math"

	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/plots"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// powerFigure is the solar-array power figure (runs with body.panels).
func powerFigure(in *figureInput) (Named, bool, error) {
	pv, ok, err := powerView(in.cfg, in.res)
	if err != nil || !ok {
		return Named{}, false, err
	}
	pv.Target = in.tg.power
	pc := in.cap
	alb := "no albedo on the panels"
	if in.cfg.PanelAlbedo && in.cfg.NewAlbedo != nil {
		alb = "albedo on each panel's front hemisphere (not shaded by the body)"
	}
	pc.Assumptions = "panels fixed to the body in the nominal attitude; cosine law, " + alb + "; " + pc.Assumptions
	c, err := pv.Plot(pc)
	return Named{Title: "Solar-array power: the first orbits and the mean of each whole orbit", Chart: c, Tells: powerTells(in.res, in.tg.power)}, true, err
}

// powerView is the run's power over the timeline's first orbits (the short
// power series the run kept) and the mean power of every whole orbit; ok is
// false without panels.
func powerView(cfg sim.Config, res *sim.Result) (plots.PowerView, bool, error) {
	if res.Power == nil || cfg.Panels == nil {
		return plots.PowerView{}, false, nil
	}
	ser := res.PowerTimeline
	if ser == nil || len(ser.T) < 2 {
		return plots.PowerView{}, false, errors.New("the run kept no short power series (review.Request sets it before the run)")
	}
	// The first orbits, also when a mission timeline has the run keep its
	// whole span.
	span := min(TimelineOrbits*periodOf(cfg), cfg.Duration)
	var v plots.PowerView
	for i, t := range ser.T {
		if t > span {
			break
		}
		v.T, v.W = append(v.T, t), append(v.W, ser.W[i])
	}
	v.Umbra, v.Penumbra = shadowSpans(res.Eclipses, v.T[len(v.T)-1])
	v.OrbitW = append([]float64(nil), res.Power.PerOrbitW...)
	v.MeanW = res.Power.MeanW
	return v, true, nil
}

// shadowSpans cuts the eclipses into umbra and penumbra spans within
// [0, end] s.
func shadowSpans(eclipses []illum.Eclipse, end float64) (umbra, penumbra []plots.Interval) {
	clip := func(a, b float64) (plots.Interval, bool) {
		a, b = max(a, 0), min(b, end)
		return plots.Interval{Start: a, End: b}, b > a
	}
	for _, e := range eclipses {
		if e.PenumbralOnly() {
			if iv, ok := clip(e.PenumbraStart, e.PenumbraEnd); ok {
				penumbra = append(penumbra, iv)
			}
			continue
		}
		for _, p := range [][2]float64{{e.PenumbraStart, e.UmbraStart}, {e.UmbraEnd, e.PenumbraEnd}} {
			if iv, ok := clip(p[0], p[1]); ok {
				penumbra = append(penumbra, iv)
			}
		}
		if iv, ok := clip(e.UmbraStart, e.UmbraEnd); ok {
			umbra = append(umbra, iv)
		}
	}
	return umbra, penumbra
}

// powerTells is the power figure's message with the run's numbers.
func powerTells(res *sim.Result, tg *plots.Target) string {
	p := res.Power
	t := fmt.Sprintf("The array delivers %.1f W on average over the run%s, up to %.1f W", p.MeanW, verdictText(tg), p.PeakW)
	if len(p.PerOrbitW) > 0 {
		lo := math.Inf(1)
		for _, w := range p.PerOrbitW {
			lo = min(lo, w)
		}
		t += fmt.Sprintf("; the worst whole orbit averages %.1f W (%.1f Wh)", lo, p.OrbitWorstWh)
	}
	return t + fmt.Sprintf(". The longest span without power lasts %.0f min. Shaded: umbra (dark) and penumbra (light).", p.LongestNoPowerS/60)
}
