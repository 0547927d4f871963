package study

import (
	"fmt"
	"math"
	"os"
	"strings"
	"time"

	"gonum.org/v1/gonum/num/quat"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/scenario/sim"

	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
	"codeberg.org/sunsight/sunsight/orbit/ccsds"
	"codeberg.org/sunsight/sunsight/scenario"
)

func init() {
	lawBuilders[attitude.NameReplay] = buildReplay
}

// ReadAttitudeHistory reads an attitude file: a CCSDS AEM in KVN form, or a
// table time_utc,qx,qy,qz,qw when the name ends in .csv.
func ReadAttitudeHistory(path string) (*ccsds.AEM, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	if strings.HasSuffix(strings.ToLower(path), ".csv") {
		return ccsds.ReadAttitudeCSV(f)
	}
	return ccsds.ReadAEM(f)
}

// buildReplay plays back the attitude file of a replay law.
func buildReplay(s *scenario.Scenario, l scenario.Law, _ uint64, path string) (attitude.Law, error) {
	a, err := ReadAttitudeHistory(l.File)
	if err != nil {
		return nil, fmt.Errorf("%s.file %s: %w", path, l.File, err)
	}
	t := make([]float64, len(a.Times))
	for k, tk := range a.Times {
		t[k] = tk.Sub(s.Epoch).Seconds()
	}
	r, err := attitude.NewReplay(t, a.Q, s.Duration.Seconds())
	if err != nil {
		return nil, fmt.Errorf("%s.file %s: %w", path, l.File, err)
	}
	return r, nil
}

// oemFactory builds the interpolating propagators of an orbit read from an
// OEM, refusing a run outside the file's span.
func oemFactory(s *scenario.Scenario) (func() orbit.Propagator, error) {
	f, err := os.Open(s.Orbit.EphemerisFile)
	if err != nil {
		return nil, fmt.Errorf("orbit.ephemeris_file: %w", err)
	}
	defer f.Close()
	o, err := ccsds.ReadOEM(f)
	if err != nil {
		return nil, fmt.Errorf("orbit.ephemeris_file %s: %w", s.Orbit.EphemerisFile, err)
	}
	if _, err := o.Propagator(s.Epoch, s.Duration.Seconds()); err != nil {
		return nil, fmt.Errorf("orbit.ephemeris_file %s: %w", s.Orbit.EphemerisFile, err)
	}
	return func() orbit.Propagator { p, _ := o.Propagator(s.Epoch, s.Duration.Seconds()); return p }, nil
}

// History is the orbit and attitude a run uses, sampled: the states
// (EME2000) and attitudes (body ← EME2000) of the nominal unit at
// Epoch + k·Step.
type History struct {
	Epoch  time.Time
	Step   float64
	Times  []time.Time
	States []orbit.State
	Q      []quat.Number
}

// MaxHistorySamples bounds an exported history (about 250 MB of text).
const MaxHistorySamples = 2_000_000

// Sample returns the history of a run configuration every step seconds
// over the run (unit 0's attitude draw for a random law).
func Sample(cfg sim.Config, step float64) (History, error) {
	if !(step > 0) {
		return History{}, fmt.Errorf("study: sample step %v s; allowed > 0", step)
	}
	n := int(math.Floor(cfg.Duration/step+1e-9)) + 1
	if n > MaxHistorySamples {
		return History{}, fmt.Errorf("study: %d samples at %g s over %.0f s; allowed at most %d (use a longer step)", n, step, cfg.Duration, MaxHistorySamples)
	}
	law := cfg.Law
	if cfg.LawForUnit != nil {
		law = cfg.LawForUnit(0)
	}
	prop := cfg.NewPropagator()
	jd0 := ephem.JulianDateTT(cfg.Epoch)
	h := History{Epoch: cfg.Epoch, Step: step}
	for k := range n {
		t := float64(k) * step
		st := prop.StateAt(t)
		u, _ := cfg.Sun.Position(jd0 + t/86400)
		h.Times = append(h.Times, cfg.Epoch.Add(time.Duration(math.Round(t*1e9))))
		h.States = append(h.States, st)
		h.Q = append(h.Q, quat.Number(law.Attitude(t, st, u)))
	}
	return h, nil
}
