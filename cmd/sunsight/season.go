package main

import (
	"encoding/json"
	"fmt"
	"io"
	"path/filepath"
	"strconv"
	"time"

	"codeberg.org/sunsight/sunsight/internal/atomicfile"
	"codeberg.org/sunsight/sunsight/plots"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/season"
)

func init() {
	register(command{name: "season", summary: "find the worst season of a scenario over a year: lowest valid share, largest p95, longest eclipse; eclipse distributions",
		args: "[flags] FILE",
		about: `Runs the scenario FILE (- reads standard input) as short cases spread over a span
from its epoch (a year by default), refines around the worst case of each criterion
(lowest valid share, largest p95 error, longest eclipse), and reports the worst epochs
with their figures. Over the whole span it computes the eclipse distribution on the
scenario's own propagator, sun and shadow: the shadow time of each orbit (orbit noon to
orbit noon), the share of orbits without eclipse and with more shadow than --eclipse-above,
and a histogram per month. Moving the epoch keeps a sun-synchronous orbit's LTAN, carries
mean elements by the secular J2 rates and a TLE as run does; osculating states and
ephemeris files are refused. The exit status is 3 when a target of the scenario fails at
one of the worst epochs.`,
		examples: []string{"sunsight season examples/nadir-6u-sso.yaml",
			"sunsight season scen.yaml --span 180d --cases 36 --case-duration 12h --plots season-plots --csv season-csv"},
		run: runSeason})
}

func runSeason(args []string, stdout, stderr io.Writer) error {
	fs := newFlagSet("season")
	def := season.DefaultOptions()
	span := scenario.Span(time.Duration(def.SpanS) * time.Second)
	caseDur := scenario.Span(time.Duration(def.CaseS) * time.Second)
	above := scenario.Span(time.Duration(def.EclipseAboveS) * time.Second)
	fs.TextVar(&span, "span", span, "span scanned from the scenario's epoch (`SPAN`, e.g. 365d)")
	fs.TextVar(&caseDur, "case-duration", caseDur, "duration of each case (`SPAN`, e.g. 1d)")
	fs.TextVar(&above, "eclipse-above", above, "stated eclipse duration: the share of orbits with more shadow (`SPAN`)")
	cases := fs.Int("cases", def.Cases, "coarse cases spread over the span (`N`, 2 to 10000)")
	refine := fs.Int("refine", def.Refine, "refined cases on each side of a coarse worst (`N`, 0 to 100)")
	asJSON := fs.Bool("json", false, "print the study as JSON")
	csvDir := fs.String("csv", "", "folder for season_cases.csv and eclipse_months.csv (`DIR`)")
	plotsDir := fs.String("plots", "", "folder for the figures (`DIR`; PNG and SVG)")
	force := fs.Bool("force", false, "replace earlier output folders or a --cpuprofile file")
	quiet := fs.Bool("quiet", false, "no progress on stderr")
	cpuProf := fs.String("cpuprofile", "", cpuProfileUsage)
	fs.pathFlags(false, "csv", "plots", "cpuprofile")
	pos, err := fs.parse(args, stdout)
	if err != nil {
		return err
	}
	if len(pos) != 1 {
		return usagef("want one scenario file; usage: sunsight season [flags] FILE")
	}
	opt := season.Options{SpanS: span.Seconds(), Cases: *cases, CaseS: caseDur.Seconds(), Refine: *refine, EclipseAboveS: above.Seconds()}
	if err := opt.Validate(); err != nil {
		return usageError{err}
	}
	if err := distinctOutputs(output{"--csv", *csvDir}, output{"--plots", *plotsDir}, output{"--cpuprofile", *cpuProf}); err != nil {
		return err
	}
	for _, d := range []string{*csvDir, *plotsDir} {
		if d != "" {
			if err := checkOutputDir(d, *force); err != nil {
				return err
			}
		}
	}
	s, err := loadScenario(pos[0])
	if err != nil {
		return err
	}
	if _, err := season.CaseScenario(s, 0, opt.CaseS); err != nil {
		return usageError{fmt.Errorf("%s: %w", describeFile(pos[0]), err)}
	}
	stopProf, err := startCPUProfile(*cpuProf, force)
	if err != nil {
		return err
	}
	defer stopProf()
	ctx, stop := interruptContext()
	defer stop()
	// The count of cases done, on a terminal only (as run's display).
	show := !*quiet && isTerminal(stderr)
	progress := func(done, total int) {
		if show {
			fmt.Fprintf(stderr, "\rsunsight season: case %d of about %d", done, total)
		}
	}
	r, err := season.Run(ctx, s, opt, progress)
	if show {
		fmt.Fprintln(stderr)
	}
	if err != nil {
		return interrupted(err)
	}
	if *csvDir != "" {
		if err := writeOutputDir(*csvDir, *force, func(dir string) error { return seasonCSV(r, dir) }); err != nil {
			return err
		}
	}
	if *plotsDir != "" {
		if err := writeOutputDir(*plotsDir, *force, func(dir string) error { return seasonFigures(s, r, dir) }); err != nil {
			return err
		}
	}
	verdict := seasonVerdict(r)
	if *asJSON {
		enc := json.NewEncoder(stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(seasonJSON(s, r)); err != nil {
			return err
		}
		return verdict
	}
	writeSeason(stdout, s, r)
	return verdict
}

// seasonVerdict fails when a target of the scenario fails in a worst case.
func seasonVerdict(r *season.Result) error {
	for _, w := range r.Worst {
		if w.Case < 0 {
			continue
		}
		for _, t := range r.Cases[w.Case].Targets {
			if !t.Pass {
				return targetsFailed{what: fmt.Sprintf("%s at the %s epoch %s", t.Label, w.Criterion, r.Cases[w.Case].Epoch.Format(time.RFC3339))}
			}
		}
	}
	return nil
}

func writeSeason(w io.Writer, s *scenario.Scenario, r *season.Result) {
	o := r.Options
	fmt.Fprintf(w, "sunsight season: %s\n", s.Name)
	fmt.Fprintf(w, "  %d cases of %s over %s from %s (%d coarse, the rest refined around each worst)\n", len(r.Cases),
		scenario.Span(time.Duration(o.CaseS)*time.Second), scenario.Span(time.Duration(o.SpanS)*time.Second), s.Epoch.Format(time.RFC3339), o.Cases)
	what := "primary estimator"
	if len(r.Cases) > 0 {
		what = r.Cases[0].Judged.What + " estimate, as the targets judge it"
	}
	fmt.Fprintf(w, "\nWorst epochs (each case's own figures; %s)\n", what)
	fmt.Fprintf(w, "  %-20s %-22s %8s %10s %9s %15s %8s\n", "criterion", "case start (UTC)", "valid", "p95 error", "max gap", "longest eclipse", "targets")
	for _, wc := range r.Worst {
		if wc.Case < 0 {
			fmt.Fprintf(w, "  %-20s undefined in every case\n", wc.Criterion)
			continue
		}
		c := r.Cases[wc.Case]
		met, n := targetsMet(c.Targets)
		tg := "-"
		if n > 0 {
			tg = fmt.Sprintf("%d/%d", met, n)
		}
		fmt.Fprintf(w, "  %-20s %-22s %8s %10s %7.0f s %11.2f min %8s\n", wc.Criterion, c.Epoch.Format(time.RFC3339), pct(c.Judged.ValidFraction),
			deg(c.Judged.P95Deg), c.Judged.LongestGapS, c.Headline.EclipseMaxMin, tg)
	}
	d := r.Eclipse
	fmt.Fprintf(w, "\nEclipses over the span (%d orbits, orbit noon to orbit noon; shadow = penumbra entry to exit)\n", d.Orbits)
	fmt.Fprintf(w, "  orbits without eclipse %s   with more than %s of shadow %s   longest %.2f min (orbit starting %s)\n",
		pct(d.ShareWithout), scenario.Span(time.Duration(d.AboveS)*time.Second), pct(d.ShareAbove), d.LongestS/60, d.LongestAt.Format(time.RFC3339))
	// The bins any month uses, from the first to the last.
	lo, hi := -1, -1
	for _, m := range d.Months {
		for k, c := range m.Counts {
			if c > 0 {
				if lo < 0 || k < lo {
					lo = k
				}
				hi = max(hi, k)
			}
		}
	}
	fmt.Fprintf(w, "  %-8s %7s %10s %9s %9s   orbits with shadow in each %g min bin (min)\n", "month", "orbits", "no eclipse", "> stated", "longest", d.BinS/60)
	if lo >= 0 {
		fmt.Fprintf(w, "  %49s", "")
		for k := lo; k <= hi; k++ {
			fmt.Fprintf(w, " %5s", fmt.Sprintf("%g-%g", float64(k)*d.BinS/60, float64(k+1)*d.BinS/60))
		}
		fmt.Fprintln(w)
	}
	for _, m := range d.Months {
		fmt.Fprintf(w, "  %-8s %7d %10d %9d %5.1f min  ", m.Start.Format("2006-01"), m.Orbits, m.WithoutEclipse, m.Above, m.LongestS/60)
		for k := lo; k >= 0 && k <= hi; k++ {
			fmt.Fprintf(w, " %5d", m.Counts[k])
		}
		fmt.Fprintln(w)
	}
	fmt.Fprintf(w, "  (months by orbit start; the first and last orbit of the span are partial and left out)\n")
	fmt.Fprintf(w, "\nAn analysis aid, not flight verification: flight hardware needs qualified verification.\n")
}

// seasonRecord is the JSON of a worst-season study.
type seasonRecord struct {
	Scenario      string              `json:"scenario"`
	SpanS         num                 `json:"span_s"`
	CaseDurationS num                 `json:"case_duration_s"`
	Cases         []seasonCaseRecord  `json:"cases"`
	Worst         []seasonWorstRecord `json:"worst"`
	Eclipses      eclipseDistRecord   `json:"eclipse_distribution"`
}

type seasonCaseRecord struct {
	StartUTC     string `json:"start_utc"`
	OffsetS      num    `json:"offset_s"`
	Refined      bool   `json:"refined"`
	Valid        num    `json:"valid_fraction"`
	P95          num    `json:"p95_error_deg"`
	LongestGapS  num    `json:"longest_gap_s"`
	EclipseMaxMn num    `json:"eclipse_max_min"`
	TargetsMet   int    `json:"targets_met"`
	Targets      int    `json:"targets"`
}

type seasonWorstRecord struct {
	Criterion string `json:"criterion"`
	StartUTC  string `json:"start_utc,omitempty"`
	Case      int    `json:"case"`
}

type eclipseDistRecord struct {
	Orbits         int                  `json:"orbits"`
	WithoutEclipse num                  `json:"share_without_eclipse"`
	AboveS         num                  `json:"stated_duration_s"`
	Above          num                  `json:"share_above_stated"`
	LongestS       num                  `json:"longest_shadow_s"`
	LongestUTC     string               `json:"longest_orbit_start_utc"`
	BinS           num                  `json:"bin_s"`
	Months         []eclipseMonthRecord `json:"months"`
}

type eclipseMonthRecord struct {
	Month     string `json:"month"`
	Orbits    int    `json:"orbits"`
	Without   int    `json:"orbits_without_eclipse"`
	Above     int    `json:"orbits_above_stated"`
	LongestS  num    `json:"longest_shadow_s"`
	BinCounts []int  `json:"bin_counts"`
}

func seasonJSON(s *scenario.Scenario, r *season.Result) seasonRecord {
	rec := seasonRecord{Scenario: s.Name, SpanS: num(r.Options.SpanS), CaseDurationS: num(r.Options.CaseS), Cases: []seasonCaseRecord{}}
	for _, c := range r.Cases {
		met, n := targetsMet(c.Targets)
		rec.Cases = append(rec.Cases, seasonCaseRecord{c.Epoch.Format(time.RFC3339), num(c.OffsetS), c.Refined, num(c.Judged.ValidFraction),
			num(c.Judged.P95Deg), num(c.Judged.LongestGapS), num(c.Headline.EclipseMaxMin), met, n})
	}
	for _, w := range r.Worst {
		wr := seasonWorstRecord{Criterion: w.Criterion, Case: w.Case}
		if w.Case >= 0 {
			wr.StartUTC = r.Cases[w.Case].Epoch.Format(time.RFC3339)
		}
		rec.Worst = append(rec.Worst, wr)
	}
	d := r.Eclipse
	rec.Eclipses = eclipseDistRecord{Orbits: d.Orbits, WithoutEclipse: num(d.ShareWithout), AboveS: num(d.AboveS), Above: num(d.ShareAbove),
		LongestS: num(d.LongestS), LongestUTC: d.LongestAt.Format(time.RFC3339), BinS: num(d.BinS), Months: []eclipseMonthRecord{}}
	for _, m := range d.Months {
		rec.Eclipses.Months = append(rec.Eclipses.Months, eclipseMonthRecord{m.Start.Format("2006-01"), m.Orbits, m.WithoutEclipse, m.Above, num(m.LongestS), m.Counts})
	}
	return rec
}

func seasonCSV(r *season.Result, dir string) error {
	cases := [][]string{{"start_utc", "offset_s", "refined", "valid_fraction", "p95_error_deg", "longest_gap_s", "eclipse_max_min"}}
	for _, c := range r.Cases {
		cases = append(cases, []string{c.Epoch.Format(time.RFC3339), ff(c.OffsetS, 0), strconv.FormatBool(c.Refined), ff(c.Judged.ValidFraction, 6),
			ff(c.Judged.P95Deg, 4), ff(c.Judged.LongestGapS, 1), ff(c.Headline.EclipseMaxMin, 3)})
	}
	months := [][]string{{"month", "orbits", "orbits_without_eclipse", "orbits_above_stated", "longest_shadow_s", "bin_start_min", "bin_end_min", "orbits_in_bin"}}
	for _, m := range r.Eclipse.Months {
		for k, c := range m.Counts {
			months = append(months, []string{m.Start.Format("2006-01"), strconv.Itoa(m.Orbits), strconv.Itoa(m.WithoutEclipse), strconv.Itoa(m.Above),
				ff(m.LongestS, 1), ff(float64(k)*r.Eclipse.BinS/60, 0), ff(float64(k+1)*r.Eclipse.BinS/60, 0), strconv.Itoa(c)})
		}
	}
	for name, rows := range map[string][][]string{"season_cases.csv": cases, "eclipse_months.csv": months} {
		b, err := csvBytes(rows)
		if err != nil {
			return err
		}
		if err := atomicfile.Write(filepath.Join(dir, name), b); err != nil {
			return err
		}
	}
	return nil
}

func seasonFigures(s *scenario.Scenario, r *season.Result, dir string) error {
	cap := plots.Caption{Scenario: s.Name,
		Model:       fmt.Sprintf("%d cases of %.3g h from %s; eclipses on the scenario's propagator, sun and %s shadow", len(r.Cases), r.Options.CaseS/3600, s.Epoch.Format("2006-01-02"), s.Shadow),
		Assumptions: "each case's own figures, primary estimator; analysis aid, not flight verification"}
	sc := plots.SeasonScan{WorstValid: -1, WorstP95: -1, WorstEclipse: -1}
	for _, c := range r.Cases {
		sc.Day = append(sc.Day, c.OffsetS/86400)
		sc.ValidPct = append(sc.ValidPct, 100*c.Judged.ValidFraction)
		sc.P95Deg = append(sc.P95Deg, c.Judged.P95Deg)
		sc.EclipseMin = append(sc.EclipseMin, c.Headline.EclipseMaxMin)
		sc.Refined = append(sc.Refined, c.Refined)
	}
	sc.WorstValid, sc.WorstP95, sc.WorstEclipse = r.Worst[0].Case, r.Worst[1].Case, r.Worst[2].Case
	charts := map[string]*plots.Chart{}
	c, err := sc.Plot(cap)
	if err != nil {
		return err
	}
	charts["season-scan"] = c
	em := plots.EclipseMonths{BinMin: r.Eclipse.BinS / 60}
	for _, m := range r.Eclipse.Months {
		label := m.Start.Format("Jan")
		if len(em.Months) == 0 || m.Start.Month() == time.January {
			label = m.Start.Format("Jan 06")
		}
		em.Months = append(em.Months, label)
		em.Orbits = append(em.Orbits, m.Orbits)
		em.Without = append(em.Without, m.WithoutEclipse)
		em.Counts = append(em.Counts, m.Counts)
	}
	if len(em.Months) > 0 {
		if c, err = em.Plot(cap); err != nil {
			return err
		}
		charts["eclipse-months"] = c
	}
	for name, c := range charts {
		for _, f := range []string{"png", "svg"} {
			if err := plots.Save(c, filepath.Join(dir, name+"."+f), f); err != nil {
				return err
			}
		}
	}
	return nil
}
