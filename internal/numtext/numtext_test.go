package numtext

import (
	"fmt"
	"math"
	"testing"
)

func TestFormat(t *testing.T) {
	deg := math.Pi / 180
	// Expected values: closed form (the decimal numbers the operations
	// stand for; the float64 results differ from them in the 16th digit).
	for _, c := range []struct {
		v    float64
		want string
	}{
		{150 * deg * (180 / math.Pi), "150"},
		{0.1 * 0.7, "0.07"},
		{0.1 + 0.2, "0.3"},
		{12.5, "12.5"},
		{-5, "-5"},
		{1e-7, "1e-07"},
		{2.5e21, "2.5e+21"},
		{0.123456789012345, "0.123456789012"},
		{math.Inf(1), "+Inf"},
		{math.NaN(), "NaN"},
	} {
		if got := Format(c.v); got != c.want {
			t.Errorf("Format(%v) = %q, want %q", c.v, got, c.want)
		}
	}
}

func TestClean(t *testing.T) {
	a := 0.1 * 0.7
	got := fmt.Sprintf("%g %v %.3f %5.1f %d %s", Clean([]any{a, a, a, a, 3, "x"})...)
	if want := "0.07 0.07 0.070   0.1 3 x"; got != want {
		t.Errorf("got %q, want %q", got, want)
	}
}
