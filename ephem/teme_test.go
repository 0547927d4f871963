package ephem

import (
	"math"
	"strconv"
	"testing"
)

// TEMEToEME2000 against ERFA (testdata/gen_teme_erfa.py: pmat76, nut80,
// obl80, numat, Eq = Δψ cos ε) at 41 epochs 2000–2050: the rotation between
// the two matrices is below 0.002″ (0.07 m at 7000 km). The residual is
// Meeus's truncation of the IAU 1980 series (terms below 0.0003″ dropped).
func TestTEMEToEME2000AgainstERFA(t *testing.T) {
	worst := 0.0
	for _, r := range readCSV(t, "teme_erfa.csv") {
		jd, _ := strconv.ParseFloat(r[0], 64)
		got := TEMEToEME2000(jd)
		var want mat3
		for k := 0; k < 9; k++ {
			want[k/3][k%3], _ = strconv.ParseFloat(r[1+k], 64)
		}
		// angle of the rotation gotᵀ·want: acos((trace − 1)/2), read from
		// the off-diagonal part, which is well conditioned at small angles.
		d := mul3(transpose3(mat3(got)), want)
		ang := math.Hypot(math.Hypot(d[2][1]-d[1][2], d[0][2]-d[2][0]), d[1][0]-d[0][1]) / 2
		worst = math.Max(worst, ang/arcsec)
	}
	if worst > 0.002 {
		t.Errorf("worst rotation between TEMEToEME2000 and ERFA %.4f″; want ≤ 0.002″", worst)
	}
	t.Logf("worst %.5f″", worst)
}
