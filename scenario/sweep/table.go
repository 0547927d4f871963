package sweep

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"slices"
	"strconv"
	"strings"

	"codeberg.org/sunsight/sunsight/internal/atomicfile"
	"codeberg.org/sunsight/sunsight/plots"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// Plans reads the plan of every folder in dirs and checks that they are one
// sweep's (one folder, or the folders of its shards); it returns that plan.
func Plans(dirs []string) (Manifest, error) {
	if len(dirs) == 0 {
		return Manifest{}, errors.New("sweep: no folder to read; give the --out folder(s) of the sweep")
	}
	var m Manifest
	for k, d := range dirs {
		mk, err := ReadManifest(d)
		if errors.Is(err, os.ErrNotExist) {
			return m, folderErrorf("sweep: %s has no %s; give folders written by sunsight sweep --out", d, PlanFile)
		}
		if err != nil {
			return m, err
		}
		if k == 0 {
			m = mk
		} else if !reflect.DeepEqual(m, mk) {
			return m, folderErrorf("sweep: %s and %s hold different sweeps; merge only the shards of one sweep", dirs[0], d)
		}
	}
	return m, nil
}

// Gather reads every case of the sweep in dirs (one folder, or the folders of
// its shards, all made by the same sweep) in case order. Cases found only in
// a later folder are copied into the first, so it then holds the whole sweep;
// nothing is copied unless every case is found and sound.
func Gather(dirs []string) (Manifest, []*CaseFile, error) {
	m, err := Plans(dirs)
	if err != nil {
		return m, nil, err
	}
	cases := make([]*CaseFile, len(m.Cases))
	from := make([]int, len(m.Cases)) // the folder each case is read from
	var missing []int
	for i := range cases {
		for k, d := range dirs {
			cf, err := ReadCase(d, i)
			if errors.Is(err, os.ErrNotExist) {
				continue
			}
			if err != nil {
				return m, nil, err
			}
			if cf.SHA256 != m.CaseSHA[i] {
				return m, nil, folderErrorf("sweep: %s was made from another scenario; delete it and run its shard again", caseFile(d, i))
			}
			cases[i], from[i] = cf, k
			break
		}
		if cases[i] == nil {
			missing = append(missing, i)
		}
	}
	if len(missing) > 0 {
		return m, nil, folderErrorf("sweep: %d of %d cases are missing (first: case %d); run the missing shards, or run the sweep again to resume", len(missing), len(cases), missing[0])
	}
	for i, k := range from {
		if k == 0 {
			continue
		}
		data, err := os.ReadFile(caseFile(dirs[k], i))
		if err == nil {
			err = atomicfile.Write(caseFile(dirs[0], i), data)
		}
		if err != nil {
			return m, nil, fmt.Errorf("sweep: copying case %d: %w", i, err)
		}
	}
	return m, cases, nil
}

// The columns of the sky coverage the coverage targets judge (the share of
// the sky seen by ≥ targets.coverage_sensors sensors, and the same with the
// worst single sensor failed), present when any case states the target.
const (
	CoverageColumn          = "sky_seen_by_coverage_sensors_fraction"
	CoverageOneFailedColumn = "sky_seen_by_coverage_sensors_one_failed_fraction"
)

// judgedColumns are the figures of the targets that no headline column
// holds, by target key: the value of the case's target record.
var judgedColumns = []struct{ key, column string }{
	{study.TargetCoverage, CoverageColumn},
	{study.TargetCoverageOneFailed, CoverageOneFailedColumn},
}

// Table writes the sweep table: one row per case in case order: the case,
// its seed and the SHA-256 of its resolved scenario, the varied inputs, the
// headline columns (names carry units), the judged sky coverage of the
// coverage targets (judgedColumns, when any case states them), then
// targets_met and one target_<key>_pass column per target stated in any
// case (true, false, or empty where that case states no such target).
// Floats have six decimals, counts are whole numbers, an undefined figure
// is an empty cell.
func Table(w io.Writer, m Manifest, cases []*CaseFile) error {
	cw := csv.NewWriter(w)
	names := HeadlineNames()
	var keys []string
	seen := map[string]bool{}
	for _, cf := range cases {
		for _, t := range cf.Targets {
			if !seen[t.Key] {
				seen[t.Key] = true
				keys = append(keys, t.Key)
			}
		}
	}
	head := append([]string{"case", "seed", "scenario_sha256"}, m.Keys...)
	head = append(head, names...)
	var judged []string // target keys with a column of their value
	for _, j := range judgedColumns {
		if seen[j.key] {
			judged = append(judged, j.key)
			head = append(head, j.column)
		}
	}
	head = append(head, "targets_met")
	for _, k := range keys {
		head = append(head, TargetPassColumn(k))
	}
	if err := cw.Write(head); err != nil {
		return err
	}
	isInt := map[string]bool{}
	for _, c := range headlineColumns(sim.Headline{}) {
		isInt[c.name] = c.isInt
	}
	for _, cf := range cases {
		row := []string{strconv.Itoa(cf.Index), strconv.FormatUint(cf.Seed, 10), cf.SHA256}
		for _, in := range cf.Inputs {
			row = append(row, in.Value)
		}
		for _, n := range names {
			v := cf.Headline[n]
			if x, ok := v.(float64); ok && isInt[n] {
				v = int64(x) // counts print as whole numbers
			}
			row = append(row, cell(v))
		}
		for _, k := range judged {
			var v any
			for _, t := range cf.Targets {
				if t.Key == k && t.Value != nil {
					v = *t.Value
				}
			}
			row = append(row, cell(v))
		}
		row = append(row, strconv.FormatBool(cf.Met()))
		for _, k := range keys {
			c := ""
			for _, t := range cf.Targets {
				if t.Key == k {
					c = strconv.FormatBool(t.Pass)
				}
			}
			row = append(row, c)
		}
		if err := cw.Write(row); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}

// TargetPassColumn is the sweep.csv column of one target's verdict.
func TargetPassColumn(key string) string {
	return "target_" + strings.ReplaceAll(key, "-", "_") + "_pass"
}

func cell(v any) string {
	switch x := v.(type) {
	case nil:
		return "" // undefined: an empty cell, as in every CSV of sunsight
	case string:
		return x
	case float64:
		return strconv.FormatFloat(x, 'f', 6, 64)
	}
	return fmt.Sprint(v)
}

// Value returns a case's headline figure, NaN when undefined or not numeric.
func (cf *CaseFile) Value(name string) float64 {
	if x, ok := cf.Headline[name].(float64); ok {
		return x
	}
	return math.NaN()
}

// PutDir puts a folder of outputs at dst, filled by fill, as a whole (the
// command line's writer adds its manifest and refuses a folder that holds
// files of someone else's).
type PutDir func(dst string, fill func(dir string) error) error

// WriteOutputs gathers dirs, writes dirs[0]/sweep.csv and, unless noPlots,
// the sweep curves in dirs[0]/plots (PNG and SVG) through put (nil:
// atomicfile.ReplaceDir). It writes nothing when a case is missing.
func WriteOutputs(dirs []string, noPlots bool, caption plots.Caption, put PutDir) ([]*CaseFile, error) {
	m, cases, err := Gather(dirs)
	if err != nil {
		return nil, err
	}
	var buf bytes.Buffer
	if err := Table(&buf, m, cases); err != nil {
		return nil, fmt.Errorf("sweep: table: %w", err)
	}
	if err := atomicfile.Write(filepath.Join(dirs[0], TableFile), buf.Bytes()); err != nil {
		return nil, err
	}
	if noPlots {
		return cases, nil
	}
	// The figures are drawn into a fresh folder swapped in whole.
	if put == nil {
		put = atomicfile.ReplaceDir
	}
	err = put(filepath.Join(dirs[0], PlotsDir), func(dir string) error {
		return writePlots(dir, m, cases, caption)
	})
	return cases, err
}

// curveFigures are the figures drawn for every sweep: headline name, title,
// axis label.
var curveFigures = [][3]string{
	{"seen_by_3_fraction", "Sunlit time with the sun in view of ≥ 3 sensors", "% of sunlit time"},
	{"seen_by_1_fraction", "Sunlit time with the sun in view of ≥ 1 sensor", "% of sunlit time"},
	{"sunlit_fraction", "Sunlit share of the run", "% of run"},
	{"valid_fraction", "Sunlit time with a valid sun vector", "% of sunlit time"},
	{"p95_error_albedo_deg", "Sun-vector error, 95th percentile, with albedo", "p95 error (deg)"},
}

// noAlbedoErrorFigure stands in for the p95 error with albedo when no case
// models albedo: the target is then judged on the error without it.
var noAlbedoErrorFigure = [3]string{"p95_error_no_albedo_deg", "Sun-vector error, 95th percentile (no albedo modelled)", "p95 error (deg)"}

// plottedFigures is curveFigures as a sweep's cases can draw them: the p95
// error without albedo in place of the one with it when no case has the
// latter, and no figure of which no case has a value (an empty frame
// would look like a broken plot).
func plottedFigures(cases []*CaseFile) [][3]string {
	var out [][3]string
	for _, f := range curveFigures {
		if f[0] == "p95_error_albedo_deg" && !anyValue(cases, f[0]) {
			f = noAlbedoErrorFigure
		}
		if anyValue(cases, f[0]) {
			out = append(out, f)
		}
	}
	return out
}

// anyValue reports whether some case has a finite value of the figure.
func anyValue(cases []*CaseFile, name string) bool {
	for _, cf := range cases {
		if y := cf.Value(name); !math.IsNaN(y) && !math.IsInf(y, 0) {
			return true
		}
	}
	return false
}

// curveTarget names the target key judged on a figure's headline value.
var curveTarget = map[string]string{"valid_fraction": study.TargetValid, "p95_error_albedo_deg": study.TargetErrorP95,
	"p95_error_no_albedo_deg": study.TargetErrorP95}

// axisLabel turns a sweep key into an axis label with its unit:
// "orbit.altitude_km" → "orbit altitude (km)", "orbit.ltan" → "orbit LTAN
// (h, local time)", "epoch" → "epoch (days after the first)".
func axisLabel(key string) string {
	words, unit := splitKey(key)
	if unit == "" {
		return words
	}
	return words + " (" + unit + ")"
}

// keyWords is the key in words without its unit ("orbit LTAN").
func keyWords(key string) string {
	w, _ := splitKey(key)
	return w
}

func splitKey(key string) (string, string) {
	words := strings.Fields(strings.NewReplacer(".", " ", "_", " ").Replace(key))
	unit := ""
	if n := len(words); n > 1 {
		if u, ok := map[string]string{"km": "km", "m": "m", "mm": "mm", "deg": "deg", "s": "s", "min": "min", "h": "h",
			"fraction": "fraction", "pct": "%"}[words[n-1]]; ok {
			unit, words = u, words[:n-1]
		}
	}
	for i, w := range words {
		switch w {
		case "ltan", "ltdn", "raan":
			words[i] = strings.ToUpper(w)
			if w != "raan" {
				unit = "h, local time"
			}
		case "epoch":
			unit = "days after the first"
		}
	}
	return strings.Join(words, " "), unit
}

// axisNumber turns a value of the first key into a plot abscissa: a number,
// a local time in hours, or an epoch in days since the first; ok is false
// for names.
func axisNumber(v string, first string) (float64, bool) {
	if x, err := strconv.ParseFloat(v, 64); err == nil {
		return x, true
	}
	if h, err := scenario.ParseLocalTime(v); err == nil {
		return h, true
	}
	if t, err := scenario.ParseEpoch(v); err == nil {
		t0, err := scenario.ParseEpoch(first)
		if err == nil {
			return t.Sub(t0).Hours() / 24, true
		}
	}
	return 0, false
}

// Curves arranges a figure's values versus the first key, one line per value
// of the second key (one line for a single key or a zipped sweep).
func Curves(m Manifest, cases []*CaseFile, name string) (x []float64, xLabel string, lines []plots.Line) {
	xLabel = axisLabel(m.Keys[0])
	var xs []string
	xi := map[string]int{}
	var ls []string
	li := map[string]int{}
	for _, cf := range cases {
		xv := cf.Inputs[0].Value
		if _, ok := xi[xv]; !ok {
			xi[xv] = len(xs)
			xs = append(xs, xv)
		}
		lv := ""
		if len(m.Keys) > 1 && !m.Zip {
			lv = cf.Inputs[1].Value
		}
		if _, ok := li[lv]; !ok {
			li[lv] = len(ls)
			ls = append(ls, lv)
		}
	}
	numeric := true
	for _, v := range xs {
		if _, ok := axisNumber(v, xs[0]); !ok {
			numeric = false
		}
	}
	x = make([]float64, len(xs))
	for i, v := range xs {
		x[i] = float64(i)
		if numeric {
			x[i], _ = axisNumber(v, xs[0])
		}
	}
	if !numeric {
		xLabel += " (case order: " + strings.Join(xs, ", ") + ")"
	}
	lines = make([]plots.Line, len(ls))
	for k, lv := range ls {
		lines[k] = plots.Line{Label: lv, Y: make([]float64, len(xs))}
		if lv != "" {
			lines[k].Label = keyWords(m.Keys[1]) + " = " + lv
		} else {
			lines[k].Label = name
		}
		for i := range lines[k].Y {
			lines[k].Y[i] = math.NaN()
		}
	}
	for _, cf := range cases {
		k := 0
		if len(m.Keys) > 1 && !m.Zip {
			k = li[cf.Inputs[1].Value]
		}
		lines[k].Y[xi[cf.Inputs[0].Value]] = cf.Value(name)
	}
	return x, xLabel, lines
}

// addTarget draws the target of key on a sweep figure, with the cases that
// miss it ringed and the count of passing cases in the legend.
func addTarget(sw *plots.Sweep, m Manifest, cases []*CaseFile, key string, scale float64) {
	fails := make([][]bool, len(sw.Lines))
	for k := range fails {
		fails[k] = make([]bool, len(sw.X))
	}
	var limit *float64
	var op string
	pass, total := 0, 0
	for _, cf := range cases {
		for _, t := range cf.Targets {
			if t.Key != key {
				continue
			}
			l := t.Required * scale
			limit, op = &l, t.Op
			total++
			if t.Pass {
				pass++
				continue
			}
			i, k := caseIndex(m, cases, cf)
			if k < len(fails) && i < len(fails[k]) {
				fails[k][i] = true
			}
		}
	}
	if limit == nil {
		return
	}
	sym := "≥"
	if op == study.OpAtMost {
		sym = "≤"
	}
	sw.Target = limit
	unit := ""
	if scale == 100 {
		unit = " %"
	}
	sw.TargetLabel = fmt.Sprintf("target %s %.4g%s: %d of %d cases pass", sym, *limit, unit, pass, total)
	sw.Fails = fails
}

// caseIndex finds the x index and line of a case as Curves arranges them.
func caseIndex(m Manifest, cases []*CaseFile, cf *CaseFile) (i, k int) {
	var xs, ls []string
	for _, c := range cases {
		if !slices.Contains(xs, c.Inputs[0].Value) {
			xs = append(xs, c.Inputs[0].Value)
		}
		lv := ""
		if len(m.Keys) > 1 && !m.Zip {
			lv = c.Inputs[1].Value
		}
		if !slices.Contains(ls, lv) {
			ls = append(ls, lv)
		}
	}
	lv := ""
	if len(m.Keys) > 1 && !m.Zip {
		lv = cf.Inputs[1].Value
	}
	return slices.Index(xs, cf.Inputs[0].Value), slices.Index(ls, lv)
}

func writePlots(dir string, m Manifest, cases []*CaseFile, caption plots.Caption) error {
	for _, f := range plottedFigures(cases) {
		x, xLabel, lines := Curves(m, cases, f[0])
		sw := plots.Sweep{Title: f[1], XLabel: xLabel, X: x, Lines: lines, YLabel: f[2]}
		scale := 1.0
		if strings.HasSuffix(f[0], "_fraction") {
			scale = 100
		}
		for k := range sw.Lines {
			y := append([]float64(nil), sw.Lines[k].Y...)
			for i := range y {
				y[i] *= scale
			}
			sw.Lines[k].Y = y
		}
		if key, ok := curveTarget[f[0]]; ok {
			addTarget(&sw, m, cases, key, scale)
		}
		chart, err := sw.Plot(caption)
		if err != nil {
			return fmt.Errorf("sweep: figure %s: %w", f[0], err)
		}
		for _, format := range []string{"png", "svg"} {
			if err := plots.Save(chart, filepath.Join(dir, f[0]+"."+format), format); err != nil {
				return fmt.Errorf("sweep: figure %s: %w", f[0], err)
			}
		}
	}
	return nil
}
