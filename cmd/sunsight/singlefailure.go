package main

import (
	"fmt"
	"io"
	"sort"
	"strconv"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// addSingleFailure adds the single-failure study (targets.n_minus_1) to the
// output: its table, its JSON record and its targets, judged with the rest.
func (o *runOutput) addSingleFailure(sf study.SingleFailure) {
	o.assessed = o.assessed.WithSingleFailure(o.s, sf)
	o.targets = o.assessed.Targets
}

// singleFailureRecord is the "single_failure" object of the JSON record.
type singleFailureRecord struct {
	Estimator   string               `json:"estimator"`
	WorstSensor string               `json:"worst_sensor"`
	Failed      []failedSensorRecord `json:"failed"`
	// WorstPair and FailedPairs are set with n_minus_1.also_pairs.
	WorstPair   []string           `json:"worst_pair,omitempty"`
	FailedPairs []failedPairRecord `json:"failed_pairs,omitempty"`
}

type failedPairRecord struct {
	Sensors []string `json:"failed_sensors"`
	failedFigures
}

type failedSensorRecord struct {
	Sensor string `json:"failed_sensor"`
	failedFigures
}

// failedFigures are a failed layout's figures: uncorrected, then after the
// on-board albedo correction (null without albedo.onboard), then the
// gyro-aided filter on the sensors left (null without gyro_filter).
type failedFigures struct {
	Valid          num `json:"valid_fraction"`
	LongestGapS    num `json:"longest_gap_s"`
	P95NoAlbedo    num `json:"p95_error_no_albedo_deg"`
	P95Albedo      num `json:"p95_error_albedo_deg"`
	ValidCorrected num `json:"valid_fraction_onboard_corrected"`
	GapCorrectedS  num `json:"longest_gap_onboard_corrected_s"`
	P95Corrected   num `json:"p95_error_onboard_corrected_deg"`
	FilterValid    num `json:"filter_valid_fraction_of_run"`
	FilterP95      num `json:"filter_p95_error_deg"`
	FilterP95Shade num `json:"filter_p95_error_in_shadow_deg"`
}

func figuresOf(h sim.Headline) failedFigures {
	return failedFigures{num(h.ValidFraction), num(h.LongestGapS), num(h.P95NoAlbedoDeg), num(h.P95AlbedoDeg),
		num(h.ValidFractionCorrected), num(h.LongestGapCorrectedS), num(h.P95CorrectedDeg),
		num(h.FilterValidFraction), num(h.FilterP95Deg), num(h.FilterP95ShadowDeg)}
}

func (o *runOutput) singleFailureJSON() *singleFailureRecord {
	sf := o.assessed.SingleFailure
	if sf == nil || len(sf.Rows) == 0 {
		return nil
	}
	r := &singleFailureRecord{Estimator: sf.Rows[0].Headline.Estimator, WorstSensor: sf.Rows[sf.Worst].Sensor, Failed: []failedSensorRecord{}}
	for _, f := range sf.Rows {
		r.Failed = append(r.Failed, failedSensorRecord{f.Sensor, figuresOf(f.Headline)})
	}
	if sf.WorstPair >= 0 {
		r.WorstPair = sf.Pairs[sf.WorstPair].Failed
		for _, f := range sf.Pairs {
			r.FailedPairs = append(r.FailedPairs, failedPairRecord{f.Failed, figuresOf(f.Headline)})
		}
	}
	return r
}

// writeSingleFailure prints the single-failure table: the unfailed run,
// then each sensor failed in turn, the worst marked; with an on-board
// albedo model the corrected figures too.
func (o *runOutput) writeSingleFailure(w io.Writer) {
	sf := o.assessed.SingleFailure
	if sf == nil || len(sf.Rows) == 0 {
		return
	}
	h := o.res.Headline()
	corr := o.s.Albedo.Onboard != nil
	filt := o.s.GyroFilter.Set
	fmt.Fprintf(w, "\nSingle failure over time (%s estimator, primary attitude; each sensor failed in turn)\n", h.Estimator)
	fmt.Fprintf(w, "  %-28s %8s %9s %13s %11s", "failed sensor", "valid", "max gap", "p95 no albedo", "p95 albedo")
	if corr {
		fmt.Fprintf(w, " %10s %9s %9s", "valid corr", "gap corr", "p95 corr")
	}
	if filt {
		fmt.Fprintf(w, " %12s %11s %14s", "filter valid", "filter p95", "filter eclipse")
	}
	fmt.Fprintln(w)
	row := func(name string, g sim.Headline) {
		fmt.Fprintf(w, "  %-28s %8s %7.0f s %13s %11s", name, pct(g.ValidFraction), g.LongestGapS, deg(g.P95NoAlbedoDeg), deg(g.P95AlbedoDeg))
		if corr {
			fmt.Fprintf(w, " %10s %7.0f s %9s", pct(g.ValidFractionCorrected), g.LongestGapCorrectedS, deg(g.P95CorrectedDeg))
		}
		if filt {
			fmt.Fprintf(w, " %12s %11s %14s", pct(g.FilterValidFraction), deg(g.FilterP95Deg), deg(g.FilterP95ShadowDeg))
		}
		fmt.Fprintln(w)
	}
	row("none", h)
	for i, f := range sf.Rows {
		name := f.Sensor
		if i == sf.Worst {
			name += " (worst)"
		}
		row(name, f.Headline)
	}
	if sf.WorstPair >= 0 {
		// The pairs, worst first: the first few only (all in the JSON record).
		order := make([]int, len(sf.Pairs))
		for i := range order {
			order[i] = i
		}
		sort.SliceStable(order, func(a, b int) bool { return study.WorseFailure(o.s, sf.Pairs[order[a]], sf.Pairs[order[b]]) })
		n := min(len(order), maxPairRows)
		fmt.Fprintf(w, "  pairs failed together, worst %d of %d:\n", n, len(order))
		for _, i := range order[:n] {
			row(sf.Pairs[i].Sensor, sf.Pairs[i].Headline)
		}
	}
	fmt.Fprintf(w, "  (worst: lowest valid share, then largest p95, then longest gap, on the %s estimate the targets judge;\n", judgeWord(o.s))
	note := "   a failed sensor is removed from the layout"
	if corr {
		note += "; corr: after the on-board albedo correction"
	}
	if filt {
		note += ";\n   filter: the gyro-aided filter on the sensors left, whole run: valid share of the run, p95 over the run and in eclipse"
	}
	fmt.Fprintf(w, "%s)\n", note)
}

// judgeWord names the estimate the targets judge, for table notes.
func judgeWord(s *scenario.Scenario) string {
	if s.Targets.Judge == scenario.JudgeOnboardCorrected {
		return "on-board corrected"
	}
	return "uncorrected"
}

// maxPairRows bounds the pairs the summary prints.
const maxPairRows = 5

// singleFailureCSV is single_failure.csv: one row per failed sensor, then
// per failed pair, the worst of each marked (nil without the study).
func (o *runOutput) singleFailureCSV() [][]string {
	sf := o.assessed.SingleFailure
	if sf == nil {
		return nil
	}
	rows := [][]string{{"failed_sensor", "pair", "worst", "valid_fraction", "longest_gap_s", "p95_error_no_albedo_deg", "p95_error_albedo_deg",
		"valid_fraction_onboard_corrected", "longest_gap_onboard_corrected_s", "p95_error_onboard_corrected_deg",
		"filter_valid_fraction_of_run", "filter_p95_error_deg", "filter_p95_error_in_shadow_deg"}}
	add := func(fs []study.FailedSensor, worst int, pair bool) {
		for i, f := range fs {
			h := f.Headline
			rows = append(rows, []string{f.Sensor, strconv.FormatBool(pair), strconv.FormatBool(i == worst), ff(h.ValidFraction, 6),
				ff(h.LongestGapS, 1), ff(h.P95NoAlbedoDeg, 4), ff(h.P95AlbedoDeg, 4),
				ff(h.ValidFractionCorrected, 6), ff(h.LongestGapCorrectedS, 1), ff(h.P95CorrectedDeg, 4),
				ff(h.FilterValidFraction, 6), ff(h.FilterP95Deg, 4), ff(h.FilterP95ShadowDeg, 4)})
		}
	}
	add(sf.Rows, sf.Worst, false)
	add(sf.Pairs, sf.WorstPair, true)
	return rows
}
