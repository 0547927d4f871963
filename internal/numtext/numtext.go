package numtext

import (
	"fmt"
	"strconv"
)

// Format prints v with 12 significant digits in the %g style.
func Format(v float64) string {
	return strconv.FormatFloat(v, 'g', 12, 64)
}

// Clean returns the arguments of a message with each float64 printed by
// Format under a plain %g or %v verb; a verb with a width or a precision
// (%.1f, %8.3g) keeps its own formatting.
func Clean(args []any) []any {
	out := make([]any, len(args))
	for i, a := range args {
		switch v := a.(type) {
		case float64:
			out[i] = number(v)
		default:
			out[i] = a
		}
	}
	return out
}

type number float64

// Format implements fmt.Formatter.
func (n number) Format(f fmt.State, verb rune) {
	_, wide := f.Width()
	_, precise := f.Precision()
	if (verb == 'g' || verb == 'v') && !wide && !precise && !f.Flag('+') && !f.Flag('#') {
		fmt.Fprint(f, Format(float64(n)))
		return
	}
	fmt.Fprintf(f, fmt.FormatString(f, verb), float64(n))
}
