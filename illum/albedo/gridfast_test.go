package albedo

import (
	"math"
	"math/rand/v2"
	"os"
	"testing"
)

// fastAtan2 against math.Atan2 over the whole circle and at the octant
// edges: within atanMaxErr.
func TestFastAtan2(t *testing.T) {
	rng := rand.New(rand.NewPCG(9, 1))
	worst := 0.0
	for k := range 2_000_000 {
		a := (2*rng.Float64() - 1) * math.Pi
		if k%10 == 0 {
			a = float64(rng.IntN(9)-4)*math.Pi/4 + (rng.Float64()-0.5)*1e-9
		}
		r := math.Exp(20 * (rng.Float64() - 0.5))
		y, x := r*math.Sin(a), r*math.Cos(a)
		got, ok := fastAtan2(y, x)
		if !ok {
			t.Fatalf("fastAtan2(%g, %g) refused", y, x)
		}
		d := math.Abs(math.Remainder(got-math.Atan2(y, x), 2*math.Pi))
		worst = max(worst, d)
	}
	t.Logf("worst |fastAtan2 − atan2| = %.3g rad (bound %.3g)", worst, atanMaxErr)
	if worst > atanMaxErr {
		t.Errorf("fastAtan2 off by %g rad, bound %g", worst, atanMaxErr)
	}
	if _, ok := fastAtan2(0, 0); ok {
		t.Error("fastAtan2(0, 0) accepted")
	}
}

// The binned row and column lookups return exactly the cell that asin and
// atan2 give, on random inputs and on inputs within 1e-9 of every row and
// column edge, for the demo grid and for a fine 1° grid.
func TestGridLookupMatchesTrig(t *testing.T) {
	f, err := os.Open("testdata/demo_grid.csv")
	if err != nil {
		t.Fatal(err)
	}
	demo, err := ParseGrid(f)
	f.Close()
	if err != nil {
		t.Fatal(err)
	}
	fine := &Grid{nLat: 180, nLon: 360, months: 1, dLat: math.Pi / 180, dLon: math.Pi / 180, lon0: -math.Pi, values: make([]float64, 180*360)}
	fine.buildLatBins()
	fine.perLon, fine.lonSlackCols = 1/fine.dLon, lonSlack/fine.dLon
	rng := rand.New(rand.NewPCG(4, 2))
	for _, g := range []*Grid{demo, fine} {
		binned := 0
		for k := range 1_000_000 {
			q := 2*rng.Float64() - 1
			lon := (2*rng.Float64() - 1) * math.Pi
			if k%2 == 0 { // near an edge
				q = math.Sin(-math.Pi/2 + float64(rng.IntN(g.nLat+1))*g.dLat + (rng.Float64()-0.5)*2e-9)
				lon = g.lon0 + float64(rng.IntN(g.nLon+1))*g.dLon + (rng.Float64()-0.5)*2e-9
			}
			q = min(1, max(-1, q))
			gmst := 2 * math.Pi * rng.Float64()
			r := 0.5 + rng.Float64()
			y, x := r*math.Sin(lon+gmst), r*math.Cos(lon+gmst)
			if got, want := g.rowOfSin(q), g.row(math.Asin(q)); got != want {
				t.Fatalf("%d-row grid: rowOfSin(%.17g) = %d, row(asin) = %d", g.nLat, q, got, want)
			}
			if got, want := g.columnOf(y, x, gmst), g.column(math.Atan2(y, x)-gmst); got != want {
				t.Fatalf("%d-column grid: columnOf(%g, %g, %g) = %d, column(atan2 − gmst) = %d", g.nLon, y, x, gmst, got, want)
			}
			if b := int((q + 1) * (latBins / 2)); b < latBins && g.latBin[b] >= 0 {
				binned++
			}
		}
		t.Logf("%d × %d grid: %.1f %% of the samples (half of them at edges) decided by a bin", g.nLat, g.nLon, float64(binned)/1e4)
	}
}
