package sweep

import (
	"fmt"
	"math"
	"strconv"
	"strings"
)

// Axis is one varied key and its values, as text put into the scenario file.
type Axis struct {
	Key    string
	Values []string
}

// MaxCases bounds the cases of one sweep, checked before any case is built
// (each case is a whole scenario in memory and a run).
const MaxCases = 20000

// maxRangeValues bounds a range so a typo cannot make millions of cases.
const maxRangeValues = 10000

// ParseAxis reads "KEY=VALUES": VALUES is "lo:hi:step" (numbers, end
// included when on the grid) or a comma list ("06:00,10:30", epochs, names).
func ParseAxis(spec string) (Axis, error) {
	key, vals, ok := strings.Cut(spec, "=")
	key = strings.TrimSpace(key)
	if !ok || key == "" || strings.TrimSpace(vals) == "" {
		return Axis{}, fmt.Errorf("sweep: --vary %q: want KEY=VALUES, e.g. orbit.altitude_km=300:900:50 or orbit.ltan=06:00,10:30", spec)
	}
	if _, err := splitPath(key); err != nil {
		return Axis{}, fmt.Errorf("sweep: --vary %s: %w", key, err)
	}
	if r, isRange, err := parseRange(vals); isRange {
		if err != nil {
			return Axis{}, fmt.Errorf("sweep: --vary %s: range %q: %w", key, vals, err)
		}
		return Axis{Key: key, Values: r}, nil
	}
	var list []string
	for _, v := range strings.Split(vals, ",") {
		v = strings.TrimSpace(v)
		if v == "" {
			return Axis{}, fmt.Errorf("sweep: --vary %s: empty value in list %q; separate values with single commas", key, vals)
		}
		list = append(list, v)
	}
	return Axis{Key: key, Values: list}, nil
}

// parseRange reads "lo:hi:step"; isRange is false when vals is not three
// colon-separated numbers (then it is a list such as "10:30").
func parseRange(vals string) (out []string, isRange bool, err error) {
	if strings.Contains(vals, ",") {
		return nil, false, nil
	}
	parts := strings.Split(vals, ":")
	if len(parts) != 3 {
		return nil, false, nil
	}
	var x [3]float64
	for i, p := range parts {
		v, err := strconv.ParseFloat(strings.TrimSpace(p), 64)
		if err != nil {
			return nil, false, nil
		}
		x[i] = v
	}
	lo, hi, step := x[0], x[1], x[2]
	if math.IsInf(lo, 0) || math.IsInf(hi, 0) || math.IsNaN(lo) || math.IsNaN(hi) {
		return nil, true, fmt.Errorf("ends must be finite")
	}
	if !(step > 0) || math.IsInf(step, 0) {
		return nil, true, fmt.Errorf("step %g must be positive; use lo:hi:step with lo ≤ hi", step)
	}
	if hi < lo {
		return nil, true, fmt.Errorf("end %g is below start %g; use lo:hi:step with lo ≤ hi", hi, lo)
	}
	n := int(math.Floor((hi-lo)/step+1e-9)) + 1
	if n > maxRangeValues {
		return nil, true, fmt.Errorf("%d values; at most %d per axis", n, maxRangeValues)
	}
	for i := range n {
		v := lo + float64(i)*step
		// Round away the float residue of lo + i·step (e.g. 0.30000000000000004).
		out = append(out, strconv.FormatFloat(roundTo(v, 12), 'g', -1, 64))
	}
	return out, true, nil
}

func roundTo(v float64, digits int) float64 {
	if v == 0 {
		return 0
	}
	p := math.Pow(10, float64(digits)-math.Ceil(math.Log10(math.Abs(v))))
	return math.Round(v*p) / p
}

// Cases returns the value tuples of the sweep, one per case in case order:
// the cross product with the first axis varying slowest, or with zip the
// i-th value of every axis.
func Cases(axes []Axis, zip bool) ([][]string, error) {
	if len(axes) == 0 {
		return nil, fmt.Errorf("sweep: nothing to vary; give at least one --vary KEY=VALUES")
	}
	seen := map[string]bool{}
	for _, a := range axes {
		if seen[a.Key] {
			return nil, fmt.Errorf("sweep: --vary %s given twice; give each key once", a.Key)
		}
		seen[a.Key] = true
	}
	if zip {
		n := len(axes[0].Values)
		for _, a := range axes[1:] {
			if len(a.Values) != n {
				return nil, fmt.Errorf("sweep: --zip needs lists of equal length: %s has %d values, %s has %d", axes[0].Key, n, a.Key, len(a.Values))
			}
		}
		out := make([][]string, n)
		for i := range out {
			for _, a := range axes {
				out[i] = append(out[i], a.Values[i])
			}
		}
		return out, nil
	}
	total := 1
	for _, a := range axes {
		total *= len(a.Values)
		if total > MaxCases {
			return nil, fmt.Errorf("sweep: more than %d cases (the limit of one sweep); vary fewer values, or split the sweep into several runs with their own --out", MaxCases)
		}
	}
	out := make([][]string, total)
	for i := range out {
		rest := i
		vals := make([]string, len(axes))
		for k := len(axes) - 1; k >= 0; k-- {
			n := len(axes[k].Values)
			vals[k] = axes[k].Values[rest%n]
			rest /= n
		}
		out[i] = vals
	}
	return out, nil
}

// CaseSeed derives case index's seed from the scenario seed (SplitMix64
// finaliser, Steele, Lea & Flood 2014, from memory).
func CaseSeed(base int64, index int) uint64 {
	z := uint64(base) + uint64(index+1)*0x9e3779b97f4a7c15
	z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9
	z = (z ^ (z >> 27)) * 0x94d049bb133111eb
	return z ^ (z >> 31)
}
