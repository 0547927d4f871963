package scenario

import (
	"fmt"
	"math"
	"strings"

	"gonum.org/v1/gonum/spatial/r3"
)

// filePanel is one solar panel entry of body.panels.
type filePanel struct {
	Name          string    `yaml:"name"`
	Face          string    `yaml:"face,omitempty"`
	Normal        []float64 `yaml:"normal,omitempty"`
	PositionM     []float64 `yaml:"position_m"`
	SizeM         []float64 `yaml:"size_m,omitempty"`
	AreaM2        *float64  `yaml:"area_m2"`
	Efficiency    *float64  `yaml:"efficiency"`
	PackingFactor *float64  `yaml:"packing_factor"`
}

// Panel is a flat solar panel fixed to the body: the outward normal of its
// cell side, where its centre sits (body axes, m; the centre of its face on
// the bus outline unless given), its area (m²), cell efficiency and packing
// factor (share of the area covered by cells). The body and the
// obstructions shade it as they shade a sensor at its centre; with its side
// lengths given (SizeM) it is a rectangle sampled at 8 × 8 points, shaded
// in part, and it shades the other panels.
type Panel struct {
	Name      string
	Face      string // "+X" …, empty when the normal was given
	Normal    r3.Vec
	PositionM r3.Vec
	AreaM2    float64
	// SizeM is the side lengths (m) along the plate axes u and v
	// (sky.PlateAxes: u the body axis least aligned with the normal, in the
	// plane; v = normal × u); zero when not given.
	SizeM         [2]float64
	Efficiency    float64
	PackingFactor float64
}

func (r *resolver) panels(list []filePanel) []Panel {
	var out []Panel
	names := map[string]bool{}
	for i := range list {
		p := fmt.Sprintf("body.panels[%d]", i)
		f := &list[i]
		if f.Name == "" || names[f.Name] {
			r.fail(p+".name", "value %q is empty or used twice; allowed a distinct panel name", f.Name)
		}
		names[f.Name] = true
		pn := Panel{Name: f.Name}
		switch {
		case (f.Face == "") == (f.Normal == nil):
			r.fail(p+".face", "value gives %s; allowed exactly one of face or normal", map[bool]string{true: "both face and normal", false: "neither face nor normal"}[f.Face != ""])
		case f.Face != "":
			n, ok := parseAxis(f.Face)
			if !ok {
				r.fail(p+".face", "value %q is unknown; allowed %s", f.Face, strings.Join(faces, ", "))
				break
			}
			f.Face = strings.ToUpper(f.Face)
			pn.Face, pn.Normal = f.Face, n
		default:
			n := r.vec(p+".normal", f.Normal, r3.Vec{})
			if r3.Norm(n) < 1e-9 {
				r.fail(p+".normal", "value is the zero vector; allowed a non-zero direction [x, y, z]")
				break
			}
			pn.Normal = r3.Unit(n)
		}
		if f.SizeM != nil {
			r.panelSize(p, f, &pn)
		}
		if f.AreaM2 == nil {
			r.fail(p+".area_m2", "value is missing; allowed the panel area in m² (> 0), or size_m [u, v] in m")
		} else {
			pn.AreaM2 = *f.AreaM2
			if !positiveRange.Holds(pn.AreaM2) || math.IsInf(pn.AreaM2, 0) {
				r.fail(p+".area_m2", "value %g is out of range; allowed an area > 0 m²", pn.AreaM2)
			}
		}
		if f.Efficiency == nil {
			r.fail(p+".efficiency", "value is missing; allowed the cell efficiency in (0, 1], for example 0.28")
		} else {
			pn.Efficiency = *f.Efficiency
			r.rangeCheck(p+".efficiency", pn.Efficiency, openFraction, ", a fraction (29.5 % is 0.295)")
		}
		pn.PackingFactor = setDefault(&f.PackingFactor, 1)
		r.rangeCheck(p+".packing_factor", pn.PackingFactor, openFraction, " (1 = the area is cell area)")
		if r3.Norm(pn.Normal) > 0 {
			r.placePanel(p, f, &pn)
		}
		out = append(out, pn)
	}
	return out
}

// panelSize reads size_m: two side lengths > 0 (m); the area follows from
// them when area_m2 is left out and must agree with them when given.
func (r *resolver) panelSize(p string, f *filePanel, pn *Panel) {
	if len(f.SizeM) != 2 {
		r.fail(p+".size_m", "value has %d numbers; allowed two side lengths [u, v] in m", len(f.SizeM))
		return
	}
	for k, v := range f.SizeM {
		if !sideRange.Holds(v) {
			r.fail(fmt.Sprintf("%s.size_m[%d]", p, k), "value %g is out of range; allowed a side length in %s m", v, sideRange)
			return
		}
	}
	pn.SizeM = [2]float64{f.SizeM[0], f.SizeM[1]}
	a := f.SizeM[0] * f.SizeM[1]
	switch {
	case f.AreaM2 == nil:
		f.AreaM2 = &a
	case math.Abs(*f.AreaM2-a) > 1e-6*a:
		r.fail(p+".area_m2", "value %g differs from the size_m product %g m²; allowed one of them, or both agreeing", *f.AreaM2, a)
	}
}

// placePanel sets a panel's centre: given, else the centre of its face or
// where its normal leaves the bus outline; without an outline the body
// origin, refused when obstructions are traced from it.
func (r *resolver) placePanel(p string, f *filePanel, pn *Panel) {
	h := r.half
	if f.PositionM != nil {
		pn.PositionM = r.vec(p+".position_m", f.PositionM, r3.Vec{})
		q := pn.PositionM
		if h != (r3.Vec{}) && math.Abs(q.X) < h.X-surfaceTolM && math.Abs(q.Y) < h.Y-surfaceTolM && math.Abs(q.Z) < h.Z-surfaceTolM {
			r.fail(p+".position_m", "value %v lies inside the bus outline (half extents %.4g, %.4g, %.4g m); allowed a point on a face or outside it, or leave position_m out to place the panel at its face centre",
				f.PositionM, h.X, h.Y, h.Z)
		}
		return
	}
	switch {
	case h != (r3.Vec{}) && pn.Face != "":
		n := pn.Normal
		pn.PositionM = r3.Vec{X: n.X * h.X, Y: n.Y * h.Y, Z: n.Z * h.Z}
	case h != (r3.Vec{}):
		pn.PositionM = exitPoint(pn.Normal, h)
	case r.obstructed:
		r.fail(p+".position_m", "value is missing while body.obstructions are traced from each panel's centre; allowed position_m [x, y, z] in metres, or body.form_factor / body.size_m to place panels at their face centres")
	}
	f.PositionM = []float64{pn.PositionM.X, pn.PositionM.Y, pn.PositionM.Z}
}
