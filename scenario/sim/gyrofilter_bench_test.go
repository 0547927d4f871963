package sim

import (
	"context"
	"testing"
)

// BenchmarkFilterCost runs one day at 10 s of the bench reference case
// (no albedo) without and with the gyro-aided filter, side by side.
func BenchmarkFilterCost(b *testing.B) {
	for _, on := range []bool{false, true} {
		name := "off"
		if on {
			name = "on"
		}
		b.Run(name, func(b *testing.B) {
			cfg := referenceCase(b, 1, false)
			cfg.Array = noisyFaceArray(b, 70)
			if on {
				cfg.Filter = filterConfig()
			}
			for b.Loop() {
				if _, err := Run(context.Background(), cfg); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// A step of the filter in the engine allocates nothing.
func TestFilterStepAllocatesNothing(t *testing.T) {
	cfg := referenceCase(t, 0.01, false)
	cfg.Array = noisyFaceArray(t, 70)
	cfg.Filter = filterConfig()
	g, err := newGeometry(&cfg, cfg.Array, 0, albedoTables{})
	if err != nil {
		t.Fatal(err)
	}
	w := newViewer(&cfg, cfg.Array)
	r := newReader(&cfg, cfg.Array, 0, 0)
	k := 0
	if n := testing.AllocsPerRun(50, func() {
		sg := g.step(k, nil, nil)
		r.step(k, &sg, w.at(&sg, nil, nil))
		k++
	}); n != 0 {
		t.Errorf("a step with the filter allocates %.1f times", n)
	}
}
