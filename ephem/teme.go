package ephem

import (
	"math"

	"github.com/soniakeys/meeus/v3/nutation"
)

// TEMEToEME2000 returns the matrix M that takes a vector from the TEME frame
// of the TT Julian date jdTT (true equator, mean equinox: the frame SGP4
// works in) to EME2000: r₂₀₀₀ = M·r_TEME, with
//
//	M = Pᵀ · Nᵀ · R3(−Eq)
//
// where R3(−Eq) turns TEME to the true equator and equinox of date by the
// equation of the equinoxes Eq = Δψ cos ε (the IAU 1982 form, without the
// 1994 terms of at most 2.7 mas), N is the IAU 1980 nutation matrix
// R1(−ε−Δε)·R3(−Δψ)·R1(ε) (mean → true of date) and P the IAU 1976
// precession J2000 → mean of date (Vallado et al. 2006, AIAA 2006-6753,
// appendix C; Vallado 2013 §3.7). Δψ, Δε and ε come from Meeus 1998 ch. 22
// (table 22.A, the IAU 1980 theory truncated at 0.0003″) through
// github.com/soniakeys/meeus/v3/nutation; checked against ERFA pmat76,
// nut80, obl80 and numat to 0.002″ (0.0009″ measured, 2000–2050).
func TEMEToEME2000(jdTT float64) [3][3]float64 {
	dψu, dεu := nutation.Nutation(jdTT)
	dψ, dε := dψu.Rad(), dεu.Rad()
	ε := nutation.MeanObliquity(jdTT).Rad()
	eq := dψ * math.Cos(ε)
	P := precessionJ2000ToDate(CenturiesTT(jdTT))
	N := mul3(rot1(-ε-dε), mul3(rot3(-dψ), rot1(ε)))
	// TEME → true of date: r_TOD = R3(−Eq) r_TEME.
	E := rot3(-eq)
	M := mul3(transpose3(P), mul3(transpose3(N), E))
	return [3][3]float64(M)
}

// rot1 and rot3 are the frame rotations about x and z by a (the sense used
// by precession and nutation matrices: R3(a)·v expresses v in axes turned
// by +a).
func rot1(a float64) mat3 {
	s, c := math.Sincos(a)
	return mat3{{1, 0, 0}, {0, c, s}, {0, -s, c}}
}

func rot3(a float64) mat3 {
	s, c := math.Sincos(a)
	return mat3{{c, s, 0}, {-s, c, 0}, {0, 0, 1}}
}

func mul3(a, b mat3) mat3 {
	var out mat3
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			out[i][j] = a[i][0]*b[0][j] + a[i][1]*b[1][j] + a[i][2]*b[2][j]
		}
	}
	return out
}

func transpose3(a mat3) mat3 {
	var out mat3
	for i := 0; i < 3; i++ {
		for j := 0; j < 3; j++ {
			out[i][j] = a[j][i]
		}
	}
	return out
}
