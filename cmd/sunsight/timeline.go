package main

import (
	"fmt"
	"io"
	"math"
	"strconv"
	"time"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// phaseRecord is one entry of the "timeline" array of the JSON record: a
// phase (or the slew into one) with its span and its own figures.
type phaseRecord struct {
	Name      string `json:"phase"`
	Slew      bool   `json:"slew"`
	StartUTC  string `json:"start_utc"`
	StartS    num    `json:"start_s"`
	DurationS num    `json:"duration_s"`
	// EndMet says the phase's end condition was met; false when the run
	// ended first or the phase has none.
	EndMet       bool `json:"end_condition_met"`
	SlewAngleDeg num  `json:"slew_angle_deg"`
	// The slews back onto the phase's law after its held shadow passes.
	ReturnSlews        int `json:"return_slews"`
	ReturnSlewMaxDeg   num `json:"return_slew_max_deg"`
	ReturnSlewLongestS num `json:"return_slew_longest_s"`
	Samples            int `json:"samples"`
	// The figures of the phase's samples (null with fewer than two).
	Sunlit      num `json:"sunlit_fraction"`
	Seen1       num `json:"seen_by_1_fraction"`
	Seen2       num `json:"seen_by_2_fraction"`
	Valid       num `json:"valid_fraction"`
	LongestGapS num `json:"longest_gap_s"`
	P95NoAlbedo num `json:"p95_error_no_albedo_deg"`
	P95Albedo   num `json:"p95_error_albedo_deg"`
	// The gyro-aided filter over the span, running on from the spans
	// before (null without a gyro_filter block).
	FilterValid     num `json:"filter_valid_fraction_of_run"`
	FilterP95       num `json:"filter_p95_error_deg"`
	FilterP95Shadow num `json:"filter_p95_error_in_shadow_deg"`
}

func (o *runOutput) timelineJSON() []phaseRecord {
	if o.phases == nil {
		return nil
	}
	out := []phaseRecord{}
	for _, p := range o.phases.Phases {
		r := phaseRecord{Name: p.Span.Name, Slew: p.Span.Slew, StartUTC: o.utc(p.Span.Start), StartS: num(p.Span.Start),
			DurationS: num(p.Span.End - p.Span.Start), EndMet: p.Span.Met, SlewAngleDeg: num(p.Span.SlewAngleRad * 180 / math.Pi),
			ReturnSlews: p.Span.ReturnSlews, ReturnSlewMaxDeg: num(p.Span.ReturnSlewMaxRad * 180 / math.Pi), ReturnSlewLongestS: num(p.Span.ReturnSlewMaxS),
			Samples: p.Samples}
		h := p.Headline()
		r.Sunlit, r.Seen1, r.Seen2, r.Valid, r.LongestGapS = num(h.SunlitFraction), num(h.Seen1), num(h.Seen2), num(h.ValidFraction), num(h.LongestGapS)
		r.P95NoAlbedo, r.P95Albedo = num(h.P95NoAlbedoDeg), num(h.P95AlbedoDeg)
		r.FilterValid, r.FilterP95, r.FilterP95Shadow = num(h.FilterValidFraction), num(h.FilterP95Deg), num(h.FilterP95ShadowDeg)
		out = append(out, r)
	}
	return out
}

// writeTimeline prints the timeline's phases with their figures.
func (o *runOutput) writeTimeline(w io.Writer) {
	if o.phases == nil {
		return
	}
	fmt.Fprintf(w, "\nMission timeline (%d of %d phases reached; each row is that stretch of the run alone)\n", o.phases.Reached, len(o.s.Timeline.Phases))
	filt := o.s.GyroFilter.Set
	fmt.Fprintf(w, "  %-26s %-20s %9s %5s %8s %8s %8s %10s %9s", "phase", "start (UTC)", "duration", "ended", "sunlit", ">=1", "valid", "p95 error", "max gap")
	if filt {
		fmt.Fprintf(w, " %12s %11s %14s", "filter valid", "filter p95", "filter eclipse")
	}
	fmt.Fprintln(w)
	var slews []string
	for _, p := range o.phases.Phases {
		h := p.Headline()
		p95 := h.P95AlbedoDeg
		if p95 != p95 {
			p95 = h.P95NoAlbedoDeg
		}
		ended := "no"
		switch {
		case p.Span.Met:
			ended = "yes"
		case !p.Span.Slew && o.s.Timeline.Phases[p.Span.Phase].Until.Kind == scenario.UntilRunEnd:
			ended = "-" // the last phase, without an end condition
		}
		name := p.Span.Name
		if p.Span.Slew {
			slews = append(slews, fmt.Sprintf("%s: %.1f° eigen-axis", name, p.Span.SlewAngleRad*180/math.Pi))
		}
		if n := p.Span.ReturnSlews; n > 0 {
			slews = append(slews, fmt.Sprintf("%s: %d slew(s) back onto the law after held shadow passes, up to %.1f° and %.0f s", name, n,
				p.Span.ReturnSlewMaxRad*180/math.Pi, p.Span.ReturnSlewMaxS))
		}
		fmt.Fprintf(w, "  %-26s %-20s %9s %5s %8s %8s %8s %10s %7.0f s", name, o.utc(p.Span.Start)[:19], scenario.Span(time.Duration(math.Round(p.Span.End-p.Span.Start)*1e9)).String(), ended,
			pct(h.SunlitFraction), pct(h.Seen1), pct(h.ValidFraction), deg(p95), h.LongestGapS)
		if filt {
			fmt.Fprintf(w, " %12s %11s %14s", pct(h.FilterValidFraction), deg(h.FilterP95Deg), deg(h.FilterP95ShadowDeg))
		}
		fmt.Fprintln(w)
	}
	for _, ph := range o.s.Timeline.Phases[o.phases.Reached:] {
		fmt.Fprintf(w, "  %-26s not reached: an earlier end condition was not met before the run ended\n", ph.Name)
	}
	for _, sl := range slews {
		fmt.Fprintf(w, "  %s\n", sl)
	}
	fmt.Fprintf(w, "  (ended: the phase's end condition was met, - none set; the whole-run figures above are the whole timeline)\n")
	if filt {
		fmt.Fprintf(w, "  (filter: the gyro-aided filter of the whole run over the phase's samples, sunlit and eclipse, carried over from the phases before)\n")
	}
}

// timelineCSV is timeline.csv: one row per phase span (nil without a
// timeline).
func (o *runOutput) timelineCSV() [][]string {
	if o.phases == nil {
		return nil
	}
	rows := [][]string{{"phase", "slew", "start_utc", "start_s", "duration_s", "end_condition_met", "slew_angle_deg",
		"return_slews", "return_slew_max_deg", "return_slew_longest_s", "samples",
		"sunlit_fraction", "seen_by_1_fraction", "seen_by_2_fraction", "valid_fraction", "longest_gap_s", "p95_error_no_albedo_deg", "p95_error_albedo_deg",
		"filter_valid_fraction_of_run", "filter_p95_error_deg", "filter_p95_error_in_shadow_deg"}}
	for _, p := range o.phases.Phases {
		h := p.Headline()
		rows = append(rows, []string{p.Span.Name, strconv.FormatBool(p.Span.Slew), o.utc(p.Span.Start), ff(p.Span.Start, 3), ff(p.Span.End-p.Span.Start, 3),
			strconv.FormatBool(p.Span.Met), ff(p.Span.SlewAngleRad*180/math.Pi, 4),
			strconv.Itoa(p.Span.ReturnSlews), ff(p.Span.ReturnSlewMaxRad*180/math.Pi, 4), ff(p.Span.ReturnSlewMaxS, 3), strconv.Itoa(p.Samples),
			ff(h.SunlitFraction, 6), ff(h.Seen1, 6), ff(h.Seen2, 6), ff(h.ValidFraction, 6), ff(h.LongestGapS, 1), ff(h.P95NoAlbedoDeg, 4), ff(h.P95AlbedoDeg, 4),
			ff(h.FilterValidFraction, 6), ff(h.FilterP95Deg, 4), ff(h.FilterP95ShadowDeg, 4)})
	}
	return rows
}

// writePlannedTimeline prints the planned phase spans (check), as YAML
// comments.
func writePlannedTimeline(w io.Writer, plan *study.Plan) {
	tl := study.TimelineOf(plan.Primary)
	if tl == nil {
		return
	}
	fmt.Fprintf(w, "# planned timeline (nominal geometry, the same for every unit): %d of %d phases reached\n", tl.Reached, tl.Phases)
	for _, sp := range tl.Spans {
		met := "end condition met"
		if !sp.Met {
			met = "runs to the end of the run"
		}
		fmt.Fprintf(w, "#   %-26s %10.1f s → %10.1f s  %s\n", sp.Name, sp.Start, sp.End, met)
	}
}
