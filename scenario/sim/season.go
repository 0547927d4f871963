package sim

import (
	"errors"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/orbit"
)

// SeasonRequest asks a run for the eclipse-season table of its orbit: one
// row per day (beta angle, eclipse of the day's first orbits) from
// illum.YearTable, with the run's own sun and shadow models.
type SeasonRequest struct {
	// NewPropagator gives the orbit the table follows. It is asked for
	// states from StartS over Days days, so it must hold before the epoch
	// when StartS < 0 (an analytical propagator such as j2-mean keeps a
	// year fast).
	NewPropagator func() orbit.Propagator
	// StartS is the start of the first day, s after the epoch (may be
	// negative); Days the number of rows.
	StartS float64
	Days   int
	// PeriodS is the orbit period: each day's eclipse is searched for over
	// two periods.
	PeriodS float64
}

func (q *SeasonRequest) validate() error {
	switch {
	case q.NewPropagator == nil:
		return errors.New("sim: season table without a propagator")
	case q.Days < 1 || !(q.PeriodS > 0):
		return errors.New("sim: season table needs at least one day and a positive orbit period")
	}
	return nil
}

// season is the eclipse-season table the run was asked for.
func season(cfg *Config) []illum.DayRow {
	q := cfg.Season
	p := q.NewPropagator()
	jd0 := ephem.JulianDateTT(cfg.Epoch)
	g := func(t float64) (r3.Vec, r3.Vec) {
		u, d := cfg.Sun.Position(jd0 + t/86400)
		return p.StateAt(t).R, r3.Scale(d, u)
	}
	normal := func(t float64) r3.Vec {
		st := p.StateAt(t)
		return r3.Cross(st.R, st.V)
	}
	return illum.YearTable(cfg.shadowModel(), g, normal, q.StartS, q.Days, q.PeriodS)
}
