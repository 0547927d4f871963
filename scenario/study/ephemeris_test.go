package study

import (
	"bytes"
	"context"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/orbit/ccsds"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// The orbit and attitude of a run, written as an OEM and an AEM at the run's
// step and replayed (orbit.ephemeris_file, attitude law replay), give the
// same sunlit share and the same shares of sunlit time seen by ≥ 1/2/3
// sensors and per sensor, bit for bit.
func TestOEMAndAEMReplayGiveTheSameCoverage(t *testing.T) {
	base, err := os.ReadFile("../../examples/nadir-6u-sso.yaml")
	if err != nil {
		t.Fatal(err)
	}
	s, err := scenario.Parse(base, "../../examples")
	if err != nil {
		t.Fatal(err)
	}
	cfg, err := Config(s)
	if err != nil {
		t.Fatal(err)
	}
	cfg.Duration = 6 * 3600
	cfg.Units = 1
	want, err := sim.Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	h, err := Sample(cfg, cfg.Step)
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	var ob, ab bytes.Buffer
	if err := ccsds.WriteOEM(&ob, "TEST", h.Epoch, h.Step, h.States, h.Epoch); err != nil {
		t.Fatal(err)
	}
	if err := ccsds.WriteAEM(&ab, "TEST", h.Times, h.Q, h.Epoch); err != nil {
		t.Fatal(err)
	}
	os.WriteFile(filepath.Join(dir, "orbit.oem"), ob.Bytes(), 0o644)
	os.WriteFile(filepath.Join(dir, "attitude.aem"), ab.Bytes(), 0o644)
	// The same scenario with the orbit and the attitude replaced by the files.
	text := string(base)
	i, j := strings.Index(text, "\norbit:"), strings.Index(text, "\nbody:")
	if i < 0 || j < 0 {
		t.Fatal("example layout changed: no orbit: or body: section")
	}
	replay := text[:i] + "\norbit:\n  ephemeris_file: orbit.oem\nattitude:\n  law: replay\n  file: attitude.aem\n" + text[j:]
	replay = strings.Replace(replay, "duration:", "# duration:", 1) + "\nduration: 6h\n"
	rs, err := scenario.Parse([]byte(replay), dir)
	if err != nil {
		t.Fatalf("%v\n%s", err, replay)
	}
	rcfg, err := Config(rs)
	if err != nil {
		t.Fatal(err)
	}
	rcfg.Units = 1
	got, err := sim.Run(context.Background(), rcfg)
	if err != nil {
		t.Fatal(err)
	}
	w, g := want.Nominal, got.Nominal
	if w.SunlitFraction != g.SunlitFraction || w.SeenAtLeast != g.SeenAtLeast {
		t.Errorf("replayed run: sunlit %v seen %v; original sunlit %v seen %v", g.SunlitFraction, g.SeenAtLeast, w.SunlitFraction, w.SeenAtLeast)
	}
	for k := range w.Sensors {
		if w.Sensors[k].InViewFraction != g.Sensors[k].InViewFraction {
			t.Errorf("sensor %d in view %v, original %v", k, g.Sensors[k].InViewFraction, w.Sensors[k].InViewFraction)
		}
	}
	t.Logf("sunlit %.6f, seen by ≥1/2/3 %.6f/%.6f/%.6f in both", g.SunlitFraction, g.SeenAtLeast[1], g.SeenAtLeast[2], g.SeenAtLeast[3])
}
