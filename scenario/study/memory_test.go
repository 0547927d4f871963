package study

import (
	"testing"
)

// The memory estimate counts the albedo tables the engine will build: a
// long zonal run shares one zonal table per kind of cone (tens of MB, the
// size NewBoresightTable allocates, see TestBoresightTableBytes), a uniform
// run one uniform table, a gridded or albedo-free run none; and the term
// per unit and step of the event records.
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
