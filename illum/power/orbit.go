package power

import "math"

// Tracker folds the array power sampled on a uniform time grid (in time
// order) into the orbit figures, without storing the samples: it allocates
// nothing after NewTracker.
type Tracker struct {
	step, period, duration float64
	n                      int
	sum, peak              float64 // sum: energy (J)
	cur                    int     // orbit index of the last sample
	curJ                   float64
	orbits                 int
	orbitSumJ, worstJ      float64
	perOrbitW              []float64
	zero                   bool
	zeroStart, longestZero float64
}

// NewTracker starts a tracker for samples every step seconds over a run of
// duration seconds on an orbit of period seconds.
func NewTracker(step, period, duration float64) *Tracker {
	k := &Tracker{step: step, period: period, duration: duration, worstJ: math.Inf(1)}
	if period > 0 && duration > 0 {
		k.perOrbitW = make([]float64, 0, int(duration/period)+1)
	}
	return k
}

// Add records the power p (W) at time t (s). A sample stands for one step,
// the last one only up to the run's end (a sample at the end itself counts
// for nothing), so the average is the energy over the duration.
func (k *Tracker) Add(t, p float64) {
	w := max(0, min(k.step, k.duration-t))
	if k.period > 0 {
		if o := int(math.Floor(t / k.period)); o != k.cur {
			k.closeOrbit()
			k.cur, k.curJ = o, 0
		}
	}
	k.n++
	k.sum += p * w
	k.peak = max(k.peak, p)
	k.curJ += p * w
	switch {
	case p <= 0 && !k.zero:
		k.zero, k.zeroStart = true, t
	case p > 0 && k.zero:
		k.zero = false
		k.longestZero = max(k.longestZero, t-k.zeroStart)
	}
}

func (k *Tracker) closeOrbit() {
	k.orbits++
	k.orbitSumJ += k.curJ
	k.worstJ = min(k.worstJ, k.curJ)
	k.perOrbitW = append(k.perOrbitW, k.curJ/k.period)
}

// Summary is the power over a run.
type Summary struct {
	// MeanW is the time-average power over the run (W), PeakW the highest.
	MeanW, PeakW float64
	// Orbits is the number of whole orbits in the run; OrbitMeanWh and
	// OrbitWorstWh are the mean and the least energy delivered over one of
	// them (Wh), NaN when the run holds no whole orbit.
	Orbits                    int
	OrbitMeanWh, OrbitWorstWh float64
	// PerOrbitW is the mean power of each whole orbit in turn (W): orbit i
	// spans [i·T, (i+1)·T) from the epoch, T the osculating period at the
	// epoch.
	PerOrbitW []float64
	// PeriodS is the orbit period T the orbits are cut by (s).
	PeriodS float64
	// LongestNoPowerS is the longest span with no power at all (s);
	// GapEnergyWh is the energy a constant load of MeanW draws from the
	// battery across it (Wh).
	LongestNoPowerS, GapEnergyWh float64
}

// Finish returns the summary; the tracker must not be fed afterwards.
func (k *Tracker) Finish() Summary {
	if k.period > 0 && float64(k.cur+1)*k.period <= k.duration+k.step/2 && k.n > 0 {
		k.closeOrbit()
	}
	if k.zero {
		k.longestZero = max(k.longestZero, k.duration-k.zeroStart)
		k.zero = false
	}
	s := Summary{MeanW: math.NaN(), OrbitMeanWh: math.NaN(), OrbitWorstWh: math.NaN(), Orbits: k.orbits,
		PeakW: k.peak, LongestNoPowerS: k.longestZero, PerOrbitW: k.perOrbitW, PeriodS: k.period}
	if k.n > 0 && k.duration > 0 {
		s.MeanW = k.sum / k.duration
		s.GapEnergyWh = s.MeanW * k.longestZero / 3600
	}
	if k.orbits > 0 {
		s.OrbitMeanWh = k.orbitSumJ / float64(k.orbits) / 3600
		s.OrbitWorstWh = k.worstJ / 3600
	}
	return s
}
