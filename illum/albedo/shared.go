package albedo

import (
	"fmt"
	"math"
	"sync"

	"gonum.org/v1/gonum/spatial/r3"
)

// sharedTables are the zonal boresight tables of the models of one
// NewTableFactory: one per kind of cone (half-angle and response), built
// at its first use and read by every model afterwards. A table's content
// depends only on the factory's configuration and its cone, so which
// model builds it first does not change any result.
type sharedTables struct {
	mu    sync.Mutex
	cfg   Config
	rKm   float64
	kinds []coneTable
}

// coneTable is the table of one kind of cone, or nil when none can serve it.
type coneTable struct {
	half float64
	resp Response
	tab  *BoresightTable
}

// NewTableFactory returns a factory of models of cfg that read the albedo
// of every whole cone sensor (no Cells, no Plane) from zonal boresight
// tables shared by all the factory's models, built at the first step that
// needs a cone of that half-angle and response, at the orbit radius
// Rₑ + cfg.AltitudeKm; steps more than BoresightSlackKm away from it, and
// the other sensors, take the cell integral. cfg must give a Zonal
// reflectance that never leaves [0, 1] and an altitude (a circular orbit).
// The tables cost about 50–85 MB each (see the package documentation for
// their accuracy); use them for long runs.
func NewTableFactory(cfg Config) (func() (*Model, error), error) {
	z, ok := cfg.Reflectance.(Zonal)
	if !ok || !z.inRange() {
		return nil, fmt.Errorf("albedo: table factory: reflectance %T: the shared tables need a zonal profile inside [0, 1]", cfg.Reflectance)
	}
	if !(cfg.AltitudeKm > 0) {
		return nil, fmt.Errorf("albedo: table factory: config.altitude_km = %g: the shared tables need the altitude of a circular orbit", cfg.AltitudeKm)
	}
	if _, err := New(cfg); err != nil {
		return nil, err
	}
	set := &sharedTables{cfg: cfg, rKm: EarthRadiusKm + cfg.AltitudeKm}
	return func() (*Model, error) {
		m, err := New(cfg)
		if err != nil {
			return nil, err
		}
		m.tabs = set
		return m, nil
	}, nil
}

// table returns the shared table of the cone (half, resp), building it on
// first use, or nil when none can be built.
func (s *sharedTables) table(half float64, resp Response) *BoresightTable {
	s.mu.Lock()
	defer s.mu.Unlock()
	for _, k := range s.kinds {
		if k.half == half && k.resp == resp {
			return k.tab
		}
	}
	m, err := New(s.cfg)
	var tab *BoresightTable
	if err == nil {
		tab, err = NewBoresightTable(m, []float64{s.rKm}, half, resp, DefaultBoresightSunResDeg, DefaultBoresightStepDeg)
	}
	if err != nil {
		tab = nil // the sensor integrates
	}
	s.kinds = append(s.kinds, coneTable{half: half, resp: resp, tab: tab})
	return tab
}

// fromTables fills dst[i] from the shared tables for every sensor they
// serve and marks it in served; it reports whether all were served.
func (m *Model) fromTables(dst []Result, served []bool, rSat, sunDir r3.Vec, r, sunDistKm, jdTT float64, sensors []Sensor) bool {
	all := true
	framed := false
	for i := range sensors {
		sn := &sensors[i]
		served[i] = false
		if sn.Cells != nil || sn.Plane != (r3.Vec{}) || math.Abs(r-m.tabs.rKm) > BoresightSlackKm {
			all = false
			continue
		}
		tab := m.tableFor(sn.HalfAngle, sn.Response)
		if tab == nil {
			all = false
			continue
		}
		if !framed {
			if !tab.Frame(&m.frame, rSat, sunDir, sunDistKm) {
				all = false
				continue
			}
			tab.Season(&m.frame, jdTT)
			framed = true
		}
		dst[i] = tab.At(&m.frame, sn.Normal)
		served[i] = true
	}
	return all
}

// tableFor returns the shared table of a cone, remembered by the model so
// that later steps take no lock.
func (m *Model) tableFor(half float64, resp Response) *BoresightTable {
	for _, k := range m.kinds {
		if k.half == half && k.resp == resp {
			return k.tab
		}
	}
	tab := m.tabs.table(half, resp)
	m.kinds = append(m.kinds, coneTable{half: half, resp: resp, tab: tab})
	return tab
}

// UsesTables reports whether the model reads whole cones from the shared
// zonal tables of NewTableFactory.
func (m *Model) UsesTables() bool { return m.tabs != nil }
