package illum

import (
	"fmt"

	"gonum.org/v1/gonum/spatial/r3"
)

func ExampleShadowConical() {
	sun := r3.Vec{X: 149597870.7} // 1 AU on +X
	for _, sat := range []r3.Vec{
		{X: 6878},               // noon, 500 km
		{X: -6878},              // midnight
		{X: -3439, Y: 6377.137}, // 1 km inside the shadow cylinder
	} {
		lit, region := ShadowConical(sat, sun)
		fmt.Printf("%-8v %.3f\n", region, lit)
	}
	// Output:
	// sunlit   1.000
	// umbra    0.000
	// penumbra 0.455
}

func ExampleFindEclipses() {
	// A 500 km circular orbit in the sun's plane (β = 0), closed form.
	g, T := betaOrbit(500, 0)
	for _, e := range FindEclipses(g, 0, T, 60) {
		fmt.Printf("shadow %.1f min, umbra %.1f min, penumbra %.1f s each side\n",
			e.Duration()/60, e.UmbraDuration()/60, (e.Duration()-e.UmbraDuration())/2)
	}
	fmt.Printf("cylinder %.1f min\n", EclipseFractionCircular(500, 0)*T/60)
	// Output:
	// shadow 35.9 min, umbra 35.6 min, penumbra 8.4 s each side
	// cylinder 35.8 min
}
