package sensor

import (
	"fmt"
	"strings"
)

// EstimatorInfo is the registry entry of one sun-vector estimator: its name
// in the scenario file, what it does and its source (the report's models
// table and check print both), and the estimator with its default settings.
type EstimatorInfo struct {
	Name      string
	Model     string
	Source    string
	Estimator Estimator
}

// estimators is the registry, in the order names are listed.
var estimators = []EstimatorInfo{
	{Name: "least-squares", Estimator: LeastSquares{},
		Model:  "least squares over the lit cosine sensors, s ∝ (NᵀN)⁻¹Nᵀm",
		Source: "closed form (normal equations); Wertz (ed.) 1978, ch. 7 (from memory)"},
	{Name: "opposite-pairs", Estimator: OppositePairs{},
		Model:  "differences of opposed cosine sensors, exact for ideal hemispherical sensors",
		Source: "closed form"},
	{Name: "two-axis", Estimator: TwoAxis{},
		Model:  "1/σ²-weighted mean of the two-axis sensors' directions",
		Source: "closed form (inverse-variance weighting)"},
	{Name: "combined", Estimator: Combined{},
		Model:  "1/σ²-weighted mean of the two-axis directions and the cosine least-squares direction (counted at 5°)",
		Source: "closed form (inverse-variance weighting); 5° coarse weight: common practice, no source"},
}

// Estimators lists the registered estimators.
func Estimators() []EstimatorInfo { return append([]EstimatorInfo(nil), estimators...) }

// EstimatorNames lists the estimator names in a stable order.
func EstimatorNames() []string {
	out := make([]string, len(estimators))
	for i, e := range estimators {
		out[i] = e.Name
	}
	return out
}

// LookupEstimator returns the registry entry of an estimator.
func LookupEstimator(name string) (EstimatorInfo, error) {
	for _, e := range estimators {
		if e.Name == name {
			return e, nil
		}
	}
	return EstimatorInfo{}, fmt.Errorf("sensor: estimator %q is not one of %s", name, strings.Join(EstimatorNames(), ", "))
}

// EstimatorByName returns the estimator with its default settings.
func EstimatorByName(name string) (Estimator, error) {
	e, err := LookupEstimator(name)
	return e.Estimator, err
}
