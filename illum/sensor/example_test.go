package sensor_test

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/sensor"
)

// Six cosine sensors on a cube, sun on +X, albedo of 10 % of the direct sun
// on the −Z (nadir) sensor only: the pair difference is off by atan(0.1).
func ExampleOppositePairs() {
	var ss []sensor.Sensor
	for _, f := range []string{"+X", "-X", "+Y", "-Y", "+Z", "-Z"} {
		face, _ := sensor.ParseFace(f)
		m, _ := sensor.FaceMount(face, 0, sensor.FaceNone, 0)
		c, _ := sensor.NewCosine(sensor.CosineSpec{Name: "css" + f, Mount: m, HalfAngle: math.Pi / 2, Threshold: 0.01})
		ss = append(ss, c)
	}
	a, _ := sensor.NewArray(ss...)
	alb := make([]sensor.Albedo, a.Len())
	alb[5] = sensor.Albedo{Irradiance: 0.1 * sensor.SolarConstant, Dir: r3.Vec{Z: -1}}
	r := make([]sensor.Reading, a.Len())
	a.Read(r, r3.Vec{X: 1}, sensor.SolarConstant, alb, nil)
	for _, name := range []string{"opposite-pairs", "least-squares"} {
		est, _ := sensor.EstimatorByName(name)
		e := est.Estimate(a, r)
		if !e.Valid {
			fmt.Printf("%s: no estimate (%d lit sensors)\n", name, e.N)
			continue
		}
		fmt.Printf("%s: error %.3f° from %d sensors\n", name, math.Acos(e.Dir.X)*180/math.Pi, e.N)
	}
	// Output:
	// opposite-pairs: error 5.711° from 6 sensors
	// least-squares: no estimate (2 lit sensors)
}

// A quadrant sensor with a 2 mm aperture 1 mm above 2 mm cells: the
// normalised difference is 2h·tan α/w, and the reading inverts it.
func ExampleQuadrant() {
	m, _ := sensor.FaceMount(sensor.FacePlusZ, 0, sensor.FaceNone, 0)
	q, _ := sensor.NewQuadrant(sensor.QuadrantSpec{Name: "quad", Mount: m,
		ApertureSide: 2, Height: 1, CellSide: 2, Sigma: math.Pi / 180})
	tan20 := math.Tan(20 * math.Pi / 180)
	fmt.Printf("X(20°) = %.5f\n", q.Transfer(tan20))
	r := q.Read(r3.Unit(r3.Vec{X: tan20, Z: 1}), sensor.SolarConstant, sensor.Albedo{}, nil)
	fmt.Printf("measured %.4f° off boresight, valid %v\n", math.Acos(r.Dir.Z)*180/math.Pi, r.Valid)
	fmt.Printf("FOV cone %.1f°\n", q.HalfAngle()*180/math.Pi)
	// Output:
	// X(20°) = 0.36397
	// measured 20.0000° off boresight, valid true
	// FOV cone 76.7°
}

// Three ideal cosine sensors read in one pass through a bank, without and
// with an albedo of 5 % of full sun on each: the sensor on +X, 30° from the
// sun, reads cos 30° = 0.866 (closed form), the one on +Y, 60° from it,
// 0.5, and the one on −X only the albedo.
func ExampleCosineBank() {
	var cs []*sensor.Cosine
	for _, f := range []string{"+X", "+Y", "-X"} {
		face, _ := sensor.ParseFace(f)
		m, _ := sensor.FaceMount(face, 0, sensor.FaceNone, 0)
		c, _ := sensor.NewCosine(sensor.CosineSpec{Name: "css" + f, Mount: m, HalfAngle: math.Pi / 2, Threshold: 0.01})
		cs = append(cs, c)
	}
	bank := sensor.NewCosineBank(cs)
	sun := r3.Vec{X: math.Cos(math.Pi / 6), Y: math.Sin(math.Pi / 6)}
	alb := make([]sensor.Albedo, bank.Len())
	for i := range alb {
		alb[i].Irradiance = 0.05 * sensor.SolarConstant
	}
	noAlb, withAlb := make([]sensor.Reading, bank.Len()), make([]sensor.Reading, bank.Len())
	bank.ReadPair(noAlb, withAlb, sun, sensor.SolarConstant, alb, nil, nil)
	for i, c := range cs {
		fmt.Printf("%s: %.3f (valid %v), with albedo %.3f\n", c.Name(), noAlb[i].Signal, noAlb[i].Valid, withAlb[i].Signal)
	}
	// Output:
	// css+X: 0.866 (valid true), with albedo 0.916
	// css+Y: 0.500 (valid true), with albedo 0.550
	// css-X: 0.000 (valid false), with albedo 0.050
}

// A home-made digital sensor sized before it is built: nine apertures over
// 1 mm, 1.5 mm above a 5.6 mm detector of 5.5 µm pixels, each spot
// centroided to 0.2 pixel. Pinhole geometry (closed form): the field per
// axis is atan((5.6 − 1)/(2·1.5)) = 56.9°, the noise at the boresight
// 5.5 µm·0.2/(1.5 mm·√9) = 2.44·10⁻⁴ rad = 0.0140°; a sun 56° off along x
// is read, 57° off is not.
func ExampleNewApertureArray() {
	face, _ := sensor.ParseFace("-Z")
	m, _ := sensor.FaceMount(face, 0, sensor.FaceNone, 0)
	a, _ := sensor.NewApertureArray(sensor.ApertureArraySpec{Name: "dss", Mount: m, MaskHeight: 1.5, DetectorSide: 5.6,
		PixelPitch: 0.0055, CentroidSigma: 0.2, Apertures: 9, ArraySide: 1, Threshold: 0.05})
	fmt.Printf("field ±%.1f° per axis, σ %.4f° at the boresight\n", a.AxisHalfAngle()*180/math.Pi, a.Sigma()*180/math.Pi)
	for _, deg := range []float64{56, 57} {
		t := math.Tan(deg * math.Pi / 180)
		sun := r3.Vec{X: t / math.Sqrt(1+t*t), Z: -1 / math.Sqrt(1+t*t)}
		fmt.Printf("sun %g° off: valid %v\n", deg, a.Read(sun, sensor.SolarConstant, sensor.Albedo{}, nil).Valid)
	}
	// Output:
	// field ±56.9° per axis, σ 0.0140° at the boresight
	// sun 56° off: valid true
	// sun 57° off: valid false
}
