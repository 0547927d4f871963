package albedo

// Physical constants used by the model. They are defined here, not taken from
// another sunsight package, so that albedo depends on gonum alone.
const (
	// EarthRadiusKm is the WGS 84 semi-major axis, used as the radius of the
	// spherical Earth (NIMA TR8350.2, 3rd ed. 2000, table 3.1, from memory).
	EarthRadiusKm = 6378.137

	// SolarIrradiance1AU is the total solar irradiance at 1 AU in W/m²
	// (Kopp & Lean 2011, GRL 38, L01706).
	SolarIrradiance1AU = 1361.0

	// AUKm is the astronomical unit in km (IAU 2012 Resolution B2).
	AUKm = 149597870.700

	// DefaultAlbedo is the design mean albedo (ECSS-E-ST-10-04C (2008),
	// Annex F.5.1; Stephens et al. 2015, Rev. Geophys. 53, give ≈ 0.29).
	DefaultAlbedo = 0.30

	// DefaultCells is the default number of equal-area cells on the visible
	// cap: the fewest that keep the error within 0.5 % for every field of
	// view up to 90° in the worst geometry (400 km, sun at the horizon;
	// TestDefaultResolutionEveryFieldOfView: worst 0.41 %, against 0.69 %
	// with 1000 cells).
	DefaultCells = 2000

	// DefaultRebuildKm is the default radius drift after which the cap geometry
	// is rebuilt (see Config.RebuildKm).
	DefaultRebuildKm = 0.25
)
