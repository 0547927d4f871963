package sensor

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"
)

// defaultMaxCondition is the largest eigenvalue ratio of NᵀN accepted by
// the least-squares estimators (common practice, no source): past it the
// normals are too close to coplanar for the solution to be trusted.
const defaultMaxCondition = 100.0

// sym3 is a symmetric 3×3 matrix stored as its upper triangle, for the
// fixed-size normal equations of the estimators.
type sym3 struct{ xx, xy, xz, yy, yz, zz float64 }

// addOuter adds w·v vᵀ.
func (m *sym3) addOuter(v r3.Vec, w float64) {
	m.xx += w * v.X * v.X
	m.xy += w * v.X * v.Y
	m.xz += w * v.X * v.Z
	m.yy += w * v.Y * v.Y
	m.yz += w * v.Y * v.Z
	m.zz += w * v.Z * v.Z
}

func (m sym3) mulVec(v r3.Vec) r3.Vec {
	return r3.Vec{
		X: m.xx*v.X + m.xy*v.Y + m.xz*v.Z,
		Y: m.xy*v.X + m.yy*v.Y + m.yz*v.Z,
		Z: m.xz*v.X + m.yz*v.Y + m.zz*v.Z,
	}
}

func (m sym3) det() float64 {
	return m.xx*(m.yy*m.zz-m.yz*m.yz) - m.xy*(m.xy*m.zz-m.yz*m.xz) + m.xz*(m.xy*m.yz-m.yy*m.xz)
}

// eigen returns the eigenvalues in decreasing order by the trigonometric
// closed form of O. K. Smith, "Eigenvalues of a symmetric 3×3 matrix",
// Comm. ACM 4(4):168 (1961) (from memory; checked against gonum mat.EigenSym
// in the tests).
func (m sym3) eigen() (l1, l2, l3 float64) {
	p1 := m.xy*m.xy + m.xz*m.xz + m.yz*m.yz
	if p1 == 0 {
		a, b, c := m.xx, m.yy, m.zz
		if a < b {
			a, b = b, a
		}
		if b < c {
			b, c = c, b
		}
		if a < b {
			a, b = b, a
		}
		return a, b, c
	}
	q := (m.xx + m.yy + m.zz) / 3
	p2 := (m.xx-q)*(m.xx-q) + (m.yy-q)*(m.yy-q) + (m.zz-q)*(m.zz-q) + 2*p1
	p := math.Sqrt(p2 / 6)
	b := sym3{xx: (m.xx - q) / p, xy: m.xy / p, xz: m.xz / p, yy: (m.yy - q) / p, yz: m.yz / p, zz: (m.zz - q) / p}
	r := max(-1, min(1, b.det()/2))
	phi := math.Acos(r) / 3
	l1 = q + 2*p*math.Cos(phi)
	l3 = q + 2*p*math.Cos(phi+2*math.Pi/3)
	return l1, 3*q - l1 - l3, l3
}

// inverse returns m⁻¹ by the adjugate, or false when m is not positive
// definite or its condition number λmax/λmin exceeds maxCond.
func (m sym3) inverse(maxCond float64) (sym3, bool) {
	l1, _, l3 := m.eigen()
	if !(l3 > 0) || l1 > maxCond*l3 {
		return sym3{}, false
	}
	d := m.det()
	return sym3{
		xx: (m.yy*m.zz - m.yz*m.yz) / d,
		xy: (m.xz*m.yz - m.xy*m.zz) / d,
		xz: (m.xy*m.yz - m.xz*m.yy) / d,
		yy: (m.xx*m.zz - m.xz*m.xz) / d,
		yz: (m.xy*m.xz - m.xx*m.yz) / d,
		zz: (m.xx*m.yy - m.xy*m.xy) / d,
	}, true
}
