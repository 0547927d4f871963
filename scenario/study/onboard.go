package study

import (
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/scenario"
)

// OnboardNote says in plain words what the corrected figures of a run with
// an on-board albedo model (albedo.onboard) mean, for the summary, the JSON
// record and the report; "" without one. A correction by the truth's own
// model is perfect by construction and the note says so. It ends saying
// which estimate the targets judge (targets.judge).
func OnboardNote(s *scenario.Scenario) string {
	ob := s.Albedo.Onboard
	if ob == nil {
		return ""
	}
	var text string
	switch {
	case ob.Model == scenario.AlbedoNone:
		text = "On-board model none: nothing is subtracted, so the corrected figures equal the uncorrected ones."
	case s.Albedo.SameModel(*ob):
		text = "the on-board model is the truth's own model (" + ob.Label() + "): the correction is perfect by construction. " +
			"What it leaves comes only from the sensors (gain mismatch, ADC rounding, saturation, thresholds), " +
			"not from a model error; a flight model never matches the real Earth this well."
	default:
		text = "On-board " + ob.Label() + " against the truth's " + s.Albedo.Label() + ": the residual is the error this on-board model leaves " +
			"when the Earth reflects as the truth's model says; the truth is a model too."
	}
	text += " The prediction uses the true position and attitude (no navigation error); the cosine sensors are corrected"
	if twoAxisIn(s.Body.Sensors) {
		text += ", the two-axis sensors pass uncorrected"
	}
	text += ". "
	if s.Targets.Judge == scenario.JudgeOnboardCorrected {
		return text + "Targets judge the on-board corrected estimate (targets.judge: " + scenario.JudgeOnboardCorrected + ")."
	}
	return text + "Targets judge the uncorrected estimate (targets.judge: " + scenario.JudgeUncorrected + ")."
}

// twoAxisIn reports whether a layout has a two-axis sensor.
func twoAxisIn(list []scenario.Sensor) bool {
	for _, sc := range list {
		if info, ok := sensor.LookupKind(sc.Kind); ok && info.TwoAxis {
			return true
		}
	}
	return false
}
