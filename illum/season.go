package illum

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"
)

// DayRow is one day of an eclipse-season table.
type DayRow struct {
	Day  int     // 0 for the first day
	T    float64 // s after the epoch at which the day's orbit is examined
	Beta float64 // beta angle at T, rad
	// UmbraS and ShadowS are the umbra time and the total shadow time
	// (penumbra entry to exit) of the first complete eclipse after T, s;
	// both 0 on an eclipse-free day.
	UmbraS, ShadowS float64
	// EclipseFree is set when no eclipse occurs within two orbits after T.
	EclipseFree bool
}

// SeasonStepS is the grid step YearTable samples the geometry with.
const SeasonStepS = 60.0

// YearTable returns one row per day for days days from t0: the beta angle
// from the orbit normal (normal(t), any length, e.g. r × v, so the caller's
// propagator supplies the nodal drift) and the sun direction of g, and the
// duration of the first complete eclipse within two orbit periods (periodS)
// after the day's start, in shadow model m. One orbit stands for the whole
// day, so an eclipse season's first and last day are resolved to a day.
func YearTable(m ShadowModel, g Geometry, normal func(t float64) r3.Vec, t0 float64, days int, periodS float64) []DayRow {
	if days <= 0 || !(periodS > 0) {
		return nil
	}
	rows := make([]DayRow, days)
	f := Finder{Model: m}
	var buf []Eclipse
	for d := range rows {
		t := t0 + float64(d)*86400
		_, rSun := g(t)
		row := DayRow{Day: d, T: t, EclipseFree: true}
		row.Beta = math.Asin(clamp1(r3.Cos(normal(t), rSun)))
		buf = f.Append(buf[:0], g, t, t+2*periodS, SeasonStepS)
		for _, e := range buf {
			row.EclipseFree = false
			if e.Complete() {
				row.ShadowS = e.Duration()
				row.UmbraS = e.UmbraDuration()
				break
			}
		}
		rows[d] = row
	}
	return rows
}

// EclipseFreeDays counts the rows flagged EclipseFree.
func EclipseFreeDays(rows []DayRow) int {
	n := 0
	for _, r := range rows {
		if r.EclipseFree {
			n++
		}
	}
	return n
}
