// Package constcheck pins the physical constants that the physics packages
// keep as their own copies (so each stays a bottom layer with no import of
// another): every copy must equal the one in orbit or ephem.
package constcheck

import (
	"testing"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/orbit"
)

// Earth equatorial radius (WGS 84, 6378.137 km) and total solar irradiance
// at 1 AU (1361 W/m², Kopp & Lean 2011): one value each across packages.
func TestPhysicalConstantsAgree(t *testing.T) {
	for name, v := range map[string]float64{"illum.EarthRadiusKm": illum.EarthRadiusKm, "albedo.EarthRadiusKm": albedo.EarthRadiusKm} {
		if v != orbit.RadiusEarthKm {
			t.Errorf("%s = %v, orbit.RadiusEarthKm = %v", name, v, orbit.RadiusEarthKm)
		}
	}
	if orbit.RadiusEarthKm != 6378.137 {
		t.Errorf("orbit.RadiusEarthKm = %v, WGS 84 a = 6378.137 km", orbit.RadiusEarthKm)
	}
	for name, v := range map[string]float64{"albedo.SolarIrradiance1AU": albedo.SolarIrradiance1AU, "sensor.SolarConstant": sensor.SolarConstant} {
		if v != ephem.SolarIrradiance1AU {
			t.Errorf("%s = %v, ephem.SolarIrradiance1AU = %v", name, v, ephem.SolarIrradiance1AU)
		}
	}
	if ephem.SolarIrradiance1AU != 1361 {
		t.Errorf("ephem.SolarIrradiance1AU = %v, Kopp & Lean 2011: 1361 W/m²", ephem.SolarIrradiance1AU)
	}
}
