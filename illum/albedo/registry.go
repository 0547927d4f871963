package albedo

import (
	"fmt"
	"io"
	"os"
	"strings"
)

// Albedo model names in the scenario file.
const (
	NameNone    = "none"
	NameUniform = "uniform"
	NameZonal   = "zonal"
	NameGrid    = "grid"
)

// ModelInfo is the registry entry of one albedo model: its name in the
// scenario file, the keys it takes with their defaults, its published
// source (the report's models table and check print it) and its builder.
type ModelInfo struct {
	Name   string
	Source string
	// TakesValue says albedo.value applies; DefaultValue is its default.
	TakesValue   bool
	DefaultValue float64
	// TakesGrid says albedo.grid_file applies (and is required).
	TakesGrid bool
	// Reflectance builds the surface reflectance from albedo.value and
	// albedo.grid_file; nil for the model that leaves albedo out.
	Reflectance func(value float64, gridFile string) (Reflectance, error)
	// Describe says in one line what the model is, with its settings.
	Describe func(value float64, cells int) string
	// Brief says it in a few words, for a figure caption.
	Brief func(value float64) string
}

// defaultUniformAlbedo is the global mean Bond albedo ≈ 0.29–0.31 (from
// memory), the reflectance of the uniform model by default.
const defaultUniformAlbedo = 0.30

var models = []ModelInfo{
	{Name: NameNone, Source: "Earth reflection left out: coarse-sensor errors are underestimated",
		Describe: func(float64, int) string { return "none" },
		Brief:    func(float64) string { return "no albedo" }},
	{Name: NameUniform, TakesValue: true, DefaultValue: defaultUniformAlbedo,
		Source:      "cell integration of the sunlit, visible cap after D. D. V. Bhanderi and T. Bak, Modeling Earth albedo for satellites in Earth orbit, AIAA GNC 2005; reflectance 0.30 from ECSS-E-ST-10-04C",
		Reflectance: func(v float64, _ string) (Reflectance, error) { return Uniform{Albedo: v}, nil },
		Describe: func(v float64, cells int) string {
			return fmt.Sprintf("uniform Lambertian Earth, reflectance %.2f, %d cells", v, cells)
		},
		Brief: func(v float64) string { return fmt.Sprintf("albedo uniform %.2f", v) }},
	{Name: NameZonal, TakesValue: true, DefaultValue: KnockeZonal().A0,
		Source: "latitude model after R. Knocke, J. Ries and B. Tapley, AIAA 88-4292, 1988; cell integration after Bhanderi and Bak, AIAA GNC 2005",
		// albedo.value is the profile's global mean: scale it (the
		// default, the published a₀, leaves it as published).
		Reflectance: func(v float64, _ string) (Reflectance, error) {
			z := KnockeZonal()
			return z.Scaled(v / z.A0), nil
		},
		Describe: func(v float64, cells int) string {
			return fmt.Sprintf("zonal reflectance scaled to a global mean of %.2f, %d cells", v, cells)
		},
		Brief: func(v float64) string { return fmt.Sprintf("albedo zonal (global mean %.2f)", v) }},
	{Name: NameGrid, TakesGrid: true,
		Source:      "cell integration after Bhanderi and Bak, AIAA GNC 2005; grid values as supplied by the user",
		Reflectance: readGrid,
		Describe:    func(float64, int) string { return "reflectance grid from a file" },
		Brief:       func(float64) string { return "albedo from a reflectance grid" }},
}

func readGrid(_ float64, path string) (Reflectance, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("albedo: %w", err)
	}
	defer f.Close()
	if st, err := f.Stat(); err == nil && st.Size() > MaxGridBytes {
		return nil, fmt.Errorf("albedo: grid %s is %d bytes, more than the %d bytes a grid may have (a 0.25° monthly grid is about 75 MB); coarsen the grid", path, st.Size(), int64(MaxGridBytes))
	}
	g, err := ParseGrid(io.LimitReader(f, MaxGridBytes+1))
	if err != nil {
		return nil, fmt.Errorf("albedo: grid %s: %w", path, err)
	}
	return g, nil
}

// MaxGridBytes bounds a reflectance grid file, checked before it is read
// (also for a device or pipe, whose size is unknown, by reading at most this).
const MaxGridBytes = 128 << 20

// Models lists the registered albedo models.
func Models() []ModelInfo { return append([]ModelInfo(nil), models...) }

// ModelNames lists the registered albedo model names.
func ModelNames() []string {
	out := make([]string, len(models))
	for i, m := range models {
		out[i] = m.Name
	}
	return out
}

// LookupModel returns the registry entry of an albedo model.
func LookupModel(name string) (ModelInfo, error) {
	for _, m := range models {
		if m.Name == name {
			return m, nil
		}
	}
	return ModelInfo{}, fmt.Errorf("albedo: model %q is not one of %s", name, strings.Join(ModelNames(), ", "))
}
