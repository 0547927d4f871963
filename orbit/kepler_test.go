package orbit

import (
	"fmt"
	"math"
	"testing"
)

const deg = math.Pi / 180

func TestEccentricAnomalyPublished(t *testing.T) {
	for _, c := range []struct {
		name    string
		M, e, E float64 // radians
		tol     float64
	}{
		// Vallado 4th ed. (2013) Example 2-1 p. 66: M = 235.4°, e = 0.4.
		{"Vallado Ex. 2-1", 235.4 * deg, 0.4, 220.512074767522 * deg, 1e-9 * deg},
		// Meeus 1998 Example 30.a p. 196: e = 0.1, M = 5°.
		{"Meeus Ex. 30.a", 5 * deg, 0.1, 5.554589254 * deg, 1e-9 * deg},
		// Meeus 1998 p. 205 (hard case e = 0.99, M = 0.2 rad).
		{"Meeus p. 205", 0.2, 0.99, 1.066997365282, 1e-12},
	} {
		got := EccentricAnomaly(c.M, c.e)
		if d := math.Abs(got - c.E); d > c.tol {
			t.Errorf("%s: E = %.15f, want %.15f (|Δ| = %.3g rad)", c.name, got, c.E, d)
		}
	}
}

// Closed form: the solution must satisfy Kepler's equation for every M and
// 0 ≤ e ≤ 0.99 (residual at round-off).
func TestEccentricAnomalyResidual(t *testing.T) {
	worst := 0.0
	for _, e := range []float64{0, 1e-9, 0.001, 0.1, 0.5, 0.8, 0.9, 0.95, 0.99} {
		for k := -400; k <= 400; k++ {
			M := float64(k) * 0.01 * math.Pi // −4π … 4π
			E := EccentricAnomaly(M, e)
			if r := math.Abs(E - e*math.Sin(E) - M); r > worst {
				worst = r
			}
			if math.Abs(E-M) > math.Pi {
				t.Fatalf("e=%g M=%g: E=%g not in the same turn", e, M, E)
			}
		}
	}
	if worst > 1e-13 {
		t.Errorf("worst residual %.3g rad, want ≤ 1e-13", worst)
	}
}

func ExampleEccentricAnomaly() {
	// Meeus 1998, Example 30.a p. 196.
	E := EccentricAnomaly(5*math.Pi/180, 0.1)
	fmt.Printf("E = %.9f°\n", E*180/math.Pi)
	// Output: E = 5.554589254°
}
