package attitude

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"gonum.org/v1/gonum/num/quat"
	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
)

// Identity is the rotation that leaves every vector unchanged.
var Identity = r3.Rotation{Real: 1}

// then returns the rotation "a, then b" (gonum's quat.Mul(b, a)).
func then(a, b r3.Rotation) r3.Rotation {
	return r3.Rotation(quat.Mul(quat.Number(b), quat.Number(a)))
}

// Inverse returns the inverse of a unit rotation (its conjugate).
func Inverse(a r3.Rotation) r3.Rotation { return r3.Rotation(quat.Conj(quat.Number(a))) }

// frameTurn is the frame rotation R_axis(θ) of Wertz 1978 App. E (from memory):
// the coordinates of a fixed vector in a frame turned by +θ about axis.
// It is the active rotation by −θ.
func frameTurn(θ float64, axis r3.Vec) r3.Rotation {
	s, c := math.Sincos(-θ / 2)
	return r3.Rotation{Real: c, Imag: s * axis.X, Jmag: s * axis.Y, Kmag: s * axis.Z}
}

// canonical returns q or −q, whichever has a non-negative scalar part.
func canonical(q r3.Rotation) r3.Rotation {
	if q.Real < 0 {
		return r3.Rotation{Real: -q.Real, Imag: -q.Imag, Jmag: -q.Jmag, Kmag: -q.Kmag}
	}
	return q
}

// normalise scales q to unit norm.
func normalise(q r3.Rotation) r3.Rotation {
	n := math.Sqrt(q.Real*q.Real + q.Imag*q.Imag + q.Jmag*q.Jmag + q.Kmag*q.Kmag)
	return r3.Rotation{Real: q.Real / n, Imag: q.Imag / n, Jmag: q.Jmag / n, Kmag: q.Kmag / n}
}

// dcm is a row-major 3×3 direction-cosine matrix C with v_body = C·v_ECI.
type dcm [3][3]float64

// quatToDCM returns the matrix of the active rotation q·p·q̄ (Shuster 1993,
// J. Astronaut. Sci. 41(4), eq. 159, from memory, with the vector part negated
// for the active sense).
func quatToDCM(q r3.Rotation) dcm {
	w, x, y, z := q.Real, q.Imag, q.Jmag, q.Kmag
	return dcm{
		{1 - 2*(y*y+z*z), 2 * (x*y - w*z), 2 * (x*z + w*y)},
		{2 * (x*y + w*z), 1 - 2*(x*x+z*z), 2 * (y*z - w*x)},
		{2 * (x*z - w*y), 2 * (y*z + w*x), 1 - 2*(x*x+y*y)},
	}
}

// dcmToQuat is Shepperd's method (Shepperd 1978, J. Guidance & Control 1(3)
// 223–224, from memory): take the largest of the four squared components,
// computed from the trace and diagonal, and the rest from off-diagonal sums
// and differences, so no division by a small number occurs.
func dcmToQuat(c dcm) r3.Rotation {
	tr := c[0][0] + c[1][1] + c[2][2]
	var q r3.Rotation
	switch {
	case tr >= c[0][0] && tr >= c[1][1] && tr >= c[2][2]:
		w := 0.5 * math.Sqrt(1+tr) // 4w² = 1 + tr
		f := 0.25 / w
		q = r3.Rotation{Real: w, Imag: f * (c[2][1] - c[1][2]), Jmag: f * (c[0][2] - c[2][0]), Kmag: f * (c[1][0] - c[0][1])}
	case c[0][0] >= c[1][1] && c[0][0] >= c[2][2]:
		x := 0.5 * math.Sqrt(1+c[0][0]-c[1][1]-c[2][2]) // 4x² = 1 + 2C₁₁ − tr
		f := 0.25 / x
		q = r3.Rotation{Real: f * (c[2][1] - c[1][2]), Imag: x, Jmag: f * (c[0][1] + c[1][0]), Kmag: f * (c[0][2] + c[2][0])}
	case c[1][1] >= c[2][2]:
		y := 0.5 * math.Sqrt(1-c[0][0]+c[1][1]-c[2][2])
		f := 0.25 / y
		q = r3.Rotation{Real: f * (c[0][2] - c[2][0]), Imag: f * (c[0][1] + c[1][0]), Jmag: y, Kmag: f * (c[1][2] + c[2][1])}
	default:
		z := 0.5 * math.Sqrt(1-c[0][0]-c[1][1]+c[2][2])
		f := 0.25 / z
		q = r3.Rotation{Real: f * (c[1][0] - c[0][1]), Imag: f * (c[0][2] + c[2][0]), Jmag: f * (c[1][2] + c[2][1]), Kmag: z}
	}
	return canonical(normalise(q))
}

// ToDCM returns the direction-cosine matrix C of a (body ← ECI) with
// v_body = C·v_ECI, i.e. C·v equals a.Rotate(v).
func ToDCM(a r3.Rotation) *r3.Mat {
	c := quatToDCM(a)
	return r3.NewMat([]float64{c[0][0], c[0][1], c[0][2], c[1][0], c[1][1], c[1][2], c[2][0], c[2][1], c[2][2]})
}

// FromDCM returns the unit rotation whose ToDCM is m, by Shepperd's method
// (Shepperd 1978, from memory). The result has a non-negative scalar part.
// m must be a proper orthonormal matrix; it is not re-orthogonalised.
func FromDCM(m *r3.Mat) r3.Rotation {
	var c dcm
	for i := range 3 {
		for j := range 3 {
			c[i][j] = m.At(i, j)
		}
	}
	return dcmToQuat(c)
}

// EulerSequence names the axes of a three-angle frame-rotation sequence:
// any of the twelve sequences whose successive axes differ (six symmetric
// ones such as 3-1-3, six asymmetric ones such as 3-2-1).
type EulerSequence int

const (
	// Seq321 is yaw–pitch–roll: C = R₁(φ₃)·R₂(φ₂)·R₃(φ₁), first about z.
	// Angles: φ₁ ∈ (−π, π], φ₂ ∈ [−π/2, π/2], φ₃ ∈ (−π, π].
	Seq321 EulerSequence = iota + 1
	// Seq313 is the classical orbit-element sequence (Ω, i, ω):
	// C = R₃(φ₃)·R₁(φ₂)·R₃(φ₁). Angles: φ₂ ∈ [0, π].
	Seq313
	// The other ten sequences, named by their axes.
	Seq121
	Seq123
	Seq131
	Seq132
	Seq212
	Seq213
	Seq231
	Seq232
	Seq312
	Seq323
)

// eulerAxes holds each sequence's axis numbers (1 = x, 2 = y, 3 = z).
var eulerAxes = map[EulerSequence][3]int{
	Seq321: {3, 2, 1}, Seq313: {3, 1, 3}, Seq121: {1, 2, 1}, Seq123: {1, 2, 3}, Seq131: {1, 3, 1}, Seq132: {1, 3, 2},
	Seq212: {2, 1, 2}, Seq213: {2, 1, 3}, Seq231: {2, 3, 1}, Seq232: {2, 3, 2}, Seq312: {3, 1, 2}, Seq323: {3, 2, 3},
}

// String returns the sequence name, such as "3-2-1".
func (s EulerSequence) String() string {
	a, ok := eulerAxes[s]
	if !ok {
		return "unknown"
	}
	return fmt.Sprintf("%d-%d-%d", a[0], a[1], a[2])
}

// ParseEulerSequence reads a sequence as "321" or "3-2-1": three axis
// numbers 1–3, no two successive ones equal.
func ParseEulerSequence(s string) (EulerSequence, error) {
	for seq := range eulerAxes {
		name := seq.String()
		if s == name || s == strings.ReplaceAll(name, "-", "") {
			return seq, nil
		}
	}
	return 0, errors.New("attitude: euler sequence " + `"` + s + `"` + " unknown; use three axis numbers 1–3 with no two successive ones equal, such as \"3-2-1\" or \"3-1-3\"")
}

var axes = [4]r3.Vec{{}, {X: 1}, {Y: 1}, {Z: 1}}

func (s EulerSequence) axisIndices() (int, int, int) {
	a, ok := eulerAxes[s]
	if !ok {
		panic("attitude: invalid EulerSequence")
	}
	return a[0], a[1], a[2]
}

// FromEuler returns the body ← reference rotation of three successive
// frame rotations by φ1, φ2, φ3 (radians) about the sequence's axes
// (Wertz 1978 App. E, from memory): the frame turns first by φ1 about the
// first axis, then by φ2 about the new second axis, then by φ3.
func FromEuler(seq EulerSequence, φ1, φ2, φ3 float64) r3.Rotation {
	i, j, k := seq.axisIndices()
	return then(then(frameTurn(φ1, axes[i]), frameTurn(φ2, axes[j])), frameTurn(φ3, axes[k]))
}

// ToEuler returns the angles of a in the sequence, inverse of FromEuler,
// for the 3-2-1 and 3-1-3 sequences (it panics for the others).
// At the gimbal-lock singularity (φ2 = ±π/2 for 3-2-1, 0 or π for 3-1-3)
// φ3 is set to 0 and φ1 takes the whole rotation about the first axis.
func ToEuler(seq EulerSequence, a r3.Rotation) (φ1, φ2, φ3 float64) {
	c := quatToDCM(a)
	switch seq {
	case Seq321:
		// C = [[cθcψ, cθsψ, −sθ], [·, ·, sφcθ], [·, ·, cφcθ]]
		// (Schaub & Junkins 2018, 4th ed., eq. 3.33, from memory).
		s := max(-1, min(1, -c[0][2]))
		φ2 = math.Asin(s)
		if math.Abs(s) > 1-1e-12 {
			// Gimbal lock: C₁₀ = −sψ', C₁₁ = cψ' with φ3 = 0.
			return math.Atan2(-c[1][0], c[1][1]), φ2, 0
		}
		return math.Atan2(c[0][1], c[0][0]), φ2, math.Atan2(c[1][2], c[2][2])
	case Seq313:
		// C = [[·, ·, sωsi], [·, ·, cωsi], [sisΩ, −sicΩ, ci]]
		// (Schaub & Junkins 2018, 4th ed., eq. 3.37, from memory).
		ci := max(-1, min(1, c[2][2]))
		φ2 = math.Acos(ci)
		if math.Abs(ci) > 1-1e-12 {
			// Gimbal lock: C₀₀ = cΩ', C₀₁ = sΩ' with φ3 = 0.
			return math.Atan2(c[0][1], c[0][0]), φ2, 0
		}
		return math.Atan2(c[2][0], -c[2][1]), φ2, math.Atan2(c[0][2], c[1][2])
	}
	panic("attitude: ToEuler supports the 3-2-1 and 3-1-3 sequences only")
}

// triadBasis returns the orthonormal TRIAD frame of (p, s): t1 = p̂,
// t2 = (p × s)^, t3 = t1 × t2 (Black 1964, AIAA J. 2(7), from memory).
// ok is false when p and s are parallel within 1e-12 (or either is zero).
func triadBasis(p, s r3.Vec) (t1, t2, t3 r3.Vec, ok bool) {
	np := vecmath.Norm(p)
	if np == 0 {
		return t1, t2, t3, false
	}
	t1 = r3.Scale(1/np, p)
	c := r3.Cross(t1, s)
	nc := vecmath.Norm(c)
	if nc <= 1e-12*vecmath.Norm(s) || nc == 0 {
		return t1, t2, t3, false
	}
	t2 = r3.Scale(1/nc, c)
	t3 = r3.Cross(t1, t2)
	return t1, t2, t3, true
}

// triad returns body ← ECI mapping primaryECI exactly onto primaryBody and
// putting secondaryECI in the plane of primaryBody and secondaryBody.
func triad(pb, pi, sb, si r3.Vec) (r3.Rotation, bool) {
	b1, b2, b3, ok1 := triadBasis(pb, sb)
	i1, i2, i3, ok2 := triadBasis(pi, si)
	if !ok1 || !ok2 {
		return Identity, false
	}
	// C = Σ b_k i_kᵀ (Black 1964, from memory; Shuster & Oh 1981 eq. 9).
	var c dcm
	for r := range 3 {
		br := [3]float64{comp(b1, r), comp(b2, r), comp(b3, r)}
		for col := range 3 {
			c[r][col] = br[0]*comp(i1, col) + br[1]*comp(i2, col) + br[2]*comp(i3, col)
		}
	}
	return dcmToQuat(c), true
}

func comp(v r3.Vec, i int) float64 {
	switch i {
	case 0:
		return v.X
	case 1:
		return v.Y
	}
	return v.Z
}

// ErrParallel reports TRIAD vectors that are parallel or zero.
var ErrParallel = errors.New("attitude: triad primary and secondary vectors are parallel or zero; choose a secondary direction not along the primary")

// FromTriad returns the body ← ECI rotation built by TRIAD (Black 1964,
// AIAA J. 2(7) 1350–1351, from memory): the primary direction is matched
// exactly, the secondary only within the plane the two span.
func FromTriad(primaryBody, primaryECI, secondaryBody, secondaryECI r3.Vec) (r3.Rotation, error) {
	q, ok := triad(primaryBody, primaryECI, secondaryBody, secondaryECI)
	if !ok {
		return Identity, ErrParallel
	}
	return q, nil
}

// perpendicular returns a unit vector perpendicular to the unit vector u,
// the cross product with the coordinate axis least aligned with u.
func perpendicular(u r3.Vec) r3.Vec {
	ax, ay, az := math.Abs(u.X), math.Abs(u.Y), math.Abs(u.Z)
	var e r3.Vec
	switch {
	case ax <= ay && ax <= az:
		e = r3.Vec{X: 1}
	case ay <= az:
		e = r3.Vec{Y: 1}
	default:
		e = r3.Vec{Z: 1}
	}
	return vecmath.Unit(r3.Cross(u, e))
}

// AngleBetween returns the rotation angle of b·a⁻¹ in [0, π] (radians).
func AngleBetween(a, b r3.Rotation) float64 {
	d := then(Inverse(a), b)
	return RotationAngle(d)
}

// RotationAngle returns the rotation angle of a unit quaternion in [0, π].
func RotationAngle(q r3.Rotation) float64 {
	v := math.Sqrt(q.Imag*q.Imag + q.Jmag*q.Jmag + q.Kmag*q.Kmag)
	return 2 * math.Atan2(v, math.Abs(q.Real))
}
