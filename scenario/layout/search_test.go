package layout

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/sky"
)

var faces = []r3.Vec{{X: 1}, {X: -1}, {Y: 1}, {Y: -1}, {Z: 1}, {Z: -1}}

func cones(axes []r3.Vec, halfDeg float64) []sky.Viewer {
	var v []sky.Viewer
	for _, a := range axes {
		v = append(v, sky.NewCone(a, halfDeg*math.Pi/180))
	}
	return v
}

// always meets the time targets; the margin prefers lower indices.
func always(_ context.Context, s []int) (Score, error) {
	sum := 0
	for _, i := range s {
		sum += i
	}
	return Score{Meets: true, Margin: -float64(sum), P95Deg: 1}, nil
}

// Six face normals: the cube corner lies arccos(1/√3) = 54.7356° from the
// nearest normal (closed form), so below it no subset sees the whole sky.
func TestFaceCosinesBelowCornerAngleNeverCoverTheSphere(t *testing.T) {
	res, err := Search(context.Background(), Problem{Viewers: cones(faces, 54), CoverageSensors: 1, MinCoverage: 1, Evaluate: always})
	if err != nil {
		t.Fatal(err)
	}
	if res.Best != nil || res.Evaluated != 0 {
		t.Errorf("54° cones: best %+v after %d evaluations, want none", res.Best, res.Evaluated)
	}
	if res.Pruned == 0 {
		t.Error("the coverage bound pruned nothing")
	}
}

// At 60° every direction needs its own axis's face: with one face missing,
// the direction opposite it is 90° from the other five (closed form).
func TestFaceCosinesAt60DegNeedAllSix(t *testing.T) {
	res, err := Search(context.Background(), Problem{Viewers: cones(faces, 60), CoverageSensors: 1, MinCoverage: 1, Evaluate: always})
	if err != nil {
		t.Fatal(err)
	}
	if res.Best == nil || len(res.Best.Subset) != 6 || res.Evaluated != 1 {
		t.Fatalf("60° cones: best %+v, %d evaluations; want all six after one", res.Best, res.Evaluated)
	}
}

// tilted is a small candidate set: face normals and face normals tilted by
// 30° toward a neighbour.
func tilted() []r3.Vec {
	t := math.Pi / 6
	s, c := math.Sincos(t)
	return []r3.Vec{{X: 1}, {X: -c, Y: s}, {Y: 1}, {Y: -c, Z: -s}, {Z: 1}, {Z: -1},
		{X: c, Z: s}, {X: -c, Y: -s, Z: 0}, {X: s, Y: -c}}
}

// TestMatchesBruteForce checks the branch and bound against every subset,
// judged by the independent sky.Coverage, with a time target that fails
// whenever candidates 0 and 4 fly together.
func TestMatchesBruteForce(t *testing.T) {
	axes := tilted()
	for _, survive := range []bool{false, true} {
		for _, k := range []int{1, 2} {
			v := cones(axes, 70)
			eval := func(_ context.Context, s []int) (Score, error) {
				sc, _ := always(context.TODO(), s)
				sc.Meets = !(slices.Contains(s, 0) && slices.Contains(s, 4))
				return sc, nil
			}
			target := 0.97
			if k == 2 {
				target = 0.6
			}
			res, err := Search(context.Background(), Problem{Viewers: v, CoverageSensors: k, MinCoverage: target, SurviveOneFailure: survive, Evaluate: eval, Points: 2000, Top: 3})
			if err != nil {
				t.Fatal(err)
			}
			lat, _ := sky.Fibonacci(2000)
			var best []int
			bestMargin := math.Inf(-1)
			feasible := map[string]bool{}
			for mask := 1; mask < 1<<len(v); mask++ {
				var s []int
				var sv []sky.Viewer
				for i := range v {
					if mask&(1<<i) != 0 {
						s = append(s, i)
						sv = append(sv, v[i])
					}
				}
				cov, _ := sky.Coverage(sv, lat)
				c := cov.AtLeast[k]
				if survive {
					c = cov.WorstOneFailed[k]
				}
				sc, _ := eval(context.TODO(), s)
				if c < target || !sc.Meets {
					continue
				}
				feasible[fmt.Sprint(s)] = true
				if best == nil || len(s) < len(best) || (len(s) == len(best) && sc.Margin > bestMargin) {
					best, bestMargin = s, sc.Margin
				}
			}
			var got []int
			if res.Best != nil {
				got = res.Best.Subset
			}
			// The search proves the fewest sensors; at that size it ranks
			// the first Top feasible subsets it meets (most coverage first),
			// so its best must be feasible and of the brute force's size.
			if len(got) != len(best) || !feasible[fmt.Sprint(got)] {
				t.Errorf("k=%d survive=%v: search %v, brute force fewest %v", k, survive, got, best)
			}
			for _, a := range res.Alternatives {
				if len(a.Subset) != len(best) || !feasible[fmt.Sprint(a.Subset)] {
					t.Errorf("k=%d survive=%v: alternative %v is not a feasible subset of the fewest size", k, survive, a.Subset)
				}
			}
			t.Logf("k=%d survive=%v: best %v, %d evaluated, %d nodes, %d pruned", k, survive, got, res.Evaluated, res.Visited, res.Pruned)
		}
	}
}

func TestRefusesTooManyCandidates(t *testing.T) {
	v := make([]sky.Viewer, MaxCandidates+1)
	if _, err := Search(context.Background(), Problem{Viewers: v, Evaluate: always}); err == nil {
		t.Error("31 candidates accepted")
	}
}

// The lattice's share of a spherical cap is within Resolution of the closed
// form (1 − cos θ)/2 for random caps, and 1/n would claim too much: the
// worst cap error at 65 536 points is many lattice points.
func TestResolutionBoundsCapError(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, n := range []int{1024, 4096, 16384, 65536} {
		lat, err := sky.Fibonacci(n)
		if err != nil {
			t.Fatal(err)
		}
		worst := 0.0
		for range 300 {
			z := 2*rng.Float64() - 1
			φ := 2 * math.Pi * rng.Float64()
			r := math.Sqrt(1 - z*z)
			θ := math.Pi * rng.Float64()
			c, err := sky.Coverage([]sky.Viewer{sky.NewCone(r3.Vec{X: r * math.Cos(φ), Y: r * math.Sin(φ), Z: z}, θ)}, lat)
			if err != nil {
				t.Fatal(err)
			}
			worst = max(worst, math.Abs(c.AtLeast[1]-(1-math.Cos(θ))/2))
		}
		if worst > Resolution(n) {
			t.Errorf("n = %d: worst cap error %.2e above the resolution %.2e", n, worst, Resolution(n))
		}
		if n == 65536 && worst < 10.0/float64(n) {
			t.Errorf("n = %d: worst cap error %.2e is under 10 lattice points", n, worst)
		}
		t.Logf("n = %d: worst cap error %.2e = %.2f n^(-3/4), resolution %.2e", n, worst, worst*math.Pow(float64(n), 0.75), Resolution(n))
	}
}

// Two mirror-image subsets (axes x → −x about a mirror-symmetric pair) see
// the same share of the sky (closed form: symmetry), but the lattice is not
// mirror-symmetric and counts them a few points apart. That is below its
// resolution: they tie on coverage and the lower p95 error ranks first, also
// when only one alternative is asked for (the search took the first feasible
// subset in coverage order and stopped).
func TestCoverageBelowResolutionTiesAndP95Decides(t *testing.T) {
	s, c := math.Sincos(40 * math.Pi / 180)
	axes := []r3.Vec{{Z: 1}, {Z: -1}, {X: s, Y: 0.3, Z: c}, {X: -s, Y: 0.3, Z: c}}
	v := cones(axes, 50)
	lat, _ := sky.Fibonacci(DefaultPoints)
	cov := func(s []int) float64 {
		var sv []sky.Viewer
		for _, i := range s {
			sv = append(sv, v[i])
		}
		r, _ := sky.Coverage(sv, lat)
		return r.AtLeast[1]
	}
	a, b := []int{0, 1, 2}, []int{0, 1, 3}
	ca, cb := cov(a), cov(b)
	if ca == cb || math.Abs(ca-cb) >= Resolution(DefaultPoints) {
		t.Fatalf("the mirror pair's lattice coverages %.6f and %.6f do not differ below the resolution", ca, cb)
	}
	// The subset the lattice counts lower flies the better p95.
	lower := a
	if cb < ca {
		lower = b
	}
	eval := func(_ context.Context, s []int) (Score, error) {
		ok := slices.Equal(s, a) || slices.Equal(s, b)
		p95 := 5.0
		if slices.Equal(s, lower) {
			p95 = 3
		}
		return Score{Meets: ok, Margin: 0.1, P95Deg: p95}, nil
	}
	for _, top := range []int{1, 5} {
		res, err := Search(context.Background(), Problem{Viewers: v, CoverageSensors: 1, MinCoverage: 0.2, Evaluate: eval, Top: top})
		if err != nil {
			t.Fatal(err)
		}
		if res.Best == nil || !slices.Equal(res.Best.Subset, lower) {
			t.Errorf("top %d: best %+v, want %v (coverage %.6f against %.6f: a tie; p95 3° against 5°)", top, res.Best, lower, cov(lower), max(ca, cb))
			continue
		}
		if top == 5 && (len(res.Alternatives) != 2 || res.Alternatives[0].CoverageClass != res.Alternatives[1].CoverageClass) {
			t.Errorf("top 5: alternatives %+v, want the pair in one coverage class", res.Alternatives)
		}
	}
}

// A search stopped by MaxEvaluations before any subset met the targets is
// not complete, and says how many coverage-passing subsets it left untried:
// with those it adds up to what the full search simulates.
func TestStoppedSearchCountsWhatItLeft(t *testing.T) {
	never := func(_ context.Context, s []int) (Score, error) { return Score{Margin: -1, P95Deg: 1}, nil }
	p := Problem{Viewers: cones(tilted(), 70), CoverageSensors: 1, MinCoverage: 0.9, Evaluate: never, Points: 2000}
	full, err := Search(context.Background(), p)
	if err != nil {
		t.Fatal(err)
	}
	if !full.Exhausted || full.Best != nil || full.Untried != 0 {
		t.Fatalf("full search: exhausted %v, best %v, untried %d", full.Exhausted, full.Best, full.Untried)
	}
	p.MaxEvaluations = 5
	cut, err := Search(context.Background(), p)
	if err != nil {
		t.Fatal(err)
	}
	if cut.Exhausted || cut.Evaluated != 5 || cut.UntriedAtLeast || cut.Evaluated+cut.Untried != full.Evaluated {
		t.Errorf("stopped search: exhausted %v, %d simulated + %d untried (at least: %v), full search simulated %d",
			cut.Exhausted, cut.Evaluated, cut.Untried, cut.UntriedAtLeast, full.Evaluated)
	}
}

// The trade-off front treats coverages closer than the lattice's
// resolution as equal, as the ranking does: a subset one lattice point
// ahead on coverage but worse on error is dominated; one a resolution or
// more ahead stays; with resolution 0 the rule is the exact comparison.
func TestFrontTiesCoverageWithinResolution(t *testing.T) {
	const res = 1e-3
	a := Choice{Subset: []int{0, 1}, Coverage: 0.9, Score: Score{P95Deg: 5}}
	b := Choice{Subset: []int{0, 2}, Coverage: 0.9 + res/10, Score: Score{P95Deg: 9}}
	c := Choice{Subset: []int{0, 3}, Coverage: 0.9 + 2*res, Score: Score{P95Deg: 10}}
	d := Choice{Subset: []int{0, 1, 2}, Coverage: 0.99, Score: Score{P95Deg: 2}}
	names := func(cs []Choice) []int {
		var out []int
		for _, ch := range cs {
			out = append(out, ch.Subset[len(ch.Subset)-1]+10*len(ch.Subset))
		}
		return out
	}
	got := names(front([]Choice{a, b, c, d}, res))
	if want := names([]Choice{a, c, d}); !slices.Equal(got, want) {
		t.Errorf("front with resolution %g: %v, want %v (b within the resolution of a, worse error)", res, got, want)
	}
	got = names(front([]Choice{a, b, c, d}, 0))
	if want := names([]Choice{a, b, c, d}); !slices.Equal(got, want) {
		t.Errorf("front with resolution 0: %v, want %v", got, want)
	}
}
