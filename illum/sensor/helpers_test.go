package sensor

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

const deg = math.Pi / 180

// cube returns six ideal hemispherical cosine sensors on ±X, ±Y, ±Z.
func cube(t testing.TB, errs Errors) *Array {
	t.Helper()
	var ss []Sensor
	for f := FacePlusX; f <= FaceMinusZ; f++ {
		m, err := FaceMount(f, 0, FaceNone, 0)
		if err != nil {
			t.Fatal(err)
		}
		c, err := NewCosine(CosineSpec{Name: "css" + f.String(), Mount: m, HalfAngle: 90 * deg, Threshold: 0.01, Errors: errs})
		if err != nil {
			t.Fatal(err)
		}
		ss = append(ss, c)
	}
	a, err := NewArray(ss...)
	if err != nil {
		t.Fatal(err)
	}
	return a
}

func angle(a, b r3.Vec) float64 {
	return math.Atan2(r3.Norm(r3.Cross(a, b)), r3.Dot(a, b))
}
