package review

import (
	"math"
	"strconv"
	"time"

	"codeberg.org/sunsight/sunsight/plots"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// AddPhases adds the mission timeline's table to a report built by Report:
// each phase and slew with its span and its own figures.
func AddPhases(r *plots.Report, s *scenario.Scenario, ph study.Phases) {
	t := plots.Table{Title: "Mission timeline: each phase on its own",
		Header: []string{"Phase", "Start (UTC)", "Duration", "Ended", "Sunlit (%)", "Seen ≥1 (% of sunlit)", "Valid (% of sunlit)", "Longest gap (s)", "p95 albedo (°)"},
		Note: "Each span of the run's step grid simulated on its own (same models, seed and units); ended: the end condition was met " +
			"before the run ended. The plan is made once on the nominal geometry, so every unit flies the same timeline."}
	filt := s.GyroFilter.Set
	if filt {
		t.Header = append(t.Header, "Filter valid (% of phase)", "Filter p95 (°)", "Filter p95 in eclipse (°)")
		t.Note += " Filter: the gyro-aided filter of the whole run over the phase's samples, sunlit and eclipse; it carries its state over from the phases before, as it would in flight."
	}
	for _, p := range ph.Phases {
		h := p.Headline()
		ended := "no"
		switch {
		case p.Span.Met:
			ended = "yes"
		case !p.Span.Slew && s.Timeline.Phases[p.Span.Phase].Until.Kind == scenario.UntilRunEnd:
			ended = "—"
		}
		name := p.Span.Name
		if p.Span.Slew {
			name += " (" + num(p.Span.SlewAngleRad*180/math.Pi, 1) + "°)"
		}
		if n := p.Span.ReturnSlews; n > 0 {
			name += " (" + strconv.Itoa(n) + " slews back after held shadows, up to " + num(p.Span.ReturnSlewMaxRad*180/math.Pi, 1) +
				"° in " + num(p.Span.ReturnSlewMaxS, 0) + " s)"
		}
		p95 := h.P95AlbedoDeg
		if math.IsNaN(p95) {
			p95 = h.P95NoAlbedoDeg
		}
		start := s.Epoch.Add(time.Duration(math.Round(p.Span.Start)) * time.Second).Format("2006-01-02 15:04:05")
		dur := scenario.Span(time.Duration(math.Round(p.Span.End-p.Span.Start)) * time.Second).String()
		row := []string{name, start, dur, ended, pct(h.SunlitFraction), pct(h.Seen1), pct(h.ValidFraction), num(h.LongestGapS, 0), num(p95, 2)}
		if filt {
			row = append(row, pct(h.FilterValidFraction), num(h.FilterP95Deg, 2), num(h.FilterP95ShadowDeg, 2))
		}
		t.Rows = append(t.Rows, row)
	}
	for _, p := range s.Timeline.Phases[ph.Reached:] {
		row := make([]string, len(t.Header))
		row[0], row[1] = p.Name, "not reached"
		t.Rows = append(t.Rows, row)
	}
	r.Tables = append(r.Tables, t)
}
