package sensor

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/spatial/r3"
)

// The least-squares residual is the RMS of m − N·x at the fit: checked
// against gonum's QR least-squares solve of the same system (an independent
// solver), with five lit sensors of a tilted layout and one reading
// perturbed; the total signal is the sum of the readings used.
func TestLeastSquaresResidualAndSignal(t *testing.T) {
	var ss []Sensor
	dirs := []r3.Vec{{X: 1}, {Y: 1}, {Z: 1}, r3.Unit(r3.Vec{X: 1, Y: 1, Z: 1}), r3.Unit(r3.Vec{X: 1, Y: -0.2, Z: 0.5}), {X: -1}}
	for i, d := range dirs {
		m, _ := VectorMount(d, r3.Vec{})
		c, err := NewCosine(CosineSpec{Name: string(rune('a' + i)), Mount: m, HalfAngle: math.Pi / 2, Threshold: 0.01})
		if err != nil {
			t.Fatal(err)
		}
		ss = append(ss, c)
	}
	arr, err := NewArray(ss...)
	if err != nil {
		t.Fatal(err)
	}
	sun := r3.Unit(r3.Vec{X: 0.6, Y: 0.5, Z: 0.7})
	r := make([]Reading, len(ss))
	arr.Read(r, sun, SolarConstant, nil, nil)
	e := LeastSquares{}.Estimate(arr, r)
	if !e.Valid || e.Residual > 1e-9 || angle(e.Dir, sun) > 1e-9 {
		t.Fatalf("ideal readings: valid %v residual %g error %g", e.Valid, e.Residual, angle(e.Dir, sun))
	}
	r[4].Signal += 0.1 // an albedo-like excess on one sensor
	e = LeastSquares{}.Estimate(arr, r)
	var used []int
	sum := 0.0
	for i := range r {
		if r[i].Valid {
			used = append(used, i)
			sum += r[i].Signal
		}
	}
	A := mat.NewDense(len(used), 3, nil)
	b := mat.NewVecDense(len(used), nil)
	for k, i := range used {
		n := arr.Sensors()[i].Mount().Boresight()
		A.SetRow(k, []float64{n.X, n.Y, n.Z})
		b.SetVec(k, r[i].Signal)
	}
	var x, res mat.VecDense
	if err := x.SolveVec(A, b); err != nil {
		t.Fatal(err)
	}
	res.MulVec(A, &x)
	res.SubVec(b, &res)
	want := mat.Norm(&res, 2) / math.Sqrt(float64(len(used)))
	if math.Abs(e.Residual-want) > 1e-12 || math.Abs(e.Signal-sum) > 1e-12 || e.N != len(used) {
		t.Errorf("residual %.12f (gonum %.12f), signal %.6f (sum %.6f), N %d of %d", e.Residual, want, e.Signal, sum, e.N, len(used))
	}
	// The gate refuses by each of its three tests, and lets the fit through otherwise.
	for _, c := range []struct {
		g    Gate
		pass bool
	}{{Gate{}, true}, {Gate{MinSensors: len(used)}, true}, {Gate{MinSensors: len(used) + 1}, false},
		{Gate{MinSignal: sum}, true}, {Gate{MinSignal: sum + 1e-9}, false},
		{Gate{MaxResidual: want * 1.001}, true}, {Gate{MaxResidual: want * 0.999}, false}} {
		if got := c.g.Apply(e).Valid; got != c.pass {
			t.Errorf("gate %+v: valid %v, want %v", c.g, got, c.pass)
		}
	}
	if (Gate{MinSignal: -1}).Validate() == nil || (Gate{MaxResidual: math.Inf(1)}).Validate() == nil {
		t.Error("a bad gate validates")
	}
}

// Two-axis residual: the RMS chord between each direction and the mean;
// two sensors 2δ apart about the sun give chords of 2 sin(δ/2) each
// (closed form).
func TestTwoAxisResidual(t *testing.T) {
	const δ = 0.02
	var ss []Sensor
	for i, d := range []r3.Vec{{Z: 1}, {Z: 1}} {
		m, _ := VectorMount(d, r3.Vec{X: 1})
		dg, err := NewDigital(DigitalSpec{Name: string(rune('a' + i)), Mount: m, HalfAngle: 1, Sigma: 0.01})
		if err != nil {
			t.Fatal(err)
		}
		ss = append(ss, dg)
	}
	arr, _ := NewArray(ss...)
	r := []Reading{{Valid: true, Signal: 0.9, Dir: r3.Vec{X: math.Sin(δ), Z: math.Cos(δ)}}, {Valid: true, Signal: 0.8, Dir: r3.Vec{X: -math.Sin(δ), Z: math.Cos(δ)}}}
	e := TwoAxis{}.Estimate(arr, r)
	if want := 2 * math.Sin(δ/2); math.Abs(e.Residual-want) > 1e-12 || math.Abs(e.Signal-1.7) > 1e-12 {
		t.Errorf("residual %.12f, want %.12f; signal %g, want 1.7", e.Residual, want, e.Signal)
	}
}
