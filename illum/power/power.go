package power

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/spatial/r3"
)

// Panel is one flat solar panel fixed to the body.
type Panel struct {
	Name string
	// Normal is the outward unit normal of the cell side (body axes).
	Normal r3.Vec
	// AreaM2 is the panel area (m²), Efficiency the cell efficiency and
	// PackingFactor the share of the area covered by cells, both in (0, 1].
	AreaM2, Efficiency, PackingFactor float64
	// LitShare, when set, is the share of the panel the sun reaches from a
	// body direction (0 where the body hides it all, 1 where nothing is in
	// the way); nil means nothing is in the way.
	LitShare func(dirBody r3.Vec) float64
}

// Validate checks the panel's numbers.
func (p Panel) Validate() error {
	switch {
	case math.Abs(r3.Norm(p.Normal)-1) > 1e-9:
		return fmt.Errorf("power: panel %q: normal %v is not a unit vector", p.Name, p.Normal)
	case !(p.AreaM2 > 0) || math.IsInf(p.AreaM2, 0):
		return fmt.Errorf("power: panel %q: area %g m²: want > 0", p.Name, p.AreaM2)
	case !(p.Efficiency > 0 && p.Efficiency <= 1):
		return fmt.Errorf("power: panel %q: efficiency %g: want (0, 1]", p.Name, p.Efficiency)
	case !(p.PackingFactor > 0 && p.PackingFactor <= 1):
		return fmt.Errorf("power: panel %q: packing factor %g: want (0, 1]", p.Name, p.PackingFactor)
	}
	return nil
}

// Power returns the panel's power (W) for the sun unit vector sunBody (body
// axes) and the direct irradiance irradiance (W/m², lit fraction included).
func (p *Panel) Power(sunBody r3.Vec, irradiance float64) float64 {
	c := r3.Dot(p.Normal, sunBody)
	if c <= 0 || irradiance <= 0 {
		return 0
	}
	share := 1.0
	if p.LitShare != nil {
		if share = p.LitShare(sunBody); !(share > 0) {
			return 0
		}
	}
	return irradiance * p.AreaM2 * p.Efficiency * p.PackingFactor * c * share
}

// Array is the set of panels flown.
type Array struct {
	Panels []Panel
}

// NewArray checks the panels and returns the array.
func NewArray(panels ...Panel) (*Array, error) {
	if len(panels) == 0 {
		return nil, errors.New("power: no panels")
	}
	for _, p := range panels {
		if err := p.Validate(); err != nil {
			return nil, err
		}
	}
	return &Array{Panels: panels}, nil
}

// Power returns the array's power (W); it allocates nothing.
func (a *Array) Power(sunBody r3.Vec, irradiance float64) float64 {
	var sum float64
	for i := range a.Panels {
		sum += a.Panels[i].Power(sunBody, irradiance)
	}
	return sum
}

// AlbedoPower returns the power (W) the Earth's reflected light gives the
// array: irradiance[i] is the albedo irradiance on panel i's plane (W/m²,
// cosine response over its front hemisphere). It allocates nothing.
func (a *Array) AlbedoPower(irradiance []float64) float64 {
	var sum float64
	for i := range a.Panels {
		if e := irradiance[i]; e > 0 {
			p := &a.Panels[i]
			sum += e * p.AreaM2 * p.Efficiency * p.PackingFactor
		}
	}
	return sum
}
