package orbit

import (
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// The engine asks for the Restarter capability: the integrator has it, the
// closed-form propagators do not, and a restart from the initial state
// retraces the same orbit (the same integration, to 1 mm after an orbit).
func TestRestarterCapability(t *testing.T) {
	el := Elements{SemiMajorAxisKm: 6928.137, Eccentricity: 0.001, Inclination: 1.7, RAAN: 0.3}
	for _, p := range []Propagator{NewTwoBody(el), NewJ2Mean(el)} {
		if _, ok := p.(Restarter); ok {
			t.Errorf("%T claims to restart", p)
		}
	}
	n, err := NewJ2Numeric(el, NumericOptions{})
	if err != nil {
		t.Fatal(err)
	}
	var r Restarter = n
	q, err := r.Restart(r.InitialState())
	if err != nil {
		t.Fatal(err)
	}
	if a, b := n.StateAt(5400), q.StateAt(5400); r3.Norm(r3.Sub(a.R, b.R)) > 1e-6 {
		t.Errorf("restarted state %v, original %v", b, a)
	}
}

// Every registered propagator has a name, a model, a source and a builder
// (or starts from a TLE or an ephemeris file).
func TestPropagatorRegistry(t *testing.T) {
	for _, p := range Propagators() {
		if p.Name == "" || p.Model == "" || p.Source == "" || (p.New == nil && !p.FromTLE && !p.FromFile) {
			t.Errorf("entry %+v", p)
		}
	}
	if _, err := LookupPropagator("nope"); err == nil {
		t.Error("unknown propagator accepted")
	}
}
