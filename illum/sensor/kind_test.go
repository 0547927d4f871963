package sensor

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// Every registered kind builds an ideal sensor from its defaults alone, reports
// its own kind, and sees the sun on its boresight (closed form: normal
// incidence is inside every field of view).
func TestRegisteredKindsBuildFromDefaults(t *testing.T) {
	if len(KindNames()) < 3 {
		t.Fatalf("kinds %v: want at least cosine, digital, quadrant", KindNames())
	}
	m, err := VectorMount(r3.Vec{Z: 1}, r3.Vec{X: 1})
	if err != nil {
		t.Fatal(err)
	}
	for _, name := range KindNames() {
		k, _ := LookupKind(name)
		if k.Doc == "" || k.Source == "" {
			t.Errorf("%s: registry entry needs a doc line and a published source", name)
		}
		p := Params{Num: map[string]float64{}, Text: map[string]string{}}
		for _, q := range k.Params {
			switch q.Type {
			case Number:
				p.Num[q.Key] = q.Default * ScaleOr1(q.Scale)
			case Choice:
				p.Text[q.Key] = q.Choices[0]
			}
		}
		s, err := k.Build(Common{Name: "s", Mount: m, HalfAngle: k.HalfAngleDeg * math.Pi / 180, Threshold: 0.05}, p)
		if err != nil {
			t.Fatalf("%s: %v", name, err)
		}
		if string(s.Kind()) != name {
			t.Errorf("%s: built a sensor of kind %q", name, s.Kind())
		}
		if !s.InFOV(r3.Vec{Z: 1}) {
			t.Errorf("%s: boresight not in the field of view", name)
		}
		if r := s.Read(r3.Vec{Z: 1}, SolarConstant, Albedo{}, nil); !r.Valid {
			t.Errorf("%s: no valid reading at normal incidence: %+v", name, r)
		}
		if IsTwoAxis(s) != k.TwoAxis {
			t.Errorf("%s: IsTwoAxis disagrees with the registry", name)
		}
	}
}

// A key shared by two kinds must have one type; a kind needs a builder.
func TestRegisterRefusesInconsistentEntries(t *testing.T) {
	for _, k := range []KindInfo{
		{Kind: "no-builder", HalfAngleDeg: 60},
		{Kind: KindCosine, HalfAngleDeg: 60, Build: buildCosine},
		{Kind: "retyped", HalfAngleDeg: 60, Build: buildCosine, Params: []Param{{Key: "gap_mm", Type: Choice, Choices: []string{"a"}}}},
		{Kind: "nameless-source", HalfAngleDeg: 60, Build: buildCosine, Sources: []ErrorSource{{}}},
	} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("Register(%q) accepted an inconsistent entry", k.Kind)
				}
			}()
			Register(k)
		}()
		if _, ok := LookupKind(string(k.Kind)); ok && k.Kind != KindCosine {
			t.Errorf("Register(%q) left the entry in the registry", k.Kind)
		}
	}
}

// A measured roll-off becomes the albedo response table cos θ·R(θ)
// (closed form); an ideal cosine has none.
func TestCosineResponseTable(t *testing.T) {
	m, _ := VectorMount(r3.Vec{Z: 1}, r3.Vec{X: 1})
	c, err := NewCosine(CosineSpec{Name: "c", Mount: m, HalfAngle: math.Pi / 2, RollOffAngle: []float64{0, math.Pi / 3}, RollOffRel: []float64{1, 0.5}})
	if err != nil {
		t.Fatal(err)
	}
	inc, rel := c.ResponseTable()
	if len(inc) != 2 || rel[0] != 1 || math.Abs(rel[1]-0.25) > 1e-15 {
		t.Errorf("table %v %v: want [0 π/3] [1 0.25]", inc, rel)
	}
	ideal, _ := NewCosine(CosineSpec{Name: "c", Mount: m, HalfAngle: 1})
	if inc, _ := ideal.ResponseTable(); inc != nil {
		t.Errorf("ideal cosine table %v: want none", inc)
	}
}

// Every registered estimator answers to its registry name and states its
// model and source.
func TestEstimatorRegistryNames(t *testing.T) {
	for _, e := range Estimators() {
		if e.Estimator.Name() != e.Name || e.Model == "" || e.Source == "" {
			t.Errorf("estimator entry %q: estimator says %q, model %q, source %q", e.Name, e.Estimator.Name(), e.Model, e.Source)
		}
	}
}
