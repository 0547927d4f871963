package orbit

import "math"

// vec6 is a position–velocity pair packed for the integrator.
type vec6 [6]float64

// deriv6 is the right-hand side y' = f(t, y) of a six-dimensional ODE.
type deriv6 func(t float64, y *vec6, dy *vec6)

// Dormand–Prince 5(4) coefficients, Dormand & Prince 1980, J. Comput. Appl.
// Math. 6(1) 19–26, Table 2 (RK5(4)7M), as printed in Hairer, Nørsett &
// Wanner, Solving ODEs I, 2nd ed. (1993), Table 5.2 p. 178.
const (
	dpC2, dpC3, dpC4, dpC5 = 1.0 / 5, 3.0 / 10, 4.0 / 5, 8.0 / 9

	dpA21 = 1.0 / 5
	dpA31 = 3.0 / 40
	dpA32 = 9.0 / 40
	dpA41 = 44.0 / 45
	dpA42 = -56.0 / 15
	dpA43 = 32.0 / 9
	dpA51 = 19372.0 / 6561
	dpA52 = -25360.0 / 2187
	dpA53 = 64448.0 / 6561
	dpA54 = -212.0 / 729
	dpA61 = 9017.0 / 3168
	dpA62 = -355.0 / 33
	dpA63 = 46732.0 / 5247
	dpA64 = 49.0 / 176
	dpA65 = -5103.0 / 18656
	dpA71 = 35.0 / 384 // the 5th-order weights b (FSAL: k7 = f(t+h, y1))
	dpA73 = 500.0 / 1113
	dpA74 = 125.0 / 192
	dpA75 = -2187.0 / 6784
	dpA76 = 11.0 / 84

	// Error weights b − b̂.
	dpE1 = 71.0 / 57600
	dpE3 = -71.0 / 16695
	dpE4 = 71.0 / 1920
	dpE5 = -17253.0 / 339200
	dpE6 = 22.0 / 525
	dpE7 = -1.0 / 40

	// Dense output (continuous extension of order 4), Hairer, Nørsett &
	// Wanner 1993 §II.6, coefficients of their code DOPRI5 (contd5).
	dpD1 = -12715105075.0 / 11282082432
	dpD3 = 87487479700.0 / 32700410799
	dpD4 = -10690763975.0 / 1880347072
	dpD5 = 701980252875.0 / 199316789632
	dpD6 = -1453857185.0 / 822651844
	dpD7 = 69997945.0 / 29380423
)

// dopri5 is an adaptive Dormand–Prince 5(4) integrator for one trajectory,
// kept between calls so that a sequence of increasing output times costs
// only the steps between them. It allocates nothing after construction.
type dopri5 struct {
	f          deriv6
	rtol, atol float64
	hmax       float64

	t, h   float64 // start and size of the last accepted step
	y0, y1 vec6    // state at t and t+h
	k1     vec6    // f(t, y0)
	k7     vec6    // f(t+h, y1), FSAL
	cont   [5]vec6 // dense-output polynomial of the last step
	hNext  float64
	// Stage scratch, kept here because the stages are passed by pointer to
	// the right-hand side f, which would otherwise move them to the heap
	// on every step.
	k2, k3, k4, k5, k6, ks, ys, ye vec6
	steps                          int // accepted steps so far
	reject                         int
	// The dense output of the keptSteps steps before the last one, oldest
	// overwritten first (past[n % keptSteps] is the next to go), so a
	// caller going a little back in time is served without integrating
	// again.
	past  [keptSteps]denseStep
	nPast int
}

// keptSteps is the number of earlier steps whose dense output is kept. An
// event search refining a boundary inside its last grid step goes back at
// most two grid steps (a golden-section search over a grazing pass); with a
// step cap of a twentieth of the period and a 60 s grid, 16 steps cover
// that on every orbit above the Earth's surface (common practice, no
// source: sized from the step counts of the integrator's tests).
const keptSteps = 16

// denseStep is one accepted step's dense-output polynomial on [t, t+h].
type denseStep struct {
	t, h float64
	cont [5]vec6
}

func newDopri5(f deriv6, t0 float64, y0 vec6, h0, rtol, atol, hmax float64) *dopri5 {
	d := &dopri5{f: f, rtol: rtol, atol: atol, hmax: hmax}
	d.reset(t0, y0, h0)
	return d
}

// reset starts again at (t0, y0) with trial step h0.
func (d *dopri5) reset(t0 float64, y0 vec6, h0 float64) {
	d.t, d.h = t0, 0
	d.y0, d.y1 = y0, y0
	d.f(t0, &d.y0, &d.k1)
	d.k7 = d.k1
	d.hNext = h0
	for i := range d.cont {
		d.cont[i] = vec6{}
	}
	d.cont[0] = y0
	d.nPast = 0
}

// earliest is the earliest time served without a reset: the start of the
// oldest kept step.
func (d *dopri5) earliest() float64 {
	if d.nPast == 0 {
		return d.t
	}
	if d.nPast < keptSteps {
		return d.past[0].t
	}
	return d.past[d.nPast%keptSteps].t
}

// atPast writes the state at t from the kept step holding it (the first
// whose end is at or after t, the one a forward integration would have
// served t from) and reports whether one holds it.
func (d *dopri5) atPast(t float64, y *vec6) bool {
	n := min(d.nPast, keptSteps)
	for j := n; j >= 1; j-- { // oldest first
		p := &d.past[(d.nPast-j)%keptSteps]
		if t >= p.t && t <= p.t+p.h {
			evalDense(&p.cont, (t-p.t)/p.h, y)
			return true
		}
	}
	return false
}

// step takes one accepted step from t+h (the end of the previous step).
func (d *dopri5) step() {
	// Keep the step being left, then advance the window: the previous end
	// is the new start.
	if d.h > 0 {
		d.past[d.nPast%keptSteps] = denseStep{t: d.t, h: d.h, cont: d.cont}
		d.nPast++
	}
	d.t += d.h
	d.y0 = d.y1
	d.k1 = d.k7
	h := d.hNext
	k2, k3, k4, k5, k6, k7 := &d.k2, &d.k3, &d.k4, &d.k5, &d.k6, &d.ks
	y, y1 := &d.ys, &d.ye
	for {
		if h > d.hmax {
			h = d.hmax
		}
		t, y0, k1 := d.t, &d.y0, &d.k1
		for i := range y {
			y[i] = y0[i] + h*dpA21*k1[i]
		}
		d.f(t+dpC2*h, y, k2)
		for i := range y {
			y[i] = y0[i] + h*(dpA31*k1[i]+dpA32*k2[i])
		}
		d.f(t+dpC3*h, y, k3)
		for i := range y {
			y[i] = y0[i] + h*(dpA41*k1[i]+dpA42*k2[i]+dpA43*k3[i])
		}
		d.f(t+dpC4*h, y, k4)
		for i := range y {
			y[i] = y0[i] + h*(dpA51*k1[i]+dpA52*k2[i]+dpA53*k3[i]+dpA54*k4[i])
		}
		d.f(t+dpC5*h, y, k5)
		for i := range y {
			y[i] = y0[i] + h*(dpA61*k1[i]+dpA62*k2[i]+dpA63*k3[i]+dpA64*k4[i]+dpA65*k5[i])
		}
		d.f(t+h, y, k6)
		for i := range y1 {
			y1[i] = y0[i] + h*(dpA71*k1[i]+dpA73*k3[i]+dpA74*k4[i]+dpA75*k5[i]+dpA76*k6[i])
		}
		d.f(t+h, y1, k7)
		// Error estimate, RMS norm scaled by atol + rtol·max(|y0|, |y1|)
		// (Hairer, Nørsett & Wanner 1993 eq. (4.11) p. 168).
		var sum float64
		for i := range y1 {
			ei := h * (dpE1*k1[i] + dpE3*k3[i] + dpE4*k4[i] + dpE5*k5[i] + dpE6*k6[i] + dpE7*k7[i])
			sc := d.atol + d.rtol*max(math.Abs(y0[i]), math.Abs(y1[i]))
			sum += (ei / sc) * (ei / sc)
		}
		err := math.Sqrt(sum / 6)
		// Step-size rule, Hairer et al. 1993 eq. (4.13) p. 168, safety 0.9,
		// growth limited to [0.2, 5].
		fac := 5.0
		if err > 0 {
			fac = min(5, max(0.2, 0.9*math.Pow(err, -0.2)))
		}
		if err <= 1 {
			for i := range y1 {
				dy := y1[i] - y0[i]
				bspl := h*k1[i] - dy
				d.cont[0][i] = y0[i]
				d.cont[1][i] = dy
				d.cont[2][i] = bspl
				d.cont[3][i] = dy - h*k7[i] - bspl
				d.cont[4][i] = h * (dpD1*k1[i] + dpD3*k3[i] + dpD4*k4[i] + dpD5*k5[i] + dpD6*k6[i] + dpD7*k7[i])
			}
			d.h, d.y1, d.k7 = h, *y1, *k7
			d.hNext = h * fac
			d.steps++
			return
		}
		d.reject++
		h *= min(1, fac)
	}
}

// at writes the state at time t, which must lie in [d.t, d.t+d.h], into y,
// using the dense output: y = c0 + θ(c1 + (1−θ)(c2 + θ(c3 + (1−θ)c4))),
// θ = (t − t_n)/h (Hairer et al. 1993, DOPRI5 contd5).
func (d *dopri5) at(t float64, y *vec6) {
	if d.h == 0 {
		*y = d.y0
		return
	}
	evalDense(&d.cont, (t-d.t)/d.h, y)
}

// evalDense evaluates a step's dense-output polynomial at θ ∈ [0, 1].
func evalDense(c *[5]vec6, θ float64, y *vec6) {
	θ1 := 1 - θ
	for i := range y {
		y[i] = c[0][i] + θ*(c[1][i]+θ1*(c[2][i]+θ*(c[3][i]+θ1*c[4][i])))
	}
}

// advanceTo takes steps until t lies in the last step, then interpolates.
func (d *dopri5) advanceTo(t float64, y *vec6) {
	for t > d.t+d.h {
		d.step()
	}
	d.at(t, y)
}
