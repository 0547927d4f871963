package main

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// The rows series.csv appends as bytes are the bytes csv.Writer writes for
// the same fields formatted by ff and utcOf: NaN as an empty cell, ±Inf,
// −0, every region, a power column and signals; two pieces follow each
// other under one header.
func TestSeriesFileRowsAreCSVWriterRows(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	epoch := time.Date(2027, 3, 4, 5, 6, 7, 0, time.UTC)
	piece := func(t0 float64) *sim.Series {
		return &sim.Series{T: []float64{t0, t0 + 10.25, t0 + 20}, Region: []illum.Region{illum.Sunlit, illum.Penumbra, illum.Umbra},
			Lit: []float64{1, 0.4999995, 0}, Seen: []int{3, 1, 0}, Valid: []bool{true, false, false},
			ErrNoDeg: []float64{0.12345, nan, nan}, ErrAlbDeg: []float64{1.5, nan, inf}, ErrCorrDeg: []float64{nan, nan, nan},
			BetaDeg: []float64{-21.8, -21.80004, math.Copysign(0, -1)}, SunBodyAz: []float64{179.9996, -180, 0}, SunBodyEl: []float64{89.99, -90, 1e-9},
			Signal: []float64{0.98765432, 0, 1.5, 1e-7, 0.25, 0.5}, SensorName: []string{"css,a", "css b"}}
	}
	power := []float64{12.3456789, 0, -inf}
	dir := t.TempDir()
	sf, err := newSeriesFile(filepath.Join(dir, "out"), epoch, true)
	if err != nil {
		t.Fatal(err)
	}
	defer sf.discard()
	for _, t0 := range []float64{0, 30} {
		if err := sf.write(piece(t0), power); err != nil {
			t.Fatal(err)
		}
	}
	set := filepath.Join(dir, "set")
	os.Mkdir(set, 0o755)
	if err := sf.place(set); err != nil {
		t.Fatal(err)
	}
	got, err := os.ReadFile(filepath.Join(set, "series.csv"))
	if err != nil {
		t.Fatal(err)
	}
	var want bytes.Buffer
	w := csv.NewWriter(&want)
	w.Write([]string{"t_s", "utc", "region", "sun_disc_visible_fraction", "sensors_seeing_sun", "valid",
		"error_no_albedo_deg", "error_albedo_deg", "error_onboard_corrected_deg", "beta_deg", "sun_body_az_deg", "sun_body_el_deg",
		"array_power_w", "signal_css,a", "signal_css b"})
	for _, t0 := range []float64{0, 30} {
		p := piece(t0)
		for i, tt := range p.T {
			w.Write([]string{ff(tt, 1), utcOf(epoch, tt), strings.ToLower(p.Region[i].String()), ff(p.Lit[i], 6), strconv.Itoa(p.Seen[i]),
				strconv.FormatBool(p.Valid[i]), ff(p.ErrNoDeg[i], 4), ff(p.ErrAlbDeg[i], 4), ff(p.ErrCorrDeg[i], 4), ff(p.BetaDeg[i], 4),
				ff(p.SunBodyAz[i], 3), ff(p.SunBodyEl[i], 3), ff(power[i], 4), ff(p.SignalsAt(i)[0], 5), ff(p.SignalsAt(i)[1], 5)})
		}
	}
	w.Flush()
	if !bytes.Equal(got, want.Bytes()) {
		t.Errorf("series.csv:\n%s\nwant:\n%s", got, want.Bytes())
	}
	if ents, _ := os.ReadDir(dir); len(ents) != 1 {
		t.Errorf("left beside the output set: %v", ents)
	}
}

// A run with --csv leaves nothing but its output folder, and a run refused
// after the series file was opened (the memory bound) leaves nothing at all.
func TestSeriesFileLeavesNoTemporaryFile(t *testing.T) {
	parent := t.TempDir()
	out := filepath.Join(parent, "csv")
	var so, se bytes.Buffer
	if code := runMain([]string{"run", "../../examples/nadir-6u-sso.yaml", "--duration", "2h", "--csv", out, "--quiet"}, &so, &se); code != exitTargetFailed {
		t.Fatalf("exit %d: %s", code, se.String())
	}
	if ents, _ := os.ReadDir(parent); len(ents) != 1 || ents[0].Name() != "csv" {
		t.Errorf("after a run: %v", ents)
	}
	if n := len(readCSV(t, filepath.Join(out, "series.csv"))) - 1; n != 721 {
		t.Errorf("series.csv has %d rows, want 721", n)
	}
	parent2 := t.TempDir()
	se.Reset()
	if code := runMain([]string{"run", "../../examples/nadir-6u-sso.yaml", "--csv", filepath.Join(parent2, "csv"), "--max-memory-mib", "1", "--quiet"}, &so, &se); code != exitUsage {
		t.Fatalf("exit %d, want %d: %s", code, exitUsage, se.String())
	}
	if ents, _ := os.ReadDir(parent2); len(ents) != 0 {
		t.Errorf("after a refused run: %v", ents)
	}
}

// Monte Carlo units with nothing drawn per unit are said to be copies of
// unit 0, on stderr and in the JSON record's warnings; a layout with drawn
// errors is not.
func TestWarnsUnitsAlike(t *testing.T) {
	src := "epoch: \"2027-01-01T00:00:00Z\"\nduration: 6h\nstep: 10s\norbit: {altitude_km: 550, ltan: \"10:30\"}\nattitude: {law: nadir}\n" +
		"body:\n  sensors:\n    - {name: a, kind: cosine, face: \"+X\", half_angle_deg: 60%s}\n    - {name: b, kind: cosine, face: \"-X\", half_angle_deg: 60%s}\n" +
		"    - {name: c, kind: cosine, face: \"+Z\", half_angle_deg: 60%s}\n"
	for _, tc := range []struct {
		errs string
		want bool
	}{{"", true}, {", errors: {noise_1sigma: 0.003}", false}} {
		scen := filepath.Join(t.TempDir(), "s.yaml")
		os.WriteFile(scen, fmt.Appendf(nil, src, tc.errs, tc.errs, tc.errs), 0o644)
		var so, se bytes.Buffer
		runMain([]string{"run", scen, "--units", "3", "--json"}, &so, &se)
		said := strings.Contains(se.String(), "nothing is drawn per unit") && strings.Contains(so.String(), "nothing is drawn per unit")
		if said != tc.want {
			t.Errorf("errors %q: warned %v, want %v (stderr %s)", tc.errs, said, tc.want, se.String())
		}
	}
}

// A write that fails names the --csv folder and series.csv, not the
// temporary file, and says the run stopped.
func TestSeriesFileErrorNamesTheFolder(t *testing.T) {
	dir := t.TempDir()
	sf, err := newSeriesFile(filepath.Join(dir, "out"), time.Date(2027, 1, 1, 0, 0, 0, 0, time.UTC), false)
	if err != nil {
		t.Fatal(err)
	}
	sf.out = failingWriter{os.ErrClosed} // every later write fails
	p := &sim.Series{T: make([]float64, 5000), Region: make([]illum.Region, 5000), Lit: make([]float64, 5000), Seen: make([]int, 5000),
		Valid: make([]bool, 5000), ErrNoDeg: make([]float64, 5000), ErrAlbDeg: make([]float64, 5000), ErrCorrDeg: make([]float64, 5000),
		BetaDeg: make([]float64, 5000), SunBodyAz: make([]float64, 5000), SunBodyEl: make([]float64, 5000)}
	err = sf.write(p, nil)
	if err == nil {
		t.Fatal("a write to a closed file succeeded")
	}
	msg := err.Error()
	if !strings.Contains(msg, "--csv "+filepath.Join(dir, "out")+": series.csv: ") || strings.Contains(msg, ".tmp") || !strings.Contains(msg, "run stopped") {
		t.Errorf("message %q", msg)
	}
	sf.discard()
	if ents, _ := os.ReadDir(dir); len(ents) != 0 {
		t.Errorf("left: %v", ents)
	}
}

// failingWriter fails every write with its error, wrapped as a file's.
type failingWriter struct{ err error }

func (f failingWriter) Write([]byte) (int, error) {
	return 0, &os.PathError{Op: "write", Path: "/tmp/.sunsight-series-1.csv.tmp", Err: f.err}
}
