package scenario

import (
	"math"
	"strings"
	"testing"
	"time"
)

func TestParseSpan(t *testing.T) {
	// Expected values: closed form (1 d = 24 h, 1 w = 7 d by definition).
	good := []struct {
		in    string
		want  time.Duration
		canon string
	}{
		{"90m", 90 * time.Minute, "1h30m"},
		{"1d12h", 36 * time.Hour, "1d12h"},
		{"30d", 30 * 24 * time.Hour, "30d"},
		{"2w", 14 * 24 * time.Hour, "14d"},
		{"1w1d1h1m1s", (8*24+1)*time.Hour + time.Minute + time.Second, "8d1h1m1s"},
		{"0.5d", 12 * time.Hour, "12h"},
		{"10s", 10 * time.Second, "10s"},
		{"250ms", 250 * time.Millisecond, "0.25s"},
		{"0", 0, "0s"},
		{"-10s", -10 * time.Second, "-10s"},
	}
	for _, c := range good {
		got, err := ParseSpan(c.in)
		if err != nil || got.Duration() != c.want {
			t.Errorf("ParseSpan(%q) = %v, %v; want %v", c.in, got.Duration(), err, c.want)
			continue
		}
		if got.String() != c.canon {
			t.Errorf("Span(%q).String() = %q; want %q", c.in, got.String(), c.canon)
		}
	}
	for _, bad := range []string{"", "1y", "3mo", "2M", "d", "10", "1.2.3d", "5x", "-", "99999999999w"} {
		if _, err := ParseSpan(bad); err == nil {
			t.Errorf("ParseSpan(%q) succeeded; want an error", bad)
		}
	}
}

func TestParseLocalTime(t *testing.T) {
	// Expected values: closed form (60 min per hour, 15° of hour angle per hour).
	good := map[string]float64{"10:30": 10.5, "06:00": 6, "22:15:36": 22.26, "10.5h": 10.5, "157.5deg": 10.5, "0:00": 0}
	for in, want := range good {
		got, err := ParseLocalTime(in)
		if err != nil || math.Abs(got-want) > 1e-12 {
			t.Errorf("ParseLocalTime(%q) = %v, %v; want %v", in, got, err, want)
		}
	}
	for _, bad := range []string{"24:00", "10:60", "-1h", "25h", "10", "ten", "1:2:3:4", "10.5:00", "360deg", "NaNh"} {
		if _, err := ParseLocalTime(bad); err == nil {
			t.Errorf("ParseLocalTime(%q) succeeded; want an error", bad)
		}
	}
	if s := FormatLocalTime(10.5); s != "10:30" {
		t.Errorf("FormatLocalTime(10.5) = %q", s)
	}
}

func TestParseEpoch(t *testing.T) {
	got, err := ParseEpoch("2026-03-20T12:00:00Z")
	if err != nil || !got.Equal(time.Date(2026, 3, 20, 12, 0, 0, 0, time.UTC)) {
		t.Fatalf("ParseEpoch = %v, %v", got, err)
	}
	for _, bad := range []string{"2026-03-20", "2026-03-20T12:00:00+02:00", "yesterday", "2026-13-01T00:00:00Z"} {
		if _, err := ParseEpoch(bad); err == nil {
			t.Errorf("ParseEpoch(%q) succeeded; want an error", bad)
		}
	}
}

// tleSamples are published element sets used only as format check values.
var tleSamples = []struct {
	source      string
	l1, l2      string
	incDeg, ecc float64
	n           float64
	aKm         float64 // (μ/n²)^(1/3), μ = 398600.4418, computed with /usr/bin/python3
	epoch       time.Time
}{
	{
		// Example element set of the Wikipedia article "Two-line element set" (from memory);
		// its checksums 7 and 7 confirm the recalled digits.
		"two-line element set article example",
		"1 25544U 98067A   08264.51782528 -.00002182  00000-0 -11606-4 0  2927",
		"2 25544  51.6416 247.4627 0006703 130.5360 325.0288 15.72125391563537",
		51.6416, 0.0006703, 15.72125391, 6730.960676936836,
		time.Date(2008, 9, 20, 12, 25, 40, 104192000, time.UTC),
	},
	{
		// Test case 00005 of Vallado et al. 2006, "Revisiting Spacetrack Report #3", AIAA 2006-6753 (from memory).
		"vallado 2006 case 00005",
		"1 00005U 58002B   00179.78495062  .00000023  00000-0  28098-4 0  4753",
		"2 00005  34.2682 348.7242 1859667 331.7664  19.3264 10.82419157413667",
		34.2682, 0.1859667, 10.82419157, 8632.531955915649,
		time.Date(2000, 6, 27, 18, 50, 19, 733568000, time.UTC),
	},
}

func TestParseTLE(t *testing.T) {
	for _, c := range tleSamples {
		tle, err := ParseTLE(c.l1, c.l2)
		if err != nil {
			t.Fatalf("%s: %v", c.source, err)
		}
		if math.Abs(tle.InclinationRad*180/math.Pi-c.incDeg) > 1e-12 || tle.Eccentricity != c.ecc || tle.MeanMotionRevDay != c.n {
			t.Errorf("%s: fields %+v", c.source, tle)
		}
		if math.Abs(tle.SemiMajorAxisKm-c.aKm) > 1e-6 {
			t.Errorf("%s: a = %.9f km; want %.9f", c.source, tle.SemiMajorAxisKm, c.aKm)
		}
		if d := tle.Epoch.Sub(c.epoch); d < -time.Microsecond || d > time.Microsecond {
			t.Errorf("%s: epoch %v; want %v", c.source, tle.Epoch, c.epoch)
		}
		bad := c.l2[:68] + string('0'+(c.l2[68]-'0'+1)%10)
		if _, err := ParseTLE(c.l1, bad); err == nil {
			t.Errorf("%s: wrong checksum accepted", c.source)
		}
	}
}

func FuzzSpan(f *testing.F) {
	for _, s := range []string{"1d12h", "30d", "90m", "2w", "0.5s", "1y", "-3h", "1.5d2.5h"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		v, err := ParseSpan(s)
		if err != nil {
			return
		}
		back, err := ParseSpan(v.String())
		if err != nil || back != v {
			t.Fatalf("round trip of %q: %q -> %v, %v", s, v.String(), back, err)
		}
	})
}

func FuzzLocalTime(f *testing.F) {
	for _, s := range []string{"10:30", "10.5h", "157.5deg", "23:59:59", "24:00"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		h, err := ParseLocalTime(s)
		if err == nil && !(h >= 0 && h < 24) {
			t.Fatalf("%q gave %v outside [0, 24)", s, h)
		}
	})
}

// A refusal says the range in the key's own unit: the aperture offset in
// mm, the misalignment in degrees, the signal errors as fractions.
func TestErrorKeyRefusalNamesItsUnit(t *testing.T) {
	for _, c := range []struct{ key, want, not string }{
		{"aperture_offset_mm_1sigma", "mm", "degree"},
		{"misalignment_deg_1sigma", "degrees", "mm"},
		{"gain_1sigma", "fraction", "degree"},
	} {
		text := "orbit: {altitude_km: 500, inclination_deg: 97.4}\nbody:\n  sensors:\n    - {name: a, kind: quadrant, face: \"+X\", errors: {" + c.key + ": -1}}\n"
		_, err := Parse([]byte(text), t.TempDir())
		if err == nil || !strings.Contains(err.Error(), c.want) || strings.Contains(err.Error(), c.not) {
			t.Errorf("%s: -1 refused with %v; want the range in %s", c.key, err, c.want)
		}
	}
}

// A number the loader computes is printed as a person would write it: the
// size_m product 0.1 × 0.7 is 0.07, not 0.07000000000000001 (the float
// product, closed form).
func TestComputedNumbersPrintCleanly(t *testing.T) {
	text := minimal + "  panels:\n    - {name: p, face: \"+X\", size_m: [0.1, 0.7], area_m2: 0.05, efficiency: 0.3}\n"
	_, err := Parse([]byte(text), t.TempDir())
	if err == nil || !strings.Contains(err.Error(), "product 0.07 m²") {
		t.Errorf("refusal %v; want the product printed as 0.07", err)
	}
}
