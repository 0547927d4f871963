package study

import (
	"fmt"
	"os"
	"strings"

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
