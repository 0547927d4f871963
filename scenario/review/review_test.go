package review

import (
	"bytes"
	"codeberg.org/sunsight/sunsight/scenario/study"
	"context"
	"flag"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"codeberg.org/sunsight/sunsight/illum/sky"
	"codeberg.org/sunsight/sunsight/plots"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// -render DIR writes the PNGs and report of every bundled example (one day
// each) into DIR for a look by eye.
var renderDir = flag.String("render", "", "write every example's figures and report into this folder")

// shortRun loads a bundled example and runs it for the given span.
func shortRun(t *testing.T, name string, span time.Duration, units int) (*scenario.Scenario, sim.Config, *sim.Result) {
	t.Helper()
	s, err := scenario.Load(filepath.Join("..", "..", "examples", name))
	if err != nil {
		t.Fatal(err)
	}
	s.Duration = scenario.Span(span)
	cfg, err := study.Config(s)
	if err != nil {
		t.Fatal(err)
	}
	cfg.Units = units
	if err := Request(s, &cfg, s.Output.Figures); err != nil {
		t.Fatal(err)
	}
	res, err := sim.Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	return s, cfg, res
}

func rowByPrefix(t *testing.T, rows []plots.HeadlineRow, prefix string) plots.HeadlineRow {
	t.Helper()
	for _, r := range rows {
		if strings.HasPrefix(r.Label, prefix) {
			return r
		}
	}
	t.Fatalf("no headline row starting %q", prefix)
	return plots.HeadlineRow{}
}

func TestFiguresAndReportNadir(t *testing.T) {
	s, cfg, res := shortRun(t, "nadir-6u-sso.yaml", 4*time.Hour, 3)
	figs, err := Figures(s, cfg, res, s.Output.Figures)
	if err != nil {
		t.Fatal(err)
	}
	want := []string{FigSky, FigTimeline, FigYear, FigError}
	if res.Nominal.Estimators[0].NumGaps > 0 {
		want = append(want, FigGaps)
	}
	var got []string
	for _, f := range figs {
		got = append(got, f.Name)
		for _, format := range []string{"png", "svg"} {
			b, err := f.Chart.Encode(format)
			if err != nil || len(b) < 1000 {
				t.Errorf("%s.%s: %d bytes, %v", f.Name, format, len(b), err)
			}
		}
		if !strings.Contains(f.Chart.Caption.Scenario, s.Name) {
			t.Errorf("%s: caption %q does not name the scenario", f.Name, f.Chart.Caption.Scenario)
		}
	}
	if strings.Join(got, ",") != strings.Join(want, ",") {
		t.Errorf("figures %v, want %v", got, want)
	}

	rep, err := Report(s, cfg, res, figs, Provenance{Input: "test.yaml", Version: "test"})
	if err != nil {
		t.Fatal(err)
	}
	if len(rep.Figures) != len(figs) || len(rep.Mounts) != cfg.Array.Len() {
		t.Errorf("report has %d figures and %d mounts, want %d and %d", len(rep.Figures), len(rep.Mounts), len(figs), cfg.Array.Len())
	}
	// The headline rows hold the run's own numbers.
	e := res.Nominal.Estimators[0]
	if r := rowByPrefix(t, rep.Headline, "Valid sun vector"); r.Value != pct(e.ValidFraction) {
		t.Errorf("valid row %q, want %q", r.Value, pct(e.ValidFraction))
	}
	if r := rowByPrefix(t, rep.Headline, "Sun-vector error p95 (with albedo)"); r.Value != num(e.ErrAlbedo.P95Deg, 2) {
		t.Errorf("p95 row %q, want %q", r.Value, num(e.ErrAlbedo.P95Deg, 2))
	}
	if r := rowByPrefix(t, rep.Headline, "Sun in view of ≥ 2"); r.Value != pct(res.Nominal.SeenAtLeast[2]) {
		t.Errorf("seen-by-2 row %q, want %q", r.Value, pct(res.Nominal.SeenAtLeast[2]))
	}
	if r := rowByPrefix(t, rep.Headline, "Longest sunlit gap"); r.Value != num(e.LongestGapS, 0) {
		t.Errorf("gap row %q, want %q", r.Value, num(e.LongestGapS, 0))
	}
	var html bytes.Buffer
	if err := plots.WriteReport(&html, rep); err != nil {
		t.Fatal(err)
	}
	for _, w := range []string{s.Name, "not flight verification", "Montenbruck", "Bhanderi", "<svg"} {
		if !strings.Contains(html.String(), w) {
			t.Errorf("report lacks %q", w)
		}
	}
}

// Pass/fail follows the targets: each target is set just beyond and just
// short of the run's value and the verdict must flip.
func TestVerdictsFollowTargets(t *testing.T) {
	s, cfg, res := shortRun(t, "nadir-6u-sso.yaml", 3*time.Hour, 1)
	e := res.Nominal.Estimators[0]
	p95 := e.ErrAlbedo.P95Deg * 3.141592653589793 / 180
	// Coverage verdicts depend on the viewers only: three face sensors
	// leave part of the sphere unseen, so both verdicts can occur.
	cfg3, err := study.ConfigFor(s, s.Body.Sensors[:3], s.Attitude)
	if err != nil {
		t.Fatal(err)
	}
	lat, err := sky.Fibonacci(sky.DefaultPoints)
	if err != nil {
		t.Fatal(err)
	}
	cov, err := sky.Coverage(cfg3.Viewers, lat)
	if err != nil {
		t.Fatal(err)
	}
	if !(cov.AtLeast[2] < 1 && cov.WorstOneFailed[1] < 1 && cov.WorstOneFailed[1] > 0) {
		t.Fatalf("three sensors: coverage %v, worst one failed %v; the test needs partial coverage", cov.AtLeast, cov.WorstOneFailed)
	}
	verdictOf := func(prefix string) *bool {
		c := cfg
		if strings.HasPrefix(prefix, "Sky") {
			c = cfg3
		}
		rows, _, err := headline(s, c, res)
		if err != nil {
			t.Fatal(err)
		}
		return rowByPrefix(t, rows, prefix).Pass
	}
	cases := []struct {
		name, prefix string
		pass, fail   func(*scenario.Targets)
	}{
		{"valid", "Valid sun vector",
			func(tg *scenario.Targets) { tg.MinValidFraction = e.ValidFraction * 0.999 },
			func(tg *scenario.Targets) { tg.MinValidFraction = e.ValidFraction*1.001 + 1e-6 }},
		{"p95", "Sun-vector error p95 (with albedo)",
			func(tg *scenario.Targets) { tg.MaxErrorP95Rad = p95 * 1.001 },
			func(tg *scenario.Targets) { tg.MaxErrorP95Rad = p95 * 0.999 }},
		{"gap", "Longest sunlit gap",
			func(tg *scenario.Targets) { tg.MaxGap = scenario.Span((e.LongestGapS + 1) * 1e9) },
			func(tg *scenario.Targets) { tg.MaxGap = scenario.Span(max(e.LongestGapS-1, 0.5) * 1e9) }},
		{"coverage", "Sky directions in view of ≥ 2",
			func(tg *scenario.Targets) { tg.CoverageSensors, tg.MinCoverage = 2, cov.AtLeast[2] },
			func(tg *scenario.Targets) { tg.CoverageSensors, tg.MinCoverage = 2, cov.AtLeast[2]+1e-4 }},
		{"one failed", "Sky directions in view of ≥ 1 with the worst",
			func(tg *scenario.Targets) {
				tg.CoverageSensors, tg.MinCoverage, tg.SurviveOneFailure = 1, cov.WorstOneFailed[1], true
			},
			func(tg *scenario.Targets) {
				tg.CoverageSensors, tg.MinCoverage, tg.SurviveOneFailure = 1, cov.WorstOneFailed[1]+1e-4, true
			}},
	}
	orig := s.Targets
	for _, c := range cases {
		s.Targets = scenario.Targets{}
		c.pass(&s.Targets)
		if v := verdictOf(c.prefix); v == nil || !*v {
			t.Errorf("%s: target %+v should pass, got %v", c.name, s.Targets, v)
		}
		s.Targets = scenario.Targets{}
		c.fail(&s.Targets)
		if v := verdictOf(c.prefix); v == nil || *v {
			t.Errorf("%s: target %+v should fail, got %v", c.name, s.Targets, v)
		}
	}
	s.Targets = scenario.Targets{}
	if v := verdictOf("Valid sun vector"); v != nil {
		t.Errorf("no target: verdict %v, want none", *v)
	}
	s.Targets = orig
}

// Without a kept series the timeline is rebuilt from a re-run of the first
// orbits and matches the series of a run that kept one.
func TestTimelineWithoutSeries(t *testing.T) {
	s, cfg, res := shortRun(t, "nadir-6u-sso.yaml", 2*time.Hour, 1)
	_ = s
	res.Nominal.Series = nil
	tl, err := timeline(cfg, res)
	if err != nil {
		t.Fatal(err)
	}
	if len(tl.T) < 100 || tl.T[len(tl.T)-1] > cfg.Duration {
		t.Fatalf("timeline of %d samples ending %g s", len(tl.T), tl.T[len(tl.T)-1])
	}
	if len(tl.Umbra) == 0 {
		t.Errorf("no umbra span in two hours of a 550 km orbit")
	}
}

func TestWritePlots(t *testing.T) {
	s, cfg, res := shortRun(t, "nadir-6u-sso.yaml", 2*time.Hour, 1)
	figs, err := Figures(s, cfg, res, s.Output.Figures)
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	if err := WritePlots(dir, figs, []string{"png", "jpeg"}); err == nil || !strings.Contains(err.Error(), "jpeg") {
		t.Errorf("bad format: error %v, want one naming jpeg", err)
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 0 {
		t.Errorf("bad format left %d files", len(ents))
	}
	if err := WritePlots(filepath.Join(dir, "missing"), figs, []string{"png"}); err == nil {
		t.Error("missing folder: no error")
	}
	if err := WritePlots(dir, figs, []string{"png", "svg"}); err != nil {
		t.Fatal(err)
	}
	for _, f := range figs {
		for _, ext := range []string{".png", ".svg"} {
			if st, err := os.Stat(filepath.Join(dir, f.Name+ext)); err != nil || st.Size() == 0 {
				t.Errorf("%s%s: %v", f.Name, ext, err)
			}
		}
	}
}

func TestRenderExamples(t *testing.T) {
	if *renderDir == "" {
		t.Skip("use -render DIR to write every example's figures")
	}
	for _, name := range []string{"nadir-6u-sso.yaml", "dawn-dusk-12u.yaml", "tumbling-3u.yaml"} {
		s, cfg, res := shortRun(t, name, 24*time.Hour, 1)
		figs, err := Figures(s, cfg, res, s.Output.Figures)
		if err != nil {
			t.Fatal(err)
		}
		dir := filepath.Join(*renderDir, strings.TrimSuffix(name, ".yaml"))
		if err := os.MkdirAll(dir, 0o755); err != nil {
			t.Fatal(err)
		}
		if err := WritePlots(dir, figs, []string{"png"}); err != nil {
			t.Fatal(err)
		}
		rep, err := Report(s, cfg, res, figs, Provenance{Input: name, Version: "render-test"})
		if err != nil {
			t.Fatal(err)
		}
		if err := plots.WriteReportFile(filepath.Join(dir, "report.html"), rep); err != nil {
			t.Fatal(err)
		}
	}
}

// The sky map places the Earth where the attitude puts it: the nadir
// example points +Z to nadir, so every nadir sample of the run is +Z and the
// Earth's angular radius is asin(R⊕/a) (closed form, spherical Earth).
func TestSkyMapEarthDisc(t *testing.T) {
	s, cfg, res := shortRun(t, "nadir-6u-sso.yaml", 3*time.Hour, 1)
	m, err := skyMap(s, cfg, res)
	if err != nil {
		t.Fatal(err)
	}
	if len(m.Nadir) == 0 {
		t.Fatal("no nadir track kept")
	}
	for i, p := range m.Nadir {
		if p.ElDeg < 89.999 {
			t.Fatalf("nadir sample %d at elevation %.4f°, want +Z (90°)", i, p.ElDeg)
		}
	}
	want := 180 / math.Pi * math.Asin(6378.137/(6378.137+550))
	if math.Abs(m.EarthRadiusDeg-want) > 0.2 {
		t.Errorf("Earth radius %.2f°, want %.2f° (550 km)", m.EarthRadiusDeg, want)
	}
}

// An estimator valid 28.8 % of sunlit time with 20 % of sunlit time more
// than the false-sun bound off is flagged "valid but wrong" (69 % of its
// valid estimates); one with 1 % of its valid estimates off is not.
func TestWrongFlag(t *testing.T) {
	e := sim.EstimatorStats{ValidFraction: 0.288, WrongFraction: 0.2}
	if f := wrongFlag(&e, 20); !strings.Contains(f, "valid but wrong: 69 %") || !strings.Contains(f, "20°") {
		t.Errorf("flag %q", f)
	}
	e.WrongFraction = 0.00288
	if f := wrongFlag(&e, 20); f != "" {
		t.Errorf("1 %% wrong flagged: %q", f)
	}
	e.ValidFraction = 0
	if f := wrongFlag(&e, 20); f != "" {
		t.Errorf("never valid flagged: %q", f)
	}
}
