package timeline

import (
	"math"
	"testing"
)

const deg = math.Pi / 180

// Bang–coast–bang time of a rest-to-rest slew of θ at rate limit ω and
// acceleration limit α (closed form, from integrating the acceleration
// profile; B. Wie, Space Vehicle Dynamics and Control, 2nd ed., AIAA 2008,
// §7.3, from memory): T = θ/ω + ω/α when θ ≥ ω²/α (trapezoidal rate), else
// T = 2√(θ/α) (triangular).
func TestSlewDurationClosedForm(t *testing.T) {
	for _, c := range []struct {
		name           string
		θ, ω, α, wantT float64
	}{
		// ω²/α = 1°/s² / 0.1°/s² = 10°: 90° is trapezoidal, 90/1 + 1/0.1 = 100 s.
		{"trapezoidal 90°", 90 * deg, 1 * deg, 0.1 * deg, 100},
		// 4° < 10°: triangular, 2·√(4/0.1) = 12.649 s.
		{"triangular 4°", 4 * deg, 1 * deg, 0.1 * deg, 2 * math.Sqrt(40)},
		// At the corner both forms give 20 s.
		{"corner 10°", 10 * deg, 1 * deg, 0.1 * deg, 20},
		// 180° at 3°/s, 0.5°/s²: ω²/α = 18° → 60 + 6 = 66 s.
		{"trapezoidal 180°", 180 * deg, 3 * deg, 0.5 * deg, 66},
		{"no slew", 0, 1 * deg, 0.1 * deg, 0},
	} {
		l := Limits{RateRadS: c.ω, AccelRadS2: c.α}
		if got := l.Duration(c.θ); math.Abs(got-c.wantT) > 1e-9 {
			t.Errorf("%s: T = %.9g s, want %.9g", c.name, got, c.wantT)
		}
	}
}

// The angle profile starts and ends at rest, reaches θ at T, never exceeds
// the rate or acceleration limits, and is monotone (properties of a
// rest-to-rest bang–coast–bang profile, by definition).
func TestSlewProfileRespectsLimits(t *testing.T) {
	for _, θ := range []float64{0.5 * deg, 10 * deg, 45 * deg, 179 * deg} {
		l := Limits{RateRadS: 1 * deg, AccelRadS2: 0.1 * deg}
		T := l.Duration(θ)
		if got := l.AngleAt(θ, T); math.Abs(got-θ) > 1e-12 {
			t.Errorf("θ = %g°: angle at T = %g, want %g", θ/deg, got, θ)
		}
		if got := l.AngleAt(θ, 0); got != 0 {
			t.Errorf("θ = %g°: angle at 0 = %g", θ/deg, got)
		}
		n := 2000
		h := T / float64(n)
		prev, prevRate := 0.0, 0.0
		for k := 1; k <= n; k++ {
			a := l.AngleAt(θ, float64(k)*h)
			rate := (a - prev) / h
			if rate < -1e-12 || rate > l.RateRadS*(1+1e-9) {
				t.Fatalf("θ = %g°: rate %g°/s at step %d", θ/deg, rate/deg, k)
			}
			if k > 1 && math.Abs(rate-prevRate)/h > l.AccelRadS2*(1+1e-6) {
				t.Fatalf("θ = %g°: acceleration %g°/s² at step %d", θ/deg, (rate-prevRate)/h/deg, k)
			}
			prev, prevRate = a, rate
		}
		if prevRate > l.AccelRadS2*h*1.01 {
			t.Errorf("θ = %g°: does not end at rest (rate %g°/s)", θ/deg, prevRate/deg)
		}
	}
}
