package study

import (
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/power"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// The memory estimate counts the albedo tables the engine will build: a
// long zonal run shares one zonal table per kind of cone (tens of MB, the
// size NewBoresightTable allocates, see TestBoresightTableBytes), a uniform
// run one uniform table, a gridded or albedo-free run none.
func TestMemoryEstimateCountsAlbedoTables(t *testing.T) {
	const base = "duration: 10d\nstep: 10s\norbit: {altitude_km: 550, ltan: \"10:30\"}\nattitude: {law: inertial, quaternion: [1, 0, 0, 0]}\n" +
		"body:\n  sensors:\n    - {name: a, kind: cosine, face: \"+X\", half_angle_deg: 60}\n    - {name: b, kind: cosine, face: \"-X\", half_angle_deg: 60}\n" +
		"    - {name: c, kind: cosine, face: \"+Y\", half_angle_deg: 40}\n"
	est := map[string]int64{}
	for _, alb := range []string{"none", "uniform", "zonal"} {
		s := parse(t, base+"albedo: {model: "+alb+"}\n")
		cfg, err := Config(s)
		if err != nil {
			t.Fatal(err)
		}
		est[alb] = MemoryEstimate(&cfg, 0)
		if got, want := MemoryEstimate(&cfg, 1000)-est[alb], int64(1000*(12+3)*memPerSeriesCol); got != want {
			t.Errorf("%s: 1000 series rows add %d bytes, want %d", alb, got, want)
		}
	}
	// Two kinds of cone (60° and 40°): two tables each.
	uni, zon := est["uniform"]-est["none"], est["zonal"]-est["none"]
	if !(uni > 5<<20 && uni < 20<<20) {
		t.Errorf("uniform tables counted %.1f MB, want two of about 7 MB", float64(uni)/(1<<20))
	}
	if !(zon > 90<<20 && zon < 200<<20) {
		t.Errorf("zonal tables counted %.1f MB, want two of 50-70 MB", float64(zon)/(1<<20))
	}
	t.Logf("no albedo %.1f MB, uniform tables %.1f MB, zonal tables %.1f MB", float64(est["none"])/(1<<20), float64(uni)/(1<<20), float64(zon)/(1<<20))
}

// The estimate grows with the duration only for the units whose gaps are
// listed (for gaps.csv): 50 units of ten years are no larger than of one
// unless their gaps are listed, then by 20 B per listed unit and step.
func TestMemoryEstimateFlatUnlessGapsListed(t *testing.T) {
	cfg := oneSensorNadir(t)
	cfg.Units = 50
	short := MemoryEstimate(&cfg, 0)
	cfg.Duration *= 365
	long := MemoryEstimate(&cfg, 0)
	if long != short {
		t.Errorf("no gaps listed: %d bytes for 10 d, %d for 10 years", short, long)
	}
	for _, listed := range []int{1, 50, 80} {
		cfg.GapListUnits = listed
		got, want := MemoryEstimate(&cfg, 0)-long, int64(min(listed, 50))*memPerListStep*int64(cfg.Steps())
		if got != want {
			t.Errorf("%d units listed: %d bytes more, want %d", listed, got, want)
		}
	}
}

// The attitude modes of a long zonal run read the primary's shared zonal
// tables: one set is built, not one per mode.
func TestModesShareTheZonalTables(t *testing.T) {
	s := parse(t, "duration: 10d\nstep: 10s\norbit: {altitude_km: 550, ltan: \"10:30\"}\nattitude: {law: nadir}\n"+
		"modes:\n  - {name: inertial, law: inertial, quaternion: [1, 0, 0, 0]}\n"+
		"body:\n  sensors:\n    - {name: a, kind: cosine, face: \"+X\", half_angle_deg: 60}\n    - {name: b, kind: cosine, face: \"-X\", half_angle_deg: 60}\n"+
		"albedo: {model: zonal}\n")
	p, err := Prepare(s)
	if err != nil {
		t.Fatal(err)
	}
	if len(p.Modes) != 1 {
		t.Fatalf("%d modes", len(p.Modes))
	}
	a, err := p.Primary.NewAlbedo()
	if err != nil {
		t.Fatal(err)
	}
	b, err := p.Modes[0].Config.NewAlbedo()
	if err != nil {
		t.Fatal(err)
	}
	if !a.SharesTables() || !a.SharesTablesWith(b) {
		t.Errorf("the mode's albedo model does not share the primary's zonal tables (shared %v)", a.SharesTables())
	}
}

// A series written as the run goes (Config.SeriesSink) is not counted, a
// kept one is, row for row; panels add their power at every sample either
// way.
func TestSeriesRowsOnlyWhenKept(t *testing.T) {
	cfg := oneSensorNadir(t)
	cfg.SeriesStride = 2
	if got, want := SeriesRows(&cfg), cfg.Steps()/2+1; got != want {
		t.Errorf("kept series: %d rows, want %d", got, want)
	}
	cfg.SeriesSink = func(*sim.Series, []float64) error { return nil }
	if got := SeriesRows(&cfg); got != 0 {
		t.Errorf("streamed series: %d rows kept, want 0", got)
	}
	before := MemoryEstimate(&cfg, 0)
	arr, err := power.NewArray(power.Panel{Name: "p", Normal: r3.Vec{Z: 1}, AreaM2: 0.01, Efficiency: 0.3, PackingFactor: 0.9})
	if err != nil {
		t.Fatal(err)
	}
	cfg.Panels = arr
	if got, want := MemoryEstimate(&cfg, 0)-before, int64(cfg.Steps()/2+1)*memPerPowerRow; got != want {
		t.Errorf("panel power adds %d bytes, want %d", got, want)
	}
}

// oneSensorNadir is the configuration of 10 days at 10 s of one cosine
// sensor in nadir pointing at 550 km, for the memory estimate's tests.
func oneSensorNadir(t *testing.T) sim.Config {
	t.Helper()
	s := parse(t, "duration: 10d\nstep: 10s\norbit: {altitude_km: 550, ltan: \"10:30\"}\nattitude: {law: nadir}\n"+
		"body:\n  sensors:\n    - {name: a, kind: cosine, face: \"+X\", half_angle_deg: 60}\n")
	cfg, err := Config(s)
	if err != nil {
		t.Fatal(err)
	}
	return cfg
}
