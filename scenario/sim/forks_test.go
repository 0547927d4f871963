package sim

import (
	"context"
	"fmt"
	"math"
	"regexp"
	"strconv"
	"testing"

	"codeberg.org/sunsight/sunsight/orbit"
)

// numericCase is the reference case on the j2-numeric propagator.
func numericCase(t testing.TB, days float64, withAlbedo bool) Config {
	t.Helper()
	cfg := referenceCase(t, days, withAlbedo)
	el := cfg.NewPropagator().(*orbit.J2Mean).MeanElementsAt(0)
	cfg.NewPropagator = func() orbit.Propagator {
		p, err := orbit.NewJ2Numeric(el, orbit.NumericOptions{})
		if err != nil {
			t.Fatal(err)
		}
		return p
	}
	return cfg
}

// Each piece's fork of the one integration gives, block by block, bit for
// bit the states of one integration from the epoch (closed form: the same
// steps, the same dense output).
func TestPieceForksContinueTheIntegration(t *testing.T) {
	cfg := numericCase(t, 1, false)
	const piece, step = 3000, 10.0
	in := newIntegration(cfg.NewPropagator().(orbit.Restarter), piece, step)
	one := cfg.NewPropagator()
	want := make([]orbit.State, geomBlock)
	got := make([]orbit.State, geomBlock)
	for c := 0; c < 8; c++ {
		f := in.forPiece(c)
		for blk0 := c * piece; blk0 < (c+1)*piece; blk0 += geomBlock {
			n := min(geomBlock, (c+1)*piece-blk0)
			one.Fill(want[:n], float64(blk0)*step, step)
			f.Fill(got[:n], float64(blk0)*step, step)
			for k := range n {
				if got[k] != want[k] {
					t.Fatalf("piece %d, step %d: fork %v, one integration %v", c, blk0+k, got[k], want[k])
				}
			}
		}
	}
	// A second fork of an earlier piece starts where the first did.
	if a, b := in.forPiece(2).StateAt(2*piece*step), in.forPiece(2).StateAt(2*piece*step); a != b {
		t.Fatalf("two forks of piece 2 differ: %v, %v", a, b)
	}
}

// A j2-numeric run cut into pieces gives the numbers of the run in one
// piece from the epoch (the same states; sums merged piece by piece round
// differently in the last bits, so to 1e-12 relative), and the same bits on
// one and on two workers, with Monte Carlo units, realistic errors and
// albedo.
func TestNumericRunInPiecesEqualsOnePiece(t *testing.T) {
	var shown []string
	for _, c := range []struct {
		workers  int
		onePiece bool
	}{{1, true}, {1, false}, {2, false}} {
		cfg := numericCase(t, 8, true)
		cfg.Units, cfg.Workers, cfg.onePiece = 2, c.workers, c.onePiece
		cfg.Array = noisyFaceArray(t, 60)
		res, err := Run(context.Background(), cfg)
		if err != nil {
			t.Fatal(err)
		}
		if res.Steps <= 2*chunkSteps {
			t.Fatalf("%d steps: fewer than three pieces", res.Steps)
		}
		shown = append(shown, showUnits(res)+fmt.Sprint(res.Headline(), res.EclipseStats))
	}
	if shown[1] != shown[2] {
		t.Fatal("the run in pieces differs between one and two workers")
	}
	num := regexp.MustCompile(`-?[0-9][0-9.e+-]*`)
	a, b := num.FindAllString(shown[1], -1), num.FindAllString(shown[0], -1)
	if len(a) != len(b) || num.ReplaceAllString(shown[1], "#") != num.ReplaceAllString(shown[0], "#") {
		t.Fatal("the run in pieces and the run in one piece do not report the same figures")
	}
	moved := 0
	for j := range a {
		x, _ := strconv.ParseFloat(a[j], 64)
		y, _ := strconv.ParseFloat(b[j], 64)
		if x != y {
			moved++
		}
		if math.Abs(x-y) > 1e-12*math.Abs(y) {
			t.Fatalf("figure %d: %s in pieces, %s in one piece", j, a[j], b[j])
		}
	}
	t.Logf("%d of %d figures differ in the last bits", moved, len(a))
}
