package main

import (
	"fmt"
	"io"
	"strconv"

	"codeberg.org/sunsight/sunsight/scenario/sim"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// modeOutput is one named mode's run: its headline figures and its targets
// (the scenario's targets judged on the mode; sky coverage is the layout's
// and does not depend on the attitude).
type modeOutput struct {
	name    string
	h       sim.Headline
	targets []study.TargetCheck
}

// addMode adds a mode's run to the output.
func (o *runOutput) addMode(name string, cfg *sim.Config, res *sim.Result) {
	a := o.assessed.Mode(o.s, res)
	o.modes = append(o.modes, modeOutput{name: name, h: a.Headline, targets: a.Targets})
}

// allTargets is every target judged: the primary attitude's, then each
// mode's (labelled with the mode), as the layout search requires them all.
// The run's verdict and exit status come from this list.
func (o *runOutput) allTargets() []study.TargetCheck {
	all := append([]study.TargetCheck(nil), o.targets...)
	for _, m := range o.modes {
		for _, t := range m.targets {
			t.Label = "mode " + m.name + ": " + t.Label
			all = append(all, t)
		}
	}
	return all
}

// modeRows returns the primary attitude then each mode.
func (o *runOutput) modeRows() []modeOutput {
	rows := []modeOutput{{name: "primary (" + o.s.Attitude.Name + ")", h: o.res.Headline(), targets: o.targets}}
	return append(rows, o.modes...)
}

func targetsMet(ts []study.TargetCheck) (met, n int) {
	for _, t := range ts {
		if t.Pass {
			met++
		}
	}
	return met, len(ts)
}

// writeModes prints the modes side by side, the primary attitude first.
func (o *runOutput) writeModes(w io.Writer) {
	if len(o.modes) == 0 {
		return
	}
	filt := o.s.GyroFilter.Set
	fmt.Fprintf(w, "\nModes side by side (same orbit, sensors and estimators; primary first)\n")
	fmt.Fprintf(w, "  %-24s %8s %8s %8s %8s %10s %9s %8s", "attitude", "sunlit", ">=1", ">=2", "valid", "p95 error", "max gap", "targets")
	if filt {
		fmt.Fprintf(w, " %12s %11s %14s", "filter valid", "filter p95", "filter eclipse")
	}
	fmt.Fprintln(w)
	for _, m := range o.modeRows() {
		p95 := m.h.P95AlbedoDeg
		if p95 != p95 { // NaN: no albedo model
			p95 = m.h.P95NoAlbedoDeg
		}
		met, n := targetsMet(m.targets)
		tg := "-"
		if n > 0 {
			tg = fmt.Sprintf("%d/%d", met, n)
		}
		fmt.Fprintf(w, "  %-24s %8s %8s %8s %8s %10s %7.0f s %8s", m.name, pct(m.h.SunlitFraction), pct(m.h.Seen1), pct(m.h.Seen2),
			pct(m.h.ValidFraction), deg(p95), m.h.LongestGapS, tg)
		if filt {
			fmt.Fprintf(w, " %12s %11s %14s", pct(m.h.FilterValidFraction), deg(m.h.FilterP95Deg), deg(m.h.FilterP95ShadowDeg))
		}
		fmt.Fprintln(w)
	}
	if filt {
		fmt.Fprintf(w, "  (filter: the gyro-aided filter in that attitude, valid share of the whole run, p95 error over the run and in eclipse)\n")
	}
	for _, m := range o.modes {
		for _, t := range m.targets {
			if !t.Pass {
				fmt.Fprintf(w, "  FAIL in mode %s: %s required %s got %s\n", m.name, t.Label, t.Required, t.Value)
			}
		}
	}
}

// modesJSON is the "modes" list of the JSON record, primary first.
func (o *runOutput) modesJSON() []modeRecord {
	var out []modeRecord
	for i, m := range o.modeRows() {
		name := m.name
		if i == 0 {
			name = "primary"
		}
		out = append(out, modeRecord{Mode: name, Primary: i == 0, Headline: headlineRecord{m.h}, Targets: study.Records(m.targets)})
	}
	return out
}

// modesCSV is modes.csv: one row per attitude, primary first.
func (o *runOutput) modesCSV() [][]string {
	rows := [][]string{{"mode", "primary", "sunlit_fraction", "seen_by_1_fraction", "seen_by_2_fraction", "seen_by_3_fraction", "valid_fraction",
		"p95_error_no_albedo_deg", "p95_error_albedo_deg", "longest_gap_s", "targets_met_count", "targets_stated_count",
		"filter_valid_fraction_of_run", "filter_p95_error_deg", "filter_p95_error_in_shadow_deg"}}
	for i, m := range o.modeRows() {
		name := m.name
		if i == 0 {
			name = "primary"
		}
		met, n := targetsMet(m.targets)
		rows = append(rows, []string{name, strconv.FormatBool(i == 0), ff(m.h.SunlitFraction, 6), ff(m.h.Seen1, 6), ff(m.h.Seen2, 6), ff(m.h.Seen3, 6),
			ff(m.h.ValidFraction, 6), ff(m.h.P95NoAlbedoDeg, 4), ff(m.h.P95AlbedoDeg, 4), ff(m.h.LongestGapS, 1), strconv.Itoa(met), strconv.Itoa(n),
			ff(m.h.FilterValidFraction, 6), ff(m.h.FilterP95Deg, 4), ff(m.h.FilterP95ShadowDeg, 4)})
	}
	return rows
}
