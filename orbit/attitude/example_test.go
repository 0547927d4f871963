package attitude_test

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/orbit"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// Nadir pointing on an invented circular orbit: the body +Z axis points
// to the Earth's centre and +X along the velocity.
func ExampleNadir() {
	s := orbit.State{R: r3.Vec{X: 6878}, V: r3.Vec{Y: 7.6127}}
	a := attitude.Nadir{}.Attitude(0, s, r3.Vec{})
	nadir := a.Rotate(r3.Vec{X: -1})
	vel := a.Rotate(r3.Vec{Y: 1})
	fmt.Printf("nadir in body: %.3f %.3f %.3f\n", nadir.X, nadir.Y, nadir.Z)
	fmt.Printf("velocity in body: %.3f %.3f %.3f\n", vel.X, vel.Y, vel.Z)
	// Output:
	// nadir in body: 0.000 0.000 1.000
	// velocity in body: 1.000 0.000 0.000
}

// A 3-2-1 (yaw, pitch, roll) attitude and back.
func ExampleFromEuler() {
	deg := math.Pi / 180
	q := attitude.FromEuler(attitude.Seq321, 30*deg, 20*deg, 10*deg)
	y, p, r := attitude.ToEuler(attitude.Seq321, q)
	fmt.Printf("%v: %.1f %.1f %.1f deg\n", attitude.Seq321, y/deg, p/deg, r/deg)
	// Output:
	// 3-2-1: 30.0 20.0 10.0 deg
}

// Sun pointing: +Z to the sun whatever the orbit.
func ExampleSun() {
	s := orbit.State{R: r3.Vec{X: 6878}, V: r3.Vec{Y: 7.6127}}
	sun := r3.Unit(r3.Vec{X: 1, Y: 1, Z: 1})
	a := attitude.Sun{}.Attitude(0, s, sun)
	b := a.Rotate(sun)
	fmt.Printf("sun in body: %.3f %.3f %.3f\n", b.X, b.Y, b.Z)
	// Output:
	// sun in body: 0.000 0.000 1.000
}
