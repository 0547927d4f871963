package albedo

import (
	"fmt"
	"math"
	"strings"
	"sync"
)

// sharedTableBytes bounds the uniform tables kept for the process by
// SharedBoresightTable (about nine tables of a 60° cone).
const sharedTableBytes = 64 << 20

// A shared table: a uniform BoresightTable, only read after its build.
type sharedTable interface{ Bytes() int64 }

type tableEntry struct {
	ready chan struct{} // closed once tab and err are set
	tab   sharedTable
	err   error
	used  uint64 // the cache's clock at the last call
	done  bool   // built and counted (set under the cache's lock)
	// keep holds what the key names by address (the responses' tables),
	// so that no other value takes that address while the entry lives.
	keep []any
}

var tableCache = struct {
	sync.Mutex
	m     map[string]*tableEntry
	bytes int64
	clock uint64
}{m: map[string]*tableEntry{}}

// sharedBuild returns the table of key, built by build at the first call
// (later calls, also at once from other goroutines, wait for that build and
// get the same table); at most sharedTableBytes are kept, the least
// recently asked for dropped first, and a table larger than that is not
// kept. A failed build is not kept either. keep are the values the key
// names by address.
func sharedBuild(key string, keep []any, build func() (sharedTable, error)) (sharedTable, error) {
	c := &tableCache
	c.Lock()
	c.clock++
	if e, ok := c.m[key]; ok {
		e.used = c.clock
		c.Unlock()
		<-e.ready
		return e.tab, e.err
	}
	e := &tableEntry{ready: make(chan struct{}), used: c.clock, keep: keep}
	c.m[key] = e
	c.Unlock()

	e.tab, e.err = build()
	close(e.ready)

	c.Lock()
	defer c.Unlock()
	if e.err != nil {
		delete(c.m, key)
		return e.tab, e.err
	}
	e.done = true
	c.bytes += e.tab.Bytes()
	for c.bytes > sharedTableBytes {
		// Drop the least recently asked for table other than this one (a
		// table being built is not yet counted).
		var oldK string
		var old *tableEntry
		for k, x := range c.m {
			if x == e || !x.done {
				continue
			}
			if old == nil || x.used < old.used {
				oldK, old = k, x
			}
		}
		if old == nil {
			c.bytes -= e.tab.Bytes()
			delete(c.m, key)
			break
		}
		c.bytes -= old.tab.Bytes()
		delete(c.m, oldK)
	}
	return e.tab, nil
}

// keyWriter builds a cache key from the bits of the values a table depends
// on.
type keyWriter struct{ strings.Builder }

func (w *keyWriter) float(x float64) { fmt.Fprintf(w, "%x,", math.Float64bits(x)) }

// modelKey starts a key with what a uniform model gives a table: the
// albedo, the cell count and the scan.
func modelKey(kind string, m *Model, u Uniform) *keyWriter {
	w := &keyWriter{}
	fmt.Fprintf(w, "%s|%d|%t|", kind, m.n, m.fullScan)
	w.float(u.Albedo)
	return w
}

// SharedBoresightTable is NewBoresightTable for a model of uniform albedo,
// kept for the process: a later call with the same albedo, cell count,
// radii, cone, response and resolution returns the same table, built once
// (a table is only read after its build, so runs on several goroutines can
// share it, and its numbers do not depend on which run built it). The many
// short runs of a season or a sweep over one orbit so build their tables
// once. At most 64 MiB of tables are kept, the least recently asked for
// dropped first; a model of another reflectance
// gets a table of its own (NewBoresightTable).
func SharedBoresightTable(m *Model, radiiKm []float64, half float64, resp Response, resDeg, stepDeg float64) (*BoresightTable, error) {
	if m == nil {
		return NewBoresightTable(m, radiiKm, half, resp, resDeg, stepDeg)
	}
	u, ok := m.refl.(Uniform)
	if !ok {
		return NewBoresightTable(m, radiiKm, half, resp, resDeg, stepDeg)
	}
	w := modelKey("boresight", m, u)
	for _, r := range radiiKm {
		w.float(r)
	}
	w.float(half)
	w.float(resDeg)
	w.float(stepDeg)
	// A response is a pointer to its table: the same response, the same
	// key (the entry keeps the table, so the address is not reused).
	fmt.Fprintf(w, "%p|", resp.table)
	t, err := sharedBuild(w.String(), []any{resp.table}, func() (sharedTable, error) {
		return NewBoresightTable(m, radiiKm, half, resp, resDeg, stepDeg)
	})
	if err != nil {
		return nil, err
	}
	return t.(*BoresightTable), nil
}
