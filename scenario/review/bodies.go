package review

import (
	"codeberg.org/sunsight/sunsight/plots"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// bodiesTable lists each sensor's share of time with the Moon and with the
// lit Earth in its field of view, and the share its blinding rule dropped.
func bodiesTable(res *sim.Result) plots.Table {
	t := plots.Table{Title: "Moon and Earth in the field of view",
		Header: []string{"sensor", "Moon in view (% of time)", "lit Earth in view (% of time)", "blinded (% of time)"},
		Note: "Moon: some of its disc inside half-angle + its angular radius of the boresight, not behind the Earth, the mounting face or the body. " +
			"Lit Earth: some of the Earth's disc inside the cone while the point under the spacecraft is in daylight. " +
			"Blinded: readings a digital sensor's blinding rule dropped (no entry: no rule set)."}
	for _, sn := range res.Nominal.Sensors {
		t.Rows = append(t.Rows, []string{sn.Name, pct(sn.MoonInViewFraction), pct(sn.LitEarthInViewFraction), pct(sn.BlindedFraction)})
	}
	return t
}
