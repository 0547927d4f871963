package review

import (
	"codeberg.org/sunsight/sunsight/plots"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// onboardModel is the models-table row of the on-board albedo correction.
const onboardModel = "the flight software subtracts the on-board model's albedo, predicted on the true position and attitude, from each cosine reading in signal units with the nominal gain (s − E/S_ref); two-axis sensors pass uncorrected"

// onboardTable sets the estimators on the readings corrected by the
// on-board albedo model (albedo.onboard) beside the uncorrected ones, with
// what the residual means (study.OnboardNote). It is absent without an
// on-board model.
func onboardTable(s *scenario.Scenario, res *sim.Result) (plots.Table, bool) {
	ob := s.Albedo.Onboard
	if ob == nil {
		return plots.Table{}, false
	}
	t := plots.Table{Title: "On-board albedo correction (on-board " + ob.Label() + "; truth " + s.Albedo.Label() + ")",
		Header: []string{"estimator", "valid (% of sunlit)", "valid corrected (% of sunlit)", "p95 with albedo (deg)",
			"p95 corrected (deg)", "albedo part p95 (deg)", "residual albedo part p95 (deg)"},
		Note: study.OnboardNote(s) + " Residual albedo part: the angle between the corrected estimate and the estimate without albedo."}
	for _, e := range res.Nominal.Estimators {
		k := e.Corrected
		if k == nil {
			continue
		}
		t.Rows = append(t.Rows, []string{e.Name, pct(e.ValidFraction), pct(k.ValidFraction), num(e.ErrAlbedo.P95Deg, 2),
			num(k.Err.P95Deg, 2), num(e.AlbedoPart.P95Deg, 2), num(k.ResidualPart.P95Deg, 2)})
	}
	return t, true
}
