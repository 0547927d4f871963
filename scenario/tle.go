package scenario

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"time"
)

// muEarthKm3S2 is the Earth's gravitational parameter used to turn a TLE's
// mean motion into a semi-major axis: WGS 84, NIMA TR8350.2 3rd ed. (2000),
// 398600.4418 km³/s². It repeats orbit's constant because scenario depends on
// no physics package; the build step uses orbit's.
const muEarthKm3S2 = 398600.4418

// TLE holds the fields of a two-line element set. The build step propagates
// them with SGP4 (the default for a TLE orbit, the model TLEs are fitted
// with) or, when the scenario asks for another propagator, reads them as mean
// elements for a starting point.
type TLE struct {
	Catalog          string    // satellite catalogue number, columns 3–7 of both lines
	Epoch            time.Time // UTC, from line 1 columns 19–32 (YYDDD.DDDDDDDD)
	InclinationRad   float64   // line 2 columns 9–16
	RAANRad          float64   // line 2 columns 18–25
	Eccentricity     float64   // line 2 columns 27–33, leading decimal point implied
	ArgPerigeeRad    float64   // line 2 columns 35–42
	MeanAnomalyRad   float64   // line 2 columns 44–51
	MeanMotionRevDay float64   // line 2 columns 53–63
	BStar            float64   // line 1 columns 54–61, B* drag term in 1/Earth radii (±.NNNNN±E)
	SemiMajorAxisKm  float64   // from the mean motion by Kepler's third law, a = (μ/n²)^(1/3)
}

// tleChecksum is the modulo-10 checksum of columns 1–68: digits count their
// value, a minus sign counts 1, everything else 0 (Hoots & Roehrich 1980,
// Spacetrack Report No. 3; Vallado et al. 2006, AIAA 2006-6753, from memory).
func tleChecksum(line string) int {
	sum := 0
	for _, c := range line[:68] {
		switch {
		case c >= '0' && c <= '9':
			sum += int(c - '0')
		case c == '-':
			sum++
		}
	}
	return sum % 10
}

// ParseTLE reads the two lines of a two-line element set, checking line
// numbers, lengths, catalogue numbers and checksums. Column positions follow
// Spacetrack Report No. 3 (Hoots & Roehrich 1980) as restated by Vallado et
// al. 2006, "Revisiting Spacetrack Report #3" (from memory).
func ParseTLE(line1, line2 string) (TLE, error) {
	l1 := strings.TrimRight(line1, " \r\n")
	l2 := strings.TrimRight(line2, " \r\n")
	var t TLE
	for i, l := range []string{l1, l2} {
		n := i + 1
		if len(l) != 69 {
			return t, fmt.Errorf("line %d has %d characters; allowed exactly 69", n, len(l))
		}
		if l[0] != byte('0'+n) || l[1] != ' ' {
			return t, fmt.Errorf("line %d does not start with %q; allowed the two lines in order", n, fmt.Sprintf("%d ", n))
		}
		want := int(l[68] - '0')
		if l[68] < '0' || l[68] > '9' || tleChecksum(l) != want {
			return t, fmt.Errorf("line %d checksum is %q but the line sums to %d; allowed a line with a matching checksum (column 69)", n, string(l[68]), tleChecksum(l))
		}
	}
	if l1[2:7] != l2[2:7] {
		return t, fmt.Errorf("catalogue numbers differ (%q and %q); allowed two lines of one element set", l1[2:7], l2[2:7])
	}
	t.Catalog = strings.TrimSpace(l1[2:7])
	num := func(field, s string) (float64, error) {
		v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
		if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
			return 0, fmt.Errorf("%s %q is not a number", field, s)
		}
		return v, nil
	}
	yy, err := strconv.Atoi(l1[18:20])
	if err != nil {
		return t, fmt.Errorf("line 1 epoch year %q is not a number", l1[18:20])
	}
	doy, err := num("line 1 epoch day", l1[20:32])
	if err != nil {
		return t, err
	}
	if doy < 1 || doy >= 367 {
		return t, fmt.Errorf("line 1 epoch day %v is out of range; allowed [1, 367)", doy)
	}
	year := 1900 + yy // two-digit years 57–99 are 19xx, 00–56 are 20xx (Spacetrack Report No. 3)
	if yy < 57 {
		year = 2000 + yy
	}
	start := time.Date(year, 1, 1, 0, 0, 0, 0, time.UTC)
	t.Epoch = start.Add(time.Duration(math.Round((doy - 1) * float64(day))))

	deg := math.Pi / 180
	fields := []struct {
		name string
		col  string
		dst  *float64
		max  float64
	}{
		{"inclination", l2[8:16], &t.InclinationRad, 180},
		{"raan", l2[17:25], &t.RAANRad, 360},
		{"argument of perigee", l2[34:42], &t.ArgPerigeeRad, 360},
		{"mean anomaly", l2[43:51], &t.MeanAnomalyRad, 360},
	}
	for _, f := range fields {
		v, err := num("line 2 "+f.name, f.col)
		if err != nil {
			return t, err
		}
		if v < 0 || v > f.max {
			return t, fmt.Errorf("line 2 %s %v° is out of range; allowed [0, %v]", f.name, v, f.max)
		}
		*f.dst = v * deg
	}
	ecc := strings.TrimSpace(l2[26:33])
	if ecc == "" || strings.ContainsAny(ecc, "+-.eE") {
		return t, fmt.Errorf("line 2 eccentricity %q is not seven digits", l2[26:33])
	}
	e, err := num("line 2 eccentricity", "0."+ecc)
	if err != nil {
		return t, err
	}
	t.Eccentricity = e
	n, err := num("line 2 mean motion", l2[52:63])
	if err != nil {
		return t, err
	}
	if n <= 0 || n > 20 {
		return t, fmt.Errorf("line 2 mean motion %v rev/day is out of range; allowed (0, 20]", n)
	}
	t.MeanMotionRevDay = n
	if t.BStar, err = parseTLEExp(l1[53:61]); err != nil {
		return t, fmt.Errorf("line 1 B* %q: %v", l1[53:61], err)
	}
	nRadS := n * 2 * math.Pi / 86400
	t.SemiMajorAxisKm = math.Cbrt(muEarthKm3S2 / (nRadS * nRadS)) // Kepler's third law, n² a³ = μ
	return t, nil
}

// parseTLEExp reads a TLE field in assumed-decimal exponent form, " 28098-4"
// = 0.28098e-4, "-11606-4" = −0.11606e-4 (Spacetrack Report No. 3).
func parseTLEExp(f string) (float64, error) {
	f = strings.TrimSpace(f)
	if f == "" {
		return 0, nil
	}
	if len(f) < 3 {
		return 0, fmt.Errorf("too short; allowed ±NNNNN±E")
	}
	mant, exp := f[:len(f)-2], f[len(f)-2:]
	if exp[0] != '-' && exp[0] != '+' {
		return 0, fmt.Errorf("no exponent sign; allowed ±NNNNN±E")
	}
	sign := 1.0
	switch mant[0] {
	case '-':
		sign, mant = -1, mant[1:]
	case '+':
		mant = mant[1:]
	}
	mant = strings.TrimPrefix(mant, ".")
	for _, c := range mant {
		if c < '0' || c > '9' {
			return 0, fmt.Errorf("mantissa is not digits; allowed ±NNNNN±E")
		}
	}
	e, err := strconv.Atoi(exp)
	if err != nil {
		return 0, fmt.Errorf("exponent is not a digit; allowed ±NNNNN±E")
	}
	m, err := strconv.ParseFloat("0."+mant, 64)
	if err != nil {
		return 0, err
	}
	return sign * m * math.Pow(10, float64(e)), nil
}
