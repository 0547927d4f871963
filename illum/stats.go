package illum

import "math"

// Stats summarises a list of eclipses found over the span [T0, T1].
// Shadow counts the penumbra; umbra figures count the umbra only.
type Stats struct {
	SpanS float64
	// Count is the number of eclipses, cut ones included; Complete counts
	// those with both ends inside the span.
	Count, Complete int
	// MeanS and MaxS are over complete eclipses (penumbra entry to exit);
	// TotalS adds every shadowed second in the span.
	MeanS, MaxS, TotalS float64
	// MeanUmbraS and MaxUmbraS are over complete eclipses; TotalUmbraS adds
	// every second in the umbra.
	MeanUmbraS, MaxUmbraS, TotalUmbraS float64
	// ShadowFraction is TotalS / SpanS.
	ShadowFraction float64
	// PerOrbit and PerDay scale the totals to one orbit (of the given
	// period) and to one day of 86 400 s.
	EclipsesPerOrbit, ShadowPerOrbitS float64
	EclipsesPerDay, ShadowPerDayS     float64
	// LongestSunlitS and LongestShadowS are the longest continuous spells
	// in the span, the span's ends counting as ends of a spell.
	LongestSunlitS, LongestShadowS float64
}

// EclipseStats summarises eclipses (in time order, as FindEclipses returns
// them) found over [t0, t1]; periodS is the orbit period used for the
// per-orbit figures (NaN figures when it is not positive).
func EclipseStats(ecl []Eclipse, t0, t1, periodS float64) Stats {
	s := Stats{SpanS: t1 - t0, Count: len(ecl)}
	prevEnd := t0
	for _, e := range ecl {
		d, du := e.Duration(), e.UmbraDuration()
		s.TotalS += d
		s.TotalUmbraS += du
		s.LongestShadowS = max(s.LongestShadowS, d)
		s.LongestSunlitS = max(s.LongestSunlitS, e.PenumbraStart-prevEnd)
		prevEnd = e.PenumbraEnd
		if !e.Complete() {
			continue
		}
		s.Complete++
		s.MeanS += d
		s.MeanUmbraS += du
		s.MaxS = max(s.MaxS, d)
		s.MaxUmbraS = max(s.MaxUmbraS, du)
	}
	s.LongestSunlitS = max(s.LongestSunlitS, t1-prevEnd)
	if s.Complete > 0 {
		s.MeanS /= float64(s.Complete)
		s.MeanUmbraS /= float64(s.Complete)
	}
	if s.SpanS > 0 {
		s.ShadowFraction = s.TotalS / s.SpanS
		s.EclipsesPerDay = float64(s.Count) * 86400 / s.SpanS
		s.ShadowPerDayS = s.TotalS * 86400 / s.SpanS
	}
	s.EclipsesPerOrbit, s.ShadowPerOrbitS = math.NaN(), math.NaN()
	if periodS > 0 && s.SpanS > 0 {
		s.EclipsesPerOrbit = float64(s.Count) * periodS / s.SpanS
		s.ShadowPerOrbitS = s.TotalS * periodS / s.SpanS
	}
	return s
}

// Bin gathers the eclipses that start in one time bin (a day or an orbit).
type Bin struct {
	StartS              float64
	Count               int
	TotalS, MeanS, MaxS float64 // shadow durations (penumbra entry to exit)
	TotalUmbraS         float64
}

// BinEclipses sorts eclipses into n bins of width widthS from t0 by their
// start time (for example widthS = 86400 for per-day figures, or the orbit
// period for per-orbit ones). Eclipses outside the bins are ignored.
func BinEclipses(ecl []Eclipse, t0, widthS float64, n int) []Bin {
	if n <= 0 || !(widthS > 0) {
		return nil
	}
	bins := make([]Bin, n)
	for i := range bins {
		bins[i].StartS = t0 + float64(i)*widthS
	}
	for _, e := range ecl {
		k := int(math.Floor((e.PenumbraStart - t0) / widthS))
		if k < 0 || k >= n {
			continue
		}
		b := &bins[k]
		d := e.Duration()
		b.Count++
		b.TotalS += d
		b.TotalUmbraS += e.UmbraDuration()
		b.MaxS = max(b.MaxS, d)
	}
	for i := range bins {
		if bins[i].Count > 0 {
			bins[i].MeanS = bins[i].TotalS / float64(bins[i].Count)
		}
	}
	return bins
}
