package filter_test

import (
	"fmt"
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/sensor/filter"
)

// A spacecraft spinning at 2°/s about its Z axis reads the sun on a
// two-axis sensor for a minute, then goes into a 30-minute eclipse with a
// gyro of 0.3°/√h angle random walk and 10°/h bias instability: the
// filter's direction stays within its own 1σ growth (closed form for a
// spin: the body-frame sun turns about Z at −2°/s).
func Example() {
	const deg = math.Pi / 180
	f, _ := filter.New(filter.Settings{ARW: 0.3 * deg / 60, BiasSigma: 10 * deg / 3600, BiasTau: 3600,
		StartSigma: 5 * deg, StartLengthSigma: 0.05, MaxSigma: 10 * deg, Gate: 5})
	rng := rand.New(rand.NewPCG(1, 1))
	gyro := filter.NewGyro(0.3*deg/60, 10*deg/3600, 3600, rng)
	w := r3.Vec{Z: 2 * deg}
	sun := func(t float64) r3.Vec { // body axes
		return r3.Vec{X: 0.6 * math.Cos(-w.Z*t), Y: 0.6 * math.Sin(-w.Z*t), Z: 0.8}
	}
	f.Start(sun(0))
	for k := 1; k <= 60+1800; k++ {
		t := float64(k)
		f.Propagate(gyro.Measure(r3.Scale(1, w), 1, rng), 1)
		if k <= 60 {
			f.Direction(sun(t), 0.1*deg) // noise-free readings of stated 1σ 0.1°
		}
		if k == 60 || k == 60+1800 {
			s := sun(t)
			e := math.Atan2(r3.Norm(r3.Cross(f.Sun(), s)), r3.Dot(f.Sun(), s)) / deg
			fmt.Printf("t = %4.0f s: error %.2f°, 1σ %.2f°, valid %v\n", t, e, f.Sigma()/deg, f.Valid())
		}
	}
	// Output:
	// t =   60 s: error 0.04°, 1σ 0.04°, valid true
	// t = 1860 s: error 1.75°, 1σ 2.31°, valid true
}
