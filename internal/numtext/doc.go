// Package numtext prints the numbers of messages as a person would write
// them: a value computed in floating point (a product of two file values, a
// round trip through radians) without the last-digit noise of the binary
// representation, so 0.1 × 0.7 reads 0.07 and not 0.06999999999999999.
//
// # Model
//
// A number is printed with 12 significant digits in the %g style (trailing
// zeros dropped, an exponent for very large and very small values). A value
// written in a file, which has at most a few digits, prints as written.
//
// # Assumptions
//
// Messages need no more than 12 significant digits: the noise of a few
// float64 operations sits near the 16th (IEEE 754 double, 53-bit
// significand: a relative step of 2⁻⁵² ≈ 2.2e-16, closed form).
//
// # Accuracy
//
// The printed value is within half a unit of the 12th significant digit of
// the number.
//
// # References
//
// IEEE 754-2008, binary64 format (the significand width above).
package numtext
