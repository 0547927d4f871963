package sim

import (
	"context"
	"errors"
	"fmt"
	"math"
	"reflect"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/power"
	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// A series written as the run goes (Config.SeriesSink) is, piece after
// piece, the series the run keeps without a sink, with the panels' power at
// the same samples; the run then keeps no series, and every other figure is
// the same. The run is cut into several pieces on two workers, with noisy
// sensors and a panel; the first piece hands its series on as it grows
// (streamRows: the default, and 100 for many hand-overs), and a run in one
// piece (as with a gyro filter) hands everything on that way.
func TestSeriesSinkMatchesKeptSeries(t *testing.T) {
	defer func(n int) { streamRows = n }(streamRows)
	cfg := referenceCase(t, 1.2, false)
	cfg.Step = 1 // 103 681 steps: four pieces of 32 768
	cfg.Law = attitude.NewTumble(5, 3*degRad)
	cfg.Array = faceArrayWith(t, 70, sensor.Errors{NoiseSigma: 0.005, DarkSigma: 0.005, GainSigma: 0.02, ADCBits: 12, FullScale: 1.5})
	cfg.Workers, cfg.SeriesStride = 2, 7
	arr, err := power.NewArray(power.Panel{Name: "top", Normal: r3.Vec{Z: 1}, AreaM2: 0.06, Efficiency: 0.3, PackingFactor: 0.9})
	if err != nil {
		t.Fatal(err)
	}
	cfg.Panels = arr
	for _, tc := range []struct {
		rows      int
		onePiece  bool
		minPieces int
	}{{8192, false, 4}, {100, false, 30}, {100, true, 100}} {
		streamRows = tc.rows
		c := cfg
		c.onePiece = tc.onePiece
		kept, err := Run(context.Background(), c)
		if err != nil {
			t.Fatal(err)
		}
		got := &Series{SensorName: kept.Nominal.Series.SensorName}
		var gotW []float64
		pieces := 0
		c.SeriesSink = func(p *Series, w []float64) error {
			if len(w) != len(p.T) {
				t.Errorf("piece %d: %d power values for %d samples", pieces, len(w), len(p.T))
			}
			got.extend(p)
			gotW = append(gotW, w...)
			pieces++
			return nil
		}
		streamed, err := Run(context.Background(), c)
		if err != nil {
			t.Fatal(err)
		}
		name := fmt.Sprintf("hand-over every %d rows, one piece %v", tc.rows, tc.onePiece)
		if pieces < tc.minPieces {
			t.Errorf("%s: %d pieces written, want at least %d", name, pieces, tc.minPieces)
		}
		if streamed.Nominal.Series != nil {
			t.Errorf("%s: a streamed run kept its series too", name)
		}
		if !sameBits(got, kept.Nominal.Series) {
			t.Errorf("%s: streamed series (%d samples) differs from the kept one (%d)", name, len(got.T), len(kept.Nominal.Series.T))
		}
		if !sameBits(gotW, kept.PowerSeries.W) {
			t.Errorf("%s: streamed power (%d values) differs from the kept one (%d)", name, len(gotW), len(kept.PowerSeries.W))
		}
		kept.Nominal.Series, kept.Units[0].Series = nil, nil
		if sameBits(kept.Nominal, &UnitResult{}) {
			t.Fatal("sameBits sees no difference from an empty result")
		}
		if !sameBits(streamed.Nominal, kept.Nominal) || !sameBits(streamed.Power, kept.Power) {
			t.Errorf("%s: streaming the series changed another figure", name)
		}
	}
}

// A sink that fails ends the run with its error.
func TestSeriesSinkErrorStopsTheRun(t *testing.T) {
	cfg := referenceCase(t, 1.2, false)
	cfg.Step = 1
	cfg.Workers, cfg.SeriesStride = 2, 1
	full := errors.New("disc full")
	calls := 0
	cfg.SeriesSink = func(*Series, []float64) error {
		calls++
		return full
	}
	if _, err := Run(context.Background(), cfg); !errors.Is(err, full) {
		t.Fatalf("error %v, want the sink's", err)
	}
	if calls != 1 {
		t.Errorf("sink called %d times after its first error, want once", calls)
	}
}

// sameBits is reflect.DeepEqual with floats compared by their bits (a NaN
// equals the same NaN), through pointers, slices, maps and every field,
// unexported ones too.
func sameBits(a, b any) bool {
	return bitsEqual(reflect.ValueOf(a), reflect.ValueOf(b))
}

func bitsEqual(a, b reflect.Value) bool {
	if a.IsValid() != b.IsValid() || a.IsValid() && a.Type() != b.Type() {
		return false
	}
	if !a.IsValid() {
		return true
	}
	switch a.Kind() {
	case reflect.Float32, reflect.Float64:
		return math.Float64bits(a.Float()) == math.Float64bits(b.Float())
	case reflect.Pointer, reflect.Interface:
		if a.IsNil() || b.IsNil() {
			return a.IsNil() == b.IsNil()
		}
		return bitsEqual(a.Elem(), b.Elem())
	case reflect.Slice, reflect.Array:
		if a.Kind() == reflect.Slice && (a.IsNil() != b.IsNil()) || a.Len() != b.Len() {
			return false
		}
		for i := range a.Len() {
			if !bitsEqual(a.Index(i), b.Index(i)) {
				return false
			}
		}
		return true
	case reflect.Struct:
		for i := range a.NumField() {
			if !bitsEqual(a.Field(i), b.Field(i)) {
				return false
			}
		}
		return true
	case reflect.Map:
		if a.Len() != b.Len() {
			return false
		}
		for _, k := range a.MapKeys() {
			if !bitsEqual(a.MapIndex(k), b.MapIndex(k)) {
				return false
			}
		}
		return true
	case reflect.Func:
		return a.IsNil() && b.IsNil()
	case reflect.Bool:
		return a.Bool() == b.Bool()
	case reflect.String:
		return a.String() == b.String()
	case reflect.Int, reflect.Int8, reflect.Int16, reflect.Int32, reflect.Int64:
		return a.Int() == b.Int()
	case reflect.Uint, reflect.Uint8, reflect.Uint16, reflect.Uint32, reflect.Uint64, reflect.Uintptr:
		return a.Uint() == b.Uint()
	}
	return false
}

// The block loop is the step-by-step loop reordered: with blocks of 1 step
// (the plain per-step path), 7 steps (blocks that straddle the 4096-step
// noise blocks and the pieces) or 256, a Monte Carlo run with noisy drawn
// sensors, a uniform albedo through the boresight table, a tumble and two
// workers gives the same bits in every figure.
func TestBlockLengthChangesNothing(t *testing.T) {
	defer func(n int) { blockSteps = n }(blockSteps)
	var first *Result
	for _, n := range []int{1, 7, 256} {
		blockSteps = n
		cfg := referenceCase(t, 0.5, true)
		cfg.Step = 1 // 43 201 steps: two pieces
		cfg.Law = attitude.NewTumble(7, 2*degRad)
		cfg.Array = faceArrayWith(t, 70, sensor.Errors{NoiseSigma: 0.005, DarkSigma: 0.005, GainSigma: 0.02,
			MisalignSigma: 0.5 * degRad, ADCBits: 12, FullScale: 1.5})
		cfg.Units, cfg.Workers, cfg.SeriesStride = 3, 2, 5
		res, err := Run(context.Background(), cfg)
		if err != nil {
			t.Fatal(err)
		}
		if first == nil {
			first = res
			if !res.AlbedoTable {
				t.Fatal("the run integrated its albedo; the case wants the table")
			}
			if sameBits(res, &Result{}) {
				t.Fatal("sameBits sees no difference from an empty result")
			}
			continue
		}
		if !sameBits(res, first) {
			t.Errorf("blocks of %d steps: the result differs from blocks of 1", n)
		}
	}
}
