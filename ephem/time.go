package ephem

import (
	"math"
	"time"
)

// Time-scale constants.
const (
	// JDJ2000 is the Julian date of the epoch J2000.0 (2000 January 1.5 TT),
	// IAU 1976 (Meeus 1998 p. 133; Vallado 2013 p. 190).
	JDJ2000 = 2451545.0
	// JDUnixEpoch is the Julian date of 1970-01-01T00:00:00 (Meeus 1998
	// (7.1) p. 61 applied to that date; closed form).
	JDUnixEpoch = 2440587.5
	// DaysPerJulianCentury is the length of a Julian century in days
	// (IAU; Meeus 1998 (12.1) p. 87).
	DaysPerJulianCentury = 36525.0
	// SecondsPerDay is the length of a day of the Julian calendar in SI seconds.
	SecondsPerDay = 86400.0
	// TTMinusTAI is TT − TAI in seconds, fixed by definition (IAU 1991
	// Resolution A4; Vallado 2013 eq. 3-41 p. 183).
	TTMinusTAI = 32.184
)

// leapStep is one step of the TAI − UTC table: from start (UTC) on,
// TAI − UTC = deltaAT seconds.
type leapStep struct {
	start   int64 // Unix seconds of the UTC instant the value starts
	deltaAT float64
}

// leapTable is TAI − UTC since 1972 from IERS Bulletin C (the history in
// Bulletin C 64 and the USNO tai-utc.dat file; checked step by step
// against ERFA eraDat in ephem/testdata/gen_time_erfa.py).
var leapTable = func() []leapStep {
	rows := []struct {
		y, m int
		dat  float64
	}{
		{1972, 1, 10}, {1972, 7, 11}, {1973, 1, 12}, {1974, 1, 13},
		{1975, 1, 14}, {1976, 1, 15}, {1977, 1, 16}, {1978, 1, 17},
		{1979, 1, 18}, {1980, 1, 19}, {1981, 7, 20}, {1982, 7, 21},
		{1983, 7, 22}, {1985, 7, 23}, {1988, 1, 24}, {1990, 1, 25},
		{1991, 1, 26}, {1992, 7, 27}, {1993, 7, 28}, {1994, 7, 29},
		{1996, 1, 30}, {1997, 7, 31}, {1999, 1, 32}, {2006, 1, 33},
		{2009, 1, 34}, {2012, 7, 35}, {2015, 7, 36}, {2017, 1, 37},
	}
	t := make([]leapStep, len(rows))
	for i, r := range rows {
		t[i] = leapStep{time.Date(r.y, time.Month(r.m), 1, 0, 0, 0, 0, time.UTC).Unix(), r.dat}
	}
	return t
}()

// TAIMinusUTC returns ΔAT = TAI − UTC in seconds at the UTC instant utc,
// from the leap-second table of IERS Bulletin C, which ends with the step
// of 2017-01-01 (ΔAT = 37 s).
//
// After the last step the last value (37 s) is held: a leap second
// announced later is not known to this table, and each one would shift
// TT by 1 s (about 4e-5° of solar motion, far below the sun models'
// errors). Before 1972-01-01 UTC ran on "rubber seconds" with fractional
// offsets; this function returns the first value, 10 s, there, which is
// wrong by up to 8.6 s (ΔAT ran from 1.42 s in 1961 to 9.89 s at the end
// of 1971, ERFA eraDat) and undefined before 1961 — negligible for the sun
// models, not for precise timing.
func TAIMinusUTC(utc time.Time) float64 {
	s := utc.Unix()
	if s < leapTable[0].start {
		return leapTable[0].deltaAT
	}
	// The table is short (28 rows); search from the end, where modern
	// epochs land first.
	for i := len(leapTable) - 1; i >= 0; i-- {
		if s >= leapTable[i].start {
			return leapTable[i].deltaAT
		}
	}
	return leapTable[0].deltaAT // not reached
}

// unixSeconds returns the instant as float seconds since the Unix epoch,
// counted in the POSIX way (86400 s a day, leap seconds not counted).
func unixSeconds(t time.Time) float64 {
	return float64(t.Unix()) + float64(t.Nanosecond())*1e-9
}

// julianDateUTC is the Julian date of the UTC calendar instant (Meeus 1998
// (7.1) p. 61, through the Unix day count; closed form).
func julianDateUTC(utc time.Time) float64 {
	return JDUnixEpoch + unixSeconds(utc)/SecondsPerDay
}

// JulianDateTT returns the Julian date in Terrestrial Time of the UTC
// instant utc: TT = UTC + ΔAT + 32.184 s (Vallado 2013 eqs. 3-40, 3-41
// p. 183). A float64 near 2.46e6 days resolves about 40 µs.
func JulianDateTT(utc time.Time) float64 {
	return JDUnixEpoch + (unixSeconds(utc)+TAIMinusUTC(utc)+TTMinusTAI)/SecondsPerDay
}

// JulianDateUT1 returns the Julian date in UT1 of the UTC instant utc,
// taking UT1 = UTC. IERS keeps |UT1 − UTC| < 0.9 s, so the Earth rotation
// angle is off by at most 0.9 s × 15.04″/s ≈ 13.5″ (0.0038°), which at LEO
// radius is at most 0.4 km of ground track; use a Bulletin A value of
// DUT1 where that matters.
func JulianDateUT1(utc time.Time) float64 {
	return julianDateUTC(utc)
}

// CenturiesTT returns the Julian centuries of TT since J2000.0,
// T = (JD − 2451545.0)/36525 (Meeus 1998 (12.1) p. 87; Vallado 2013
// eq. 3-42 p. 184).
func CenturiesTT(jdTT float64) float64 {
	return (jdTT - JDJ2000) / DaysPerJulianCentury
}

// GMST returns the Greenwich mean sidereal time in radians, in [0, 2π), at
// the UT1 Julian date jdUT1, by the IAU 1982 expression (Aoki et al. 1982)
// in the form of Meeus 1998 (12.4) p. 88, which equals Vallado 2013
// eq. 3-47 p. 188:
//
//	θ = 280.46061837° + 360.98564736629° d + 0.000387933° T² − T³/38710000°
//
// with d = JD_UT1 − 2451545.0 and T = d/36525.
func GMST(jdUT1 float64) float64 {
	d := jdUT1 - JDJ2000
	T := d / DaysPerJulianCentury
	// 360.98564736629 d = 360 d + 0.98564736629 d; the 360 d part reduces
	// to 360·frac(d), which keeps the large term from eating precision.
	_, frac := math.Modf(d)
	θ := 280.46061837 + 360*frac + 0.98564736629*d + // Meeus 1998 (12.4) p. 88
		T*T*(0.000387933-T/38710000)
	θ = math.Mod(θ, 360)
	if θ < 0 {
		θ += 360
	}
	r := θ * (math.Pi / 180)
	if r >= 2*math.Pi { // rounding of θ just below 360
		r = 0
	}
	return r
}
