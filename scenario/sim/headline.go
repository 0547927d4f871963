package sim

import "math"

// Headline is the one-line summary of a run that tables, sweeps and layout
// searches compare: the nominal unit's figures and, for the primary
// estimator (the first one listed), its validity, gaps and errors. Error
// fields are NaN when no valid estimate was made.
type Headline struct {
	SunlitFraction   float64 `json:"sunlit_fraction"`
	PenumbraFraction float64 `json:"penumbra_fraction"`
	UmbraFraction    float64 `json:"umbra_fraction"`
	Eclipses         int     `json:"eclipses"`
	EclipseMeanMin   float64 `json:"eclipse_mean_min"`
	EclipseMaxMin    float64 `json:"eclipse_max_min"`
	BetaMinDeg       float64 `json:"beta_min_deg"`
	BetaMaxDeg       float64 `json:"beta_max_deg"`
	Seen1            float64 `json:"seen_by_1_fraction"`
	Seen2            float64 `json:"seen_by_2_fraction"`
	Seen3            float64 `json:"seen_by_3_fraction"`
	Estimator        string  `json:"estimator"`
	ValidFraction    float64 `json:"valid_fraction"`
	LongestGapS      float64 `json:"longest_gap_s"`
	P95NoAlbedoDeg   float64 `json:"p95_error_no_albedo_deg"`
	P95AlbedoDeg     float64 `json:"p95_error_albedo_deg"`
	P95AlbedoPartDeg float64 `json:"p95_albedo_part_deg"`
	MaxErrorDeg      float64 `json:"max_error_deg"`
	FalseSunFraction float64 `json:"false_sun_fraction_of_umbra"`
	// UnitsP95Deg is the p95 error reached by 95 % of Monte Carlo units
	// (NaN with a single unit).
	UnitsP95Deg float64 `json:"units_p95_error_deg"`
	// UnitsP95CorrectedDeg is the same after the on-board albedo
	// correction (NaN with a single unit or without an on-board model).
	UnitsP95CorrectedDeg float64 `json:"units_p95_error_onboard_corrected_deg"`
	// OrbitAvgPowerW is the time-average solar-array power over the run
	// (nominal attitude; NaN without panels).
	OrbitAvgPowerW float64 `json:"orbit_average_power_w"`
	// P95CorrectedDeg and P95ResidualPartDeg are the primary estimator's
	// p95 error after the on-board albedo correction and the p95 albedo
	// part it leaves (NaN without an on-board model).
	P95CorrectedDeg    float64 `json:"p95_error_onboard_corrected_deg"`
	P95ResidualPartDeg float64 `json:"p95_residual_albedo_part_deg"`
	// ValidFractionCorrected and LongestGapCorrectedS are its valid share
	// of sunlit time and longest sunlit gap on the corrected readings (NaN
	// without an on-board model).
	ValidFractionCorrected float64 `json:"valid_fraction_onboard_corrected"`
	LongestGapCorrectedS   float64 `json:"longest_gap_onboard_corrected_s"`
	// FilterValidFraction, FilterP95Deg and FilterP95ShadowDeg are the
	// gyro-aided filter's valid share of the run, p95 error over its valid
	// samples and p95 error in eclipse (NaN without a filter).
	FilterValidFraction float64 `json:"filter_valid_fraction_of_run"`
	FilterP95Deg        float64 `json:"filter_p95_error_deg"`
	FilterP95ShadowDeg  float64 `json:"filter_p95_error_in_shadow_deg"`
}

// Headline returns the run's headline figures.
func (r *Result) Headline() Headline {
	u := r.Nominal
	h := Headline{
		SunlitFraction: u.SunlitFraction, PenumbraFraction: u.PenumbraFraction, UmbraFraction: u.UmbraFraction,
		Eclipses: r.EclipseStats.Count, EclipseMeanMin: r.EclipseStats.MeanS / 60, EclipseMaxMin: r.EclipseStats.MaxS / 60,
		BetaMinDeg: u.BetaMinDeg, BetaMaxDeg: u.BetaMaxDeg,
		Seen1: u.SeenAtLeast[1], Seen2: u.SeenAtLeast[2], Seen3: u.SeenAtLeast[3],
		UnitsP95Deg: math.NaN(), UnitsP95CorrectedDeg: math.NaN(), FalseSunFraction: u.FalseSunFraction, OrbitAvgPowerW: math.NaN(),
		P95CorrectedDeg: math.NaN(), P95ResidualPartDeg: math.NaN(), ValidFractionCorrected: math.NaN(), LongestGapCorrectedS: math.NaN(),
		FilterValidFraction: math.NaN(), FilterP95Deg: math.NaN(), FilterP95ShadowDeg: math.NaN(),
	}
	if f := u.Filter; f != nil {
		h.FilterValidFraction, h.FilterP95Deg, h.FilterP95ShadowDeg = f.ValidFraction, f.Err.P95Deg, f.ErrShadow.P95Deg
	}
	if r.Power != nil {
		h.OrbitAvgPowerW = r.Power.MeanW
	}
	if r.EclipseStats.Count == 0 {
		h.EclipseMeanMin, h.EclipseMaxMin = 0, 0
	}
	e := &u.Estimators[0]
	h.Estimator = e.Name
	h.ValidFraction = e.ValidFraction
	h.LongestGapS = e.LongestGapS
	h.P95NoAlbedoDeg = e.ErrNoAlbedo.P95Deg
	h.P95AlbedoDeg = e.ErrAlbedo.P95Deg
	h.P95AlbedoPartDeg = e.AlbedoPart.P95Deg
	h.MaxErrorDeg = e.ErrNoAlbedo.MaxDeg
	if e.ErrAlbedo.N > 0 {
		h.MaxErrorDeg = e.ErrAlbedo.MaxDeg
	}
	if k := e.Corrected; k != nil {
		h.P95CorrectedDeg, h.P95ResidualPartDeg = k.Err.P95Deg, k.ResidualPart.P95Deg
		h.ValidFractionCorrected, h.LongestGapCorrectedS = k.ValidFraction, k.LongestGapS
	}
	if len(r.AcrossUnits) > 0 {
		h.UnitsP95Deg = r.AcrossUnits[0].P95OfUnitP95Deg
		h.UnitsP95CorrectedDeg = r.AcrossUnits[0].P95OfUnitP95CorrectedDeg
	}
	return h
}
