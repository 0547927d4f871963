package season

import (
	"fmt"
	"math"
	"time"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/illum"
	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
	"codeberg.org/sunsight/sunsight/scenario/study"
)

// Distribution is the eclipse distribution of a span: per orbit (from one
// orbit noon, the point nearest the sun, to the next), the shadow time
// (penumbra entry to exit) of the eclipses whose middle falls in it.
type Distribution struct {
	// AboveS is the stated duration of the Above counts.
	AboveS float64
	// Orbits counts the complete orbits of the span; WithoutEclipse those
	// with no eclipse, Above those with more than AboveS of shadow.
	Orbits, WithoutEclipse, Above int
	// ShareWithout and ShareAbove are those counts over Orbits.
	ShareWithout, ShareAbove float64
	// LongestS is the longest shadow of one orbit, in the orbit starting
	// LongestAt.
	LongestS  float64
	LongestAt time.Time
	// BinS is the width of the duration bins: bin k holds the orbits with
	// shadow in (k·BinS, (k+1)·BinS]; orbits without eclipse are counted
	// apart.
	BinS   float64
	Months []Month
	// PerOrbit lists each complete orbit: start (s since the epoch),
	// shadow time (s) and the beta angle at its middle (rad).
	PerOrbit []OrbitEclipse
}

// OrbitEclipse is one orbit of the distribution.
type OrbitEclipse struct {
	StartS, EndS, ShadowS, Beta float64
}

// Month is one calendar month (UTC) of the distribution, by orbit start.
type Month struct {
	Start                         time.Time
	Orbits, WithoutEclipse, Above int
	// Counts[k] is the number of orbits in duration bin k.
	Counts []int
	// LongestS is the month's longest shadow of one orbit.
	LongestS float64
}

// binWidthsS are the widths the duration bins may take: the narrowest
// that needs at most maxBins bins for the longest shadow is used (common
// practice, no source).
var binWidthsS = []float64{60, 120, 300, 600, 1200}

const maxBins = 20

// nodeStepS samples the orbit for its noons.
const nodeStepS = 30.0

// Eclipses computes the eclipse distribution of the scenario's orbit over
// spanS seconds from its epoch, on its own propagator, sun and shadow
// models (the event search of the run: 60 s sampling, events refined to
// 1 ms).
func Eclipses(s *scenario.Scenario, spanS, aboveS float64) (Distribution, error) {
	d := Distribution{AboveS: aboveS}
	long, err := CaseScenario(s, 0, spanS)
	if err != nil {
		return d, err
	}
	newProp, err := study.NewPropagator(long)
	if err != nil {
		return d, err
	}
	sun, err := ephem.SunByName(s.SunModel)
	if err != nil {
		return d, fmt.Errorf("sun_model: %w", err)
	}
	jd0 := ephem.JulianDateTT(s.Epoch)
	prop := sim.Rewindable(newProp) // the event search refines back in time
	g := func(t float64) (r3.Vec, r3.Vec) {
		u, dist := sun.Position(jd0 + t/86400)
		return prop.StateAt(t).R, r3.Scale(dist, u)
	}
	ecl := illum.FindEclipsesModel(study.ShadowModel(s), g, 0, spanS, 60)
	// Orbit noons: r·ŝ is largest where v·ŝ goes from positive to
	// negative, found on a forward pass every nodeStepS and placed by
	// linear interpolation (v·ŝ is a sinusoid of the orbit period, nearly
	// straight through its zero: the error is well under a second, and the
	// orbits' edges only sort eclipses centred half an orbit away). The
	// shadow is centred half an orbit from noon, so an eclipse never
	// straddles two orbits.
	np := newProp()
	vs := func(t float64) float64 {
		u, _ := sun.Position(jd0 + t/86400)
		return r3.Dot(np.StateAt(t).V, u)
	}
	var nodes []float64
	prev := vs(0)
	for t := nodeStepS; t <= spanS; t += nodeStepS {
		cur := vs(t)
		if prev > 0 && cur <= 0 {
			nodes = append(nodes, t-nodeStepS+nodeStepS*prev/(prev-cur))
		}
		prev = cur
	}
	bp := newProp()
	k := 0
	for i := 1; i < len(nodes); i++ {
		o := OrbitEclipse{StartS: nodes[i-1], EndS: nodes[i]}
		for k < len(ecl) && mid(ecl[k]) < o.StartS {
			k++
		}
		for j := k; j < len(ecl) && mid(ecl[j]) < o.EndS; j++ {
			o.ShadowS += ecl[j].Duration()
		}
		tm := (o.StartS + o.EndS) / 2
		st := bp.StateAt(tm)
		u, _ := sun.Position(jd0 + tm/86400)
		o.Beta = illum.BetaAngle(st.R, st.V, u)
		d.PerOrbit = append(d.PerOrbit, o)
	}
	for _, o := range d.PerOrbit {
		d.LongestS = max(d.LongestS, o.ShadowS)
	}
	d.BinS = binWidthsS[len(binWidthsS)-1]
	for _, w := range binWidthsS {
		if math.Ceil(d.LongestS/w) <= maxBins {
			d.BinS = w
			break
		}
	}
	d.LongestS = 0
	for _, o := range d.PerOrbit {
		start := s.Epoch.Add(time.Duration(math.Round(o.StartS*1e3)) * time.Millisecond)
		ms := time.Date(start.Year(), start.Month(), 1, 0, 0, 0, 0, time.UTC)
		if n := len(d.Months); n == 0 || !d.Months[n-1].Start.Equal(ms) {
			d.Months = append(d.Months, Month{Start: ms})
		}
		m := &d.Months[len(d.Months)-1]
		d.Orbits++
		m.Orbits++
		if o.ShadowS > m.LongestS {
			m.LongestS = o.ShadowS
		}
		if o.ShadowS > d.LongestS {
			d.LongestS, d.LongestAt = o.ShadowS, start
		}
		switch {
		case o.ShadowS == 0:
			d.WithoutEclipse++
			m.WithoutEclipse++
			continue
		case o.ShadowS > aboveS:
			d.Above++
			m.Above++
		}
		b := max(0, int(math.Ceil(o.ShadowS/d.BinS))-1)
		for len(m.Counts) <= b {
			m.Counts = append(m.Counts, 0)
		}
		m.Counts[b]++
	}
	bins := int(math.Ceil(d.LongestS / d.BinS))
	for i := range d.Months {
		for len(d.Months[i].Counts) < bins {
			d.Months[i].Counts = append(d.Months[i].Counts, 0)
		}
	}
	if d.Orbits > 0 {
		d.ShareWithout = float64(d.WithoutEclipse) / float64(d.Orbits)
		d.ShareAbove = float64(d.Above) / float64(d.Orbits)
	}
	return d, nil
}

func mid(e illum.Eclipse) float64 { return (e.PenumbraStart + e.PenumbraEnd) / 2 }
