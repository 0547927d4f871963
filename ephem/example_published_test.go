package ephem_test

import (
	"fmt"
	"math"
	"time"

	"codeberg.org/sunsight/sunsight/ephem"
)

// hms writes an angle in degrees as hours, minutes and seconds of time.
func hms(deg float64) string {
	h := deg / 15
	m := (h - math.Floor(h)) * 60
	s := (m - math.Floor(m)) * 60
	return fmt.Sprintf("%dh%02dm%07.4fs", int(h), int(m), s)
}

// Meeus, Astronomical Algorithms, 2nd ed. 1998, Example 7.a p. 61: the
// launch of Sputnik 1, 1957 October 4.81, is JD 2436116.31.
func ExampleJulianDateUT1() {
	jd := ephem.JulianDateUT1(time.Date(1957, 10, 4, 19, 26, 24, 0, time.UTC))
	fmt.Printf("JD %.2f\n", jd)
	// Output: JD 2436116.31
}

// Meeus 1998, Example 12.a p. 88: mean sidereal time at Greenwich on 1987
// April 10, 0h UT, is 13h10m46.3668s.
func ExampleGMST_midnight() {
	jd := ephem.JulianDateUT1(time.Date(1987, 4, 10, 0, 0, 0, 0, time.UTC))
	fmt.Println("GMST", hms(ephem.GMST(jd)*180/math.Pi))
	// Output: GMST 13h10m46.3668s
}

// Vallado, Fundamentals of Astrodynamics and Applications, 4th ed. 2013,
// Example 3-5 p. 188: GMST on 1992 August 20, 12:14 UT1, is 152.578788°.
func ExampleGMST_vallado() {
	jd := ephem.JulianDateUT1(time.Date(1992, 8, 20, 12, 14, 0, 0, time.UTC))
	fmt.Printf("GMST %.6f°\n", ephem.GMST(jd)*180/math.Pi)
	// Output: GMST 152.578788°
}

// Meeus 1998, Example 25.a p. 165: on 1992 October 13.0 TD the Sun is
// R = 0.99766 AU from the Earth.
func ExampleMeeus_Position() {
	_, dKm := ephem.Meeus{}.Position(2448908.5)
	fmt.Printf("R %.5f AU\n", dKm/ephem.AUKm)
	// Output: R 0.99766 AU
}
