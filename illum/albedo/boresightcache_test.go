package albedo

import (
	"sync"
	"testing"
)

// The same uniform table is built once and shared, also when asked for at
// once from several goroutines; another albedo, cone or radius gets its
// own; the shared table holds the numbers of a table built on its own; and
// the cache keeps at most its bound, dropping the least recently asked for.
func TestSharedBoresightTable(t *testing.T) {
	m, err := New(Config{Cells: 400, Reflectance: Uniform{Albedo: 0.3}})
	if err != nil {
		t.Fatal(err)
	}
	r := []float64{EarthRadiusKm + 550}
	const res, step = 4, 4
	tabs := make([]*BoresightTable, 4)
	var wg sync.WaitGroup
	for i := range tabs {
		wg.Go(func() {
			tab, err := SharedBoresightTable(m, r, 1.0, Response{}, res, step)
			if err != nil {
				t.Error(err)
			}
			tabs[i] = tab
		})
	}
	wg.Wait()
	for i := range tabs {
		if tabs[i] != tabs[0] {
			t.Fatalf("call %d got another table", i)
		}
	}
	own, err := NewBoresightTable(m, r, 1.0, Response{}, res, step)
	if err != nil {
		t.Fatal(err)
	}
	if len(own.vals) != len(tabs[0].vals) {
		t.Fatalf("%d values against %d", len(tabs[0].vals), len(own.vals))
	}
	for i := range own.vals {
		if own.vals[i] != tabs[0].vals[i] {
			t.Fatalf("value %d: shared %g, own %g", i, tabs[0].vals[i], own.vals[i])
		}
	}
	m2, _ := New(Config{Cells: 400, Reflectance: Uniform{Albedo: 0.25}})
	for name, f := range map[string]func() (*BoresightTable, error){
		"albedo": func() (*BoresightTable, error) { return SharedBoresightTable(m2, r, 1.0, Response{}, res, step) },
		"cone":   func() (*BoresightTable, error) { return SharedBoresightTable(m, r, 0.9, Response{}, res, step) },
		"radius": func() (*BoresightTable, error) {
			return SharedBoresightTable(m, []float64{EarthRadiusKm + 551}, 1.0, Response{}, res, step)
		},
	} {
		tab, err := f()
		if err != nil {
			t.Fatal(err)
		}
		if tab == tabs[0] {
			t.Errorf("another %s got the same table", name)
		}
	}
	c := &tableCache
	c.Lock()
	n, b := len(c.m), c.bytes
	c.Unlock()
	if n < 4 || b > sharedTableBytes {
		t.Errorf("cache holds %d tables, %d bytes", n, b)
	}
	// Fill past the bound: the bytes stay within it and the most recent
	// table stays.
	var last *BoresightTable
	per := tabs[0].Bytes()
	for k := range int(2*sharedTableBytes/per) + 2 {
		last, err = SharedBoresightTable(m, []float64{EarthRadiusKm + 600 + float64(k)}, 1.0, Response{}, res, step)
		if err != nil {
			t.Fatal(err)
		}
	}
	c.Lock()
	b = c.bytes
	c.Unlock()
	if b > sharedTableBytes {
		t.Errorf("cache holds %d bytes, bound %d", b, sharedTableBytes)
	}
	again, _ := SharedBoresightTable(m, []float64{EarthRadiusKm + 600 + float64(int(2*sharedTableBytes/per)+1)}, 1.0, Response{}, res, step)
	if again != last {
		t.Error("the most recent table was dropped")
	}
}
