package plots

import (
	"fmt"
	"math"
	"testing"
)

func benchSky(stepDeg float64) SkyMap {
	var f SkyMap
	for a := -180 + stepDeg/2; a < 180; a += stepDeg {
		f.AzDeg = append(f.AzDeg, a)
	}
	for e := -90 + stepDeg/2; e < 90; e += stepDeg {
		f.ElDeg = append(f.ElDeg, e)
	}
	for i := range f.ElDeg {
		row := make([]int, len(f.AzDeg))
		for j := range row {
			row[j] = (i + j) % 5
		}
		f.Counts = append(f.Counts, row)
	}
	return f
}

// BenchmarkSkyMapSVG renders the sky map at 10° and 5° cells.
func BenchmarkSkyMapSVG(b *testing.B) {
	for _, step := range []float64{10, 5} {
		f := benchSky(step)
		b.Run(fmt.Sprintf("cell=%gdeg", step), func(b *testing.B) {
			for b.Loop() {
				c, err := f.Plot(Caption{Scenario: "bench"})
				if err != nil {
					b.Fatal(err)
				}
				if _, err := c.SVG(); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkTimelineSVG renders timelines of 1 000 and 10 000 samples.
func BenchmarkTimelineSVG(b *testing.B) {
	for _, n := range []int{1000, 10000} {
		f := Timeline{}
		for i := range n {
			f.T = append(f.T, float64(i)*10)
			f.SensorsSeeing = append(f.SensorsSeeing, i%4)
			f.Valid = append(f.Valid, i%4 > 1)
			e := math.NaN()
			if i%4 > 1 {
				e = float64(i%7) / 3
			}
			f.ErrNoAlbedoDeg = append(f.ErrNoAlbedoDeg, e)
			f.ErrAlbedoDeg = append(f.ErrAlbedoDeg, 2*e)
		}
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			for b.Loop() {
				c, err := f.Plot(Caption{})
				if err != nil {
					b.Fatal(err)
				}
				if _, err := c.SVG(); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
