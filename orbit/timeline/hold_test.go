package timeline

import (
	"math"
	"testing"

	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// After a held shadow pass the spacecraft slews back onto nadir. On a
// circular two-body orbit the nadir frame turns uniformly at the mean
// motion n about the orbit normal, so the return slew from the attitude
// held at shadow entry h0, leaving at shadow exit h1 and lasting T, turns
// θ = n·(h1 − h0 + T); with the bang–coast–bang time T = θ/ω + ω/α (coast
// regime) this is solved in closed form, T = (n·Δ/ω + ω/α)/(1 − n/ω) with
// Δ = h1 − h0 (closed form; profile after Wie 2008 §7.3, from memory). The
// slew must take that time to 1e-6 s and the attitude must never turn in
// one step by more than the slew rate limit allows.
func TestHoldReturnSlew(t *testing.T) {
	D := 4 * 5677.0
	env := testEnv(D)
	lim := Limits{RateRadS: 1 * deg, AccelRadS2: 0.05 * deg}
	p, err := Build([]Phase{{Name: "science", Law: attitude.Nadir{}, HoldInEclipse: true}}, lim, env)
	if err != nil {
		t.Fatal(err)
	}
	n := math.Sqrt(orbit.MuEarth / math.Pow(orbit.RadiusEarthKm+500, 3))
	ω, α := lim.RateRadS, lim.AccelRadS2
	returns, longest := 0, 0.0
	for i, g := range p.Segments {
		if g.Kind != Slew {
			continue
		}
		returns++
		h := p.Segments[i-1]
		if h.Kind != Hold {
			t.Fatalf("slew at %g s does not follow a hold", g.Start)
		}
		Δ := h.End - h.Start
		want := (n*Δ/ω + ω/α) / (1 - n/ω)
		if θ := n * (Δ + want); θ < ω*ω/α || θ > math.Pi {
			t.Fatalf("test geometry: θ = %g° is outside the coast regime or beyond 180°", θ/deg)
		}
		got := g.End - g.Start
		if math.Abs(got-want) > 1e-6 {
			t.Errorf("return slew after the shadow ending at %.1f s: %.9f s, want %.9f s (closed form)", h.End, got, want)
		}
		if math.Abs(g.Angle-n*(Δ+want)) > 1e-6 {
			t.Errorf("return slew angle %.6f°, want n·(Δ+T) = %.6f°", g.Angle/deg, n*(Δ+want)/deg)
		}
		longest = math.Max(longest, got)
		t.Logf("shadow %.1f s, return slew %.1f° in %.3f s", Δ, g.Angle/deg, got)
	}
	sp := p.Spans[0]
	if returns < 3 || sp.ReturnSlews != returns || math.Abs(sp.ReturnSlewMaxS-longest) > 1e-9 {
		t.Errorf("span reports %d return slews (longest %g s); segments have %d (longest %g s)", sp.ReturnSlews, sp.ReturnSlewMaxS, returns, longest)
	}
	// Continuity: at 1 s steps the body never turns more than the larger
	// of the slew rate limit and nadir's own rate allow (plus 1e-6 rad).
	const dt = 1.0
	prev := p.Attitude(0, env.State(0), env.Sun(0))
	for tt := dt; tt <= D; tt += dt {
		q := p.Attitude(tt, env.State(tt), env.Sun(tt))
		if d := attitude.AngleBetween(prev, q); d > math.Max(ω, n)*dt+1e-6 {
			t.Fatalf("the attitude turns %g° between %g s and %g s (limit %g°)", d/deg, tt-dt, tt, ω*dt/deg)
		}
		prev = q
	}
}
