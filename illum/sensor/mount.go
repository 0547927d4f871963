package sensor

import (
	"fmt"
	"math"
	"strings"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
)

// Face names one of the six body faces of a box-shaped spacecraft.
type Face int

// The six faces. FaceNone marks a mount given by an explicit boresight vector.
const (
	FaceNone Face = iota
	FacePlusX
	FaceMinusX
	FacePlusY
	FaceMinusY
	FacePlusZ
	FaceMinusZ
)

var faceNames = [...]string{"", "+X", "-X", "+Y", "-Y", "+Z", "-Z"}

// String returns the face as "+X", "-Y", ...; FaceNone gives "".
func (f Face) String() string {
	if f < FaceNone || f > FaceMinusZ {
		return fmt.Sprintf("Face(%d)", int(f))
	}
	return faceNames[f]
}

// ParseFace reads "+X", "-x", "x" (meaning +X), "−Z" (with a Unicode minus).
func ParseFace(s string) (Face, error) {
	t := strings.ToUpper(strings.TrimSpace(s))
	t = strings.ReplaceAll(t, "−", "-")
	if len(t) == 1 {
		t = "+" + t
	}
	for f := FacePlusX; f <= FaceMinusZ; f++ {
		if faceNames[f] == t {
			return f, nil
		}
	}
	return FaceNone, fmt.Errorf("sensor: face %q: want one of +X, -X, +Y, -Y, +Z, -Z", s)
}

// Normal returns the outward unit normal of the face in body axes (zero for FaceNone).
func (f Face) Normal() r3.Vec {
	switch f {
	case FacePlusX:
		return r3.Vec{X: 1}
	case FaceMinusX:
		return r3.Vec{X: -1}
	case FacePlusY:
		return r3.Vec{Y: 1}
	case FaceMinusY:
		return r3.Vec{Y: -1}
	case FacePlusZ:
		return r3.Vec{Z: 1}
	case FaceMinusZ:
		return r3.Vec{Z: -1}
	}
	return r3.Vec{}
}

// defaultRef is the body axis that a face's sensor X axis is built from:
// +Z for the X and Y faces, +X for the Z faces.
func (f Face) defaultRef() r3.Vec {
	if f == FacePlusZ || f == FaceMinusZ {
		return r3.Vec{X: 1}
	}
	return r3.Vec{Z: 1}
}

// Mount places a sensor on the body: its frame has the boresight along
// sensor +Z and, for two-axis kinds, the measuring axes along sensor X and Y.
// The zero Mount is not usable; build one with FaceMount or VectorMount.
type Mount struct {
	face    Face
	tilt    float64 // rad
	toward  Face
	clock   float64 // rad
	axes    [3]r3.Vec
	defined bool
}

// FaceMount mounts a sensor on a face. The boresight starts along the face
// normal, is tilted by tilt radians toward the body axis of face toward
// (which must be perpendicular to the face; FaceNone when tilt is zero), and
// the sensor X/Y axes are then clocked by clock radians about the boresight
// (right-handed). Before clocking, sensor X is the projection of +Z on the
// plane of an X or Y face, and of +X for a Z face.
func FaceMount(face Face, tilt float64, toward Face, clock float64) (Mount, error) {
	n := face.Normal()
	if n == (r3.Vec{}) {
		return Mount{}, fmt.Errorf("sensor: mount face %v: want one of +X, -X, +Y, -Y, +Z, -Z", face)
	}
	if math.IsNaN(tilt) || math.Abs(tilt) > math.Pi/2 {
		return Mount{}, fmt.Errorf("sensor: mount tilt %g rad: want a finite angle within ±90°", tilt)
	}
	if math.IsNaN(clock) || math.IsInf(clock, 0) {
		return Mount{}, fmt.Errorf("sensor: mount clock %g rad: want a finite angle", clock)
	}
	ref := face.defaultRef()
	z := n
	if tilt != 0 {
		t := toward.Normal()
		if t == (r3.Vec{}) || math.Abs(r3.Dot(t, n)) > 1e-12 {
			return Mount{}, fmt.Errorf("sensor: mount tilt toward %q on face %v: want an axis perpendicular to the face", toward.String(), face)
		}
		axis := r3.Cross(n, t) // rotating n about n×t moves it toward t
		z = r3.Rotate(n, tilt, axis)
		ref = r3.Rotate(ref, tilt, axis)
	}
	m, err := frameFrom(z, ref)
	if err != nil {
		return Mount{}, err
	}
	if clock != 0 {
		m.axes[0] = r3.Rotate(m.axes[0], clock, z)
		m.axes[1] = r3.Rotate(m.axes[1], clock, z)
	}
	m.face, m.tilt, m.toward, m.clock = face, tilt, toward, clock
	return m, nil
}

// VectorMount mounts a sensor with an explicit boresight (body axes, any
// length > 0). Sensor X is the projection of ref on the plane normal to the
// boresight; a zero ref picks the body axis least aligned with the boresight.
func VectorMount(boresight, ref r3.Vec) (Mount, error) {
	if !(vecmath.Norm(boresight) > 0) || math.IsInf(vecmath.Norm(boresight), 0) {
		return Mount{}, fmt.Errorf("sensor: mount boresight %v: want a finite non-zero vector", boresight)
	}
	z := vecmath.Unit(boresight)
	if ref == (r3.Vec{}) {
		ref = leastAligned(z)
	}
	return frameFrom(z, ref)
}

func leastAligned(z r3.Vec) r3.Vec {
	ax, ay, az := math.Abs(z.X), math.Abs(z.Y), math.Abs(z.Z)
	switch {
	case ax <= ay && ax <= az:
		return r3.Vec{X: 1}
	case ay <= az:
		return r3.Vec{Y: 1}
	}
	return r3.Vec{Z: 1}
}

func frameFrom(z, ref r3.Vec) (Mount, error) {
	x := r3.Sub(ref, r3.Scale(r3.Dot(ref, z), z))
	if vecmath.Norm(x) < 1e-9 {
		return Mount{}, fmt.Errorf("sensor: mount reference axis %v is parallel to the boresight %v: give another reference", ref, z)
	}
	x = vecmath.Unit(x)
	y := r3.Cross(z, x)
	return Mount{axes: [3]r3.Vec{x, y, z}, defined: true}, nil
}

// Boresight returns the boresight (sensor +Z) in body axes.
func (m Mount) Boresight() r3.Vec { return m.axes[2] }

// Axes returns the sensor X, Y and Z axes in body axes.
func (m Mount) Axes() (x, y, z r3.Vec) { return m.axes[0], m.axes[1], m.axes[2] }

// Face returns the face of a face mount, FaceNone for a vector mount.
func (m Mount) Face() Face { return m.face }

// Tilt returns the tilt (rad) and the face it tilts toward.
func (m Mount) Tilt() (float64, Face) { return m.tilt, m.toward }

// ToSensor expresses a body-axes vector in sensor axes.
func (m Mount) ToSensor(v r3.Vec) r3.Vec {
	return r3.Vec{X: r3.Dot(m.axes[0], v), Y: r3.Dot(m.axes[1], v), Z: r3.Dot(m.axes[2], v)}
}

// ToBody expresses a sensor-axes vector in body axes.
func (m Mount) ToBody(v r3.Vec) r3.Vec {
	return r3.Add(r3.Add(r3.Scale(v.X, m.axes[0]), r3.Scale(v.Y, m.axes[1])), r3.Scale(v.Z, m.axes[2]))
}

// Misaligned returns the mount turned by the small rotation vector phi
// (rad, in sensor axes): the frame the light really meets when the unit is
// mounted with that error.
func (m Mount) Misaligned(phi r3.Vec) Mount {
	a := vecmath.Norm(phi)
	if a == 0 {
		return m
	}
	out := m
	for i := range 3 {
		var e r3.Vec
		switch i {
		case 0:
			e.X = 1
		case 1:
			e.Y = 1
		default:
			e.Z = 1
		}
		out.axes[i] = m.ToBody(r3.Rotate(e, a, phi))
	}
	return out
}
