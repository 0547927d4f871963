package albedo

import (
	"math"
	"strconv"
	"strings"
	"sync"
)

// sharedBoresightBytes bounds the uniform boresight tables kept for the
// process by SharedBoresightTable (about nine tables of a 60° cone).
const sharedBoresightBytes = 64 << 20

// boresightKey is what a uniform boresight table depends on: the albedo,
// the cell count and scan of the model, the radii, the cone, its response
// and the grid resolution (NewBoresightTable).
type boresightKey struct {
	albedo          float64
	cells           int
	fullScan        bool
	radii           string // the radii's bits
	half            float64
	resp            Response
	resDeg, stepDeg float64
}

type boresightEntry struct {
	ready chan struct{} // closed once tab and err are set
	tab   *BoresightTable
	err   error
	used  uint64 // the cache's clock at the last call
	done  bool   // built and counted (set under the cache's lock)
}

var boresightCache = struct {
	sync.Mutex
	m     map[boresightKey]*boresightEntry
	bytes int64
	clock uint64
}{m: map[boresightKey]*boresightEntry{}}

// SharedBoresightTable is NewBoresightTable for a model of uniform albedo,
// kept for the process: a later call with the same albedo, cell count,
// radii, cone, response and resolution returns the same table, built once
// (a table is only read after its build, so runs on several goroutines can
// share it, and its numbers do not depend on which run built it). The many
// short runs of a season or a sweep over one orbit so build their tables
// once. At most 64 MiB of tables are kept, the least recently asked for
// dropped first; a model of another reflectance gets a table of its own
// (NewBoresightTable).
func SharedBoresightTable(m *Model, radiiKm []float64, half float64, resp Response, resDeg, stepDeg float64) (*BoresightTable, error) {
	if m == nil {
		return NewBoresightTable(m, radiiKm, half, resp, resDeg, stepDeg)
	}
	u, ok := m.refl.(Uniform)
	if !ok {
		return NewBoresightTable(m, radiiKm, half, resp, resDeg, stepDeg)
	}
	var b strings.Builder
	for _, r := range radiiKm {
		b.WriteString(strconv.FormatUint(math.Float64bits(r), 16))
		b.WriteByte(',')
	}
	key := boresightKey{albedo: u.Albedo, cells: m.n, fullScan: m.fullScan, radii: b.String(), half: half, resp: resp, resDeg: resDeg, stepDeg: stepDeg}
	c := &boresightCache
	c.Lock()
	c.clock++
	if e, ok := c.m[key]; ok {
		e.used = c.clock
		c.Unlock()
		<-e.ready
		return e.tab, e.err
	}
	e := &boresightEntry{ready: make(chan struct{}), used: c.clock}
	c.m[key] = e
	c.Unlock()

	e.tab, e.err = NewBoresightTable(m, radiiKm, half, resp, resDeg, stepDeg)
	close(e.ready)

	c.Lock()
	defer c.Unlock()
	if e.err != nil {
		delete(c.m, key)
		return e.tab, e.err
	}
	e.done = true
	c.bytes += e.tab.Bytes()
	for c.bytes > sharedBoresightBytes {
		// Drop the least recently asked for table other than this one (a
		// table being built is not yet counted).
		var oldK boresightKey
		var old *boresightEntry
		for k, x := range c.m {
			if x == e || !x.done {
				continue
			}
			if old == nil || x.used < old.used {
				oldK, old = k, x
			}
		}
		if old == nil {
			// This table alone exceeds the bound: it is not kept.
			c.bytes -= e.tab.Bytes()
			delete(c.m, key)
			break
		}
		c.bytes -= old.tab.Bytes()
		delete(c.m, oldK)
	}
	return e.tab, nil
}
