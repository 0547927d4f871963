package scenario

import (
	"math"
	"reflect"
	"slices"
	"strings"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/internal/numtext"
	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
	"codeberg.org/sunsight/sunsight/plots/figures"
)

// The words and the numeric ranges the loader allows for the file's keys,
// by the file type that declares the key. The resolver checks values
// against these very lists and intervals, and the scenario schema
// (docs/schema/scenario.schema.json) is generated from KeyRules, so an
// editor's first check and sunsight check agree. The words come from the
// model registries.

// Interval is a range of numbers; an infinite end is unbounded.
type Interval struct {
	Lo, Hi         float64
	LoOpen, HiOpen bool
}

func closed(lo, hi float64) Interval { return Interval{Lo: lo, Hi: hi} }

// Holds reports whether v lies in the interval.
func (iv Interval) Holds(v float64) bool {
	return !(v < iv.Lo || v > iv.Hi || iv.LoOpen && v == iv.Lo || iv.HiOpen && v == iv.Hi)
}

// String writes the interval as the messages say it: "[0, 90]", "(0, 1]",
// "> 0".
func (iv Interval) String() string {
	lo, hi := numtext.Format(iv.Lo), numtext.Format(iv.Hi)
	switch {
	case math.IsInf(iv.Hi, 1) && iv.LoOpen:
		return "> " + lo
	case math.IsInf(iv.Hi, 1):
		return "≥ " + lo
	}
	l, h := "[", "]"
	if iv.LoOpen {
		l = "("
	}
	if iv.HiOpen {
		h = ")"
	}
	return l + lo + ", " + hi + h
}

// The ranges of the file's numeric keys.
var (
	tiltRange        = closed(0, 90)
	clockRange       = closed(-360, 360)
	eulerRange       = closed(-360, 360)
	halfAngleRange   = Interval{Lo: 0, Hi: 90, LoOpen: true}
	fractionRange    = closed(0, 1)
	positiveRange    = Interval{Lo: 0, Hi: math.Inf(1), LoOpen: true}
	openFraction     = Interval{Lo: 0, Hi: 1, LoOpen: true}
	errorRange       = closed(0, 10)
	misalignRange    = closed(0, 90)
	p95Range         = Interval{Lo: 0, Hi: 180, LoOpen: true}
	boundRange       = Interval{Lo: 0, Hi: 180, LoOpen: true, HiOpen: true}
	totalSignalRange = closed(0, 100)
	residualRange    = closed(0, 10)
	arwRange         = closed(0, 100)
	biasRange        = closed(0, 36000)
	biasTimeRange    = Interval{Lo: 0, Hi: 1e8, LoOpen: true}
	filterSigmaRange = Interval{Lo: 0, Hi: 60, LoOpen: true}
	gateSigmaRange   = closed(0, 100)
	toleranceRange   = Interval{Lo: 0, Hi: 90, LoOpen: true}
	spinRateRange    = closed(-360, 360)
	maxRateRange     = Interval{Lo: 0, Hi: 360, LoOpen: true}
	minRateRange     = closed(0, 360)
	slewRange        = Interval{Lo: 0, Hi: 90, LoOpen: true}
	sideRange        = Interval{Lo: 0, Hi: 100, LoOpen: true}
	inclinationRange = closed(0, 180)
	nodeAngleRange   = closed(0, 360)
	offsetRange      = closed(-180, 180)
	altitudeRange    = closed(MinPerigeeAltitudeKm, MaxApogeeAltitudeKm)
	eccentricityRng  = Interval{Lo: 0, Hi: 1, HiOpen: true}
	adcBitsRange     = closed(0, 32)
	seedRange        = closed(0, math.Inf(1))
	atLeastOne       = closed(1, math.Inf(1))
)

// The word lists the resolver checks that no registry holds.
var (
	elementSets       = []string{"mean", "osculating"}
	ltanSolarTimes    = []string{orbit.MeanSolarTime, orbit.ApparentSolarTime}
	eclipseBehaviours = []string{EclipseFly, EclipseHold}
	untilEclipses     = []string{"entry", "exit"}
	obstructionShapes = []string{ShapeRectangle, ShapeCylinder}
	judges            = []string{JudgeUncorrected, JudgeOnboardCorrected}
)

// caseless adds the lower-case spelling of each word (the loader reads
// axes and form factors in either case).
func caseless(words []string) []string {
	out := slices.Clone(words)
	for _, w := range words {
		if l := strings.ToLower(w); l != w {
			out = append(out, l)
		}
	}
	return out
}

// lawChoices is every word some attitude law allows for key.
func lawChoices(key string) []string {
	var out []string
	for _, n := range attitude.LawNames() {
		info, _ := attitude.LookupLaw(n)
		for _, c := range info.Choices[key] {
			if !slices.Contains(out, c) {
				out = append(out, c)
			}
		}
	}
	return out
}

// KeyRule is what the loader allows for one key: one of Words, or a number
// in Range (for a list of numbers: each of them).
type KeyRule struct {
	Words []string
	Range *Interval
}

func words(w []string) KeyRule   { return KeyRule{Words: w} }
func within(iv Interval) KeyRule { return KeyRule{Range: &iv} }

// KeyRules lists, by the file type that declares them (their Go type) and
// their key, the words and ranges the loader allows. A range that depends on
// other keys (coverage_sensors up to the number of sensors) is given by its
// fixed end alone.
func KeyRules() map[reflect.Type]map[string]KeyRule {
	axes := caseless(faces)
	law := words(append(attitude.LawNames(), LawSchedule))
	lawRules := map[string]KeyRule{
		"law": law, "point_axis": words(axes), "align_axis": words(axes), "spin_axis": words(axes),
		"align_to": words(lawChoices("align_to")), "euler_sequence": words(eulerSeqs),
		"roll_offset_deg": within(offsetRange), "pitch_offset_deg": within(offsetRange), "yaw_offset_deg": within(offsetRange),
		"clock_deg": within(clockRange), "euler_deg": within(eulerRange), "rate_deg_s": within(spinRateRange),
		"max_rate_deg_s": within(maxRateRange), "min_rate_deg_s": within(minRateRange),
	}
	errs := map[string]KeyRule{}
	for _, c := range errorKeyRanges {
		errs[c.key] = within(c.iv)
	}
	return map[reflect.Type]map[string]KeyRule{
		reflect.TypeOf(fileScenario{}): {
			"sun_model": words(ephem.SunModelNames()), "shadow": words(illum.ShadowNames()),
			"estimators": words(sensor.EstimatorNames()), "seed": within(seedRange),
		},
		reflect.TypeOf(fileOrbit{}): {
			"propagator": words(orbit.PropagatorNames()), "ltan_solar_time": words(ltanSolarTimes),
			"element_set": words(elementSets), "altitude_km": within(altitudeRange),
			"eccentricity": within(eccentricityRng), "inclination_deg": within(inclinationRange),
			"raan_deg": within(nodeAngleRange), "arg_perigee_deg": within(nodeAngleRange), "mean_anomaly_deg": within(nodeAngleRange),
		},
		reflect.TypeOf(fileLaw{}):      lawRules,
		reflect.TypeOf(fileTimeline{}): {"slew_rate_deg_s": within(slewRange), "slew_accel_deg_s2": within(slewRange)},
		reflect.TypeOf(filePhase{}):    {"during_eclipse": words(eclipseBehaviours)},
		reflect.TypeOf(fileUntil{}): {
			"eclipse": words(untilEclipses), "rate_below_deg_s": within(maxRateRange), "sun_seen_sensors": within(atLeastOne),
		},
		reflect.TypeOf(fileBody{}): {"form_factor": words(caseless(formFactorNames)), "size_m": within(sideRange)},
		reflect.TypeOf(sensorKeys{}): {
			"kind": words(sensor.KindNames()), "face": words(axes), "tilt_toward": words(axes),
			"tilt_deg": within(tiltRange), "clock_deg": within(clockRange), "half_angle_deg": within(halfAngleRange),
			"threshold": within(fractionRange), "full_scale": within(positiveRange), "adc_bits": within(adcBitsRange),
		},
		reflect.TypeOf(fileErrors{}):      errs,
		reflect.TypeOf(fileObstruction{}): {"shape": words(obstructionShapes), "radius_m": within(positiveRange)},
		reflect.TypeOf(filePanel{}): {
			"face": words(axes), "size_m": within(sideRange), "area_m2": within(positiveRange),
			"efficiency": within(openFraction), "packing_factor": within(openFraction),
		},
		reflect.TypeOf(fileAlbedoModel{}): {"model": words(albedo.ModelNames()), "value": within(fractionRange)},
		reflect.TypeOf(fileValidity{}):    {"false_sun_bound_deg": within(boundRange)},
		reflect.TypeOf(fileGate{}):        {"min_total_signal": within(totalSignalRange), "max_residual": within(residualRange)},
		reflect.TypeOf(fileGyroFilter{}): {
			"angle_random_walk_deg_rt_h": within(arwRange), "bias_instability_deg_h": within(biasRange),
			"bias_time_s": within(biasTimeRange), "cosine_sigma": within(fractionRange),
			"start_sigma_deg": within(filterSigmaRange), "valid_sigma_deg": within(filterSigmaRange),
			"gate_sigma": within(gateSigmaRange), "hold_bound_deg": within(boundRange),
		},
		reflect.TypeOf(fileTargets{}): {
			"min_valid_fraction": within(openFraction), "max_error_p95_deg": within(p95Range),
			"max_error_p95_units_deg": within(p95Range), "min_coverage": within(openFraction),
			"coverage_sensors": within(atLeastOne), "min_orbit_average_power_w": within(positiveRange), "judge": words(judges),
		},
		reflect.TypeOf(fileNMinus1{}): {"min_valid_fraction": within(openFraction), "max_error_p95_deg": within(p95Range)},
		reflect.TypeOf(fileBudget{}):  {"tolerance_deg": within(toleranceRange)},
		reflect.TypeOf(fileOutput{}):  {"figures": words(figures.Names())},
	}
}
