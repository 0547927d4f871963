package budget

import (
	"context"
	"fmt"
)

// MaxTemperatureOffsetC bounds the temperature search either side of the
// calibration (°C).
const MaxTemperatureOffsetC = 100.0

// temperatureStepC is the coarse step of the search and temperatureTolC
// the width it bisects a crossing down to (°C).
const (
	temperatureStepC = 10.0
	temperatureTolC  = 0.5
)

// TemperatureRange is how far the sensors' temperature may move from their
// ground calibration, every temperature-dependent sensor alike and in every
// phase, before the figure misses a target. LowC ≤ 0 ≤ HighC are offsets
// from each sensor's calibration temperature; a side that meets the target
// out to MaxTemperatureOffsetC is not bounded (LowBounded or HighBounded
// false). Infeasible: the target is missed at the calibration temperature
// itself. AtLowDeg and AtHighDeg are the figure at the ends.
type TemperatureRange struct {
	LowC, HighC             float64
	LowBounded, HighBounded bool
	Infeasible              bool
	AtLowDeg, AtHighDeg     float64
	Runs                    int
}

// FindTemperatureRange searches each side of the calibration in steps of
// 10 °C for the first temperature at which the figure exceeds target, then
// bisects that step to 0.5 °C; the ends returned meet the target. The
// search walks outward, so a figure that comes back under the target
// further out is not looked for (the range is the one around the
// calibration).
func FindTemperatureRange(ctx context.Context, run RunFunc, base Case, target float64, fig Figure) (TemperatureRange, error) {
	var r TemperatureRange
	if !(target > 0) {
		return r, fmt.Errorf("budget: temperature range target %g deg: want a value > 0", target)
	}
	at := func(d float64) (float64, error) {
		c := base
		c.AtTemperature, c.TempOffsetC = true, d
		r.Runs++
		m, err := run(ctx, c)
		if err != nil {
			return 0, fmt.Errorf("budget: sensors %+g °C from their calibration: %w", d, err)
		}
		return fig(m), nil
	}
	f0, err := at(0)
	if err != nil {
		return r, err
	}
	if !(f0 <= target) {
		r.Infeasible, r.AtLowDeg, r.AtHighDeg = true, f0, f0
		return r, nil
	}
	side := func(sign float64) (end, atEnd float64, bounded bool, err error) {
		ok, fOK := 0.0, f0
		for k := temperatureStepC; k <= MaxTemperatureOffsetC+1e-9; k += temperatureStepC {
			f, err := at(sign * k)
			if err != nil {
				return 0, 0, false, err
			}
			if !(f <= target) {
				lo, hi := ok, k
				for hi-lo > temperatureTolC {
					mid := (lo + hi) / 2
					fm, err := at(sign * mid)
					if err != nil {
						return 0, 0, false, err
					}
					if fm <= target {
						lo, fOK = mid, fm
					} else {
						hi = mid
					}
				}
				return sign * lo, fOK, true, nil
			}
			ok, fOK = k, f
		}
		return sign * min(ok, MaxTemperatureOffsetC), fOK, false, nil
	}
	if r.HighC, r.AtHighDeg, r.HighBounded, err = side(1); err != nil {
		return r, err
	}
	if r.LowC, r.AtLowDeg, r.LowBounded, err = side(-1); err != nil {
		return r, err
	}
	return r, nil
}
