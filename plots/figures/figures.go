// Package figures is the catalogue of the design-review figures a run can
// draw: each entry's name (the output.figures value and the file stem), what
// it shows and what it is computed from. The scenario file reads the names
// from here; scenario/review builds the figures of the names a run asks for.
//
// # Model
//
// A catalogue only: no drawing, no physics.
//
// # Assumptions
//
// Names are stable: they are file names and scenario values.
//
// # Accuracy
//
// Not applicable (names and descriptions).
//
// # References
//
// None: the figures' own sources are those of the models they plot.
package figures

// Figure names, in report order.
const (
	Sky      = "sky"
	Timeline = "timeline"
	Year     = "year"
	Error    = "error"
	Gaps     = "gaps"
	Power    = "power"
)

// Info is one catalogue entry.
type Info struct {
	Name  string
	Shows string
	From  string
}

var catalogue = []Info{
	{Name: Sky, Shows: "sky coverage in body axes: how many sensors see each sun direction, with the sun track",
		From: "the sensors' fields of view and obstructions on a 2° grid; the run's sunlit sun directions"},
	{Name: Timeline, Shows: "the first orbits: sensors seeing the sun, validity and error of the primary estimator",
		From: "the run's time series"},
	{Name: Year, Shows: "beta angle and eclipse minutes per orbit over the calendar year",
		From: "a j2-mean orbit from the mean elements, one orbit examined per day"},
	{Name: Error, Shows: "the sun-vector error distribution of the primary estimator",
		From: "the run's error quantiles"},
	{Name: Gaps, Shows: "sunlit gaps without a valid sun vector",
		From: "the run's gap list"},
	{Name: Power, Shows: "solar-array power over the first orbits and the mean power of each whole orbit (only with body.panels)",
		From: "the run's power pass over the nominal attitude (cosine law, shadow, panel obstruction)"},
}

// Names lists the figure names in report order.
func Names() []string {
	out := make([]string, len(catalogue))
	for i, f := range catalogue {
		out[i] = f.Name
	}
	return out
}
