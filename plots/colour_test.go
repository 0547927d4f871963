package plots

import (
	"encoding/csv"
	"image/color"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"testing"
)

// Colour-vision simulation (Machado, Oliveira and Fernandes, "A
// physiologically-based model for simulation of color vision deficiency",
// IEEE TVCG 15(6), 2009, severity 1.0 matrices, from memory; checked below
// against the colorspacious library) applied in linear sRGB.
var (
	deuteranopia = [3][3]float64{{0.367322, 0.860646, -0.227968}, {0.280085, 0.672501, 0.047413}, {-0.011820, 0.042940, 0.968881}}
	protanopia   = [3][3]float64{{0.152286, 1.052583, -0.204868}, {0.114503, 0.786281, 0.099216}, {-0.003882, -0.048116, 1.051998}}
)

// sRGB transfer function (IEC 61966-2-1), linear part kept for negatives
// as colorspacious does.
func srgbDecode(v float64) float64 {
	if v <= 0.04045 {
		return v / 12.92
	}
	return math.Pow((v+0.055)/1.055, 2.4)
}

func srgbEncode(v float64) float64 {
	if v <= 0.0031308 {
		return 12.92 * v
	}
	return 1.055*math.Pow(v, 1/2.4) - 0.055
}

func linearRGB(c color.RGBA) [3]float64 {
	return [3]float64{srgbDecode(float64(c.R) / 255), srgbDecode(float64(c.G) / 255), srgbDecode(float64(c.B) / 255)}
}

func simulate(m [3][3]float64, lin [3]float64) [3]float64 {
	var out [3]float64
	for i := range 3 {
		out[i] = m[i][0]*lin[0] + m[i][1]*lin[1] + m[i][2]*lin[2]
	}
	return out
}

// lab returns CIELAB (D65 white) of linear sRGB (CIE 15:2004; sRGB
// primaries of IEC 61966-2-1). Out-of-gamut values are clipped first.
func lab(lin [3]float64) [3]float64 {
	for i := range lin {
		lin[i] = math.Max(0, math.Min(1, lin[i]))
	}
	x := 0.4124564*lin[0] + 0.3575761*lin[1] + 0.1804375*lin[2]
	y := 0.2126729*lin[0] + 0.7151522*lin[1] + 0.0721750*lin[2]
	z := 0.0193339*lin[0] + 0.1191920*lin[1] + 0.9503041*lin[2]
	f := func(t float64) float64 {
		if t > 216.0/24389 {
			return math.Cbrt(t)
		}
		return (24389.0/27*t + 16) / 116
	}
	fx, fy, fz := f(x/0.95047), f(y), f(z/1.08883)
	return [3]float64{116*fy - 16, 500 * (fx - fy), 200 * (fy - fz)}
}

// greyscale keeps only the luminance (a greyscale print or photocopy).
func greyscale(lin [3]float64) [3]float64 {
	y := 0.2126729*lin[0] + 0.7151522*lin[1] + 0.0721750*lin[2]
	return [3]float64{y, y, y}
}

// deltaE76 is the CIE 1976 colour difference ΔE*ab (CIE 15:2004).
func deltaE76(a, b [3]float64) float64 {
	return math.Sqrt((a[0]-b[0])*(a[0]-b[0]) + (a[1]-b[1])*(a[1]-b[1]) + (a[2]-b[2])*(a[2]-b[2]))
}

// The simulation and CIELAB above agree with the colorspacious library on
// the palette (testdata/cvd_colorspacious.csv, gen_cvd_colorspacious.py).
func TestColourSimulationMatchesColorspacious(t *testing.T) {
	f, err := os.Open(filepath.Join("testdata", "cvd_colorspacious.csv"))
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	palette := append(append([]color.RGBA{}, coverageColours...), blindHatch)
	if len(rows)-1 != len(palette) {
		t.Fatalf("reference has %d colours, palette %d: rerun the generator", len(rows)-1, len(palette))
	}
	for k, row := range rows[1:] {
		v := make([]float64, len(row))
		for i, s := range row {
			if v[i], err = strconv.ParseFloat(s, 64); err != nil {
				t.Fatal(err)
			}
		}
		c := palette[k]
		if v[0] != float64(c.R) || v[1] != float64(c.G) || v[2] != float64(c.B) {
			t.Fatalf("reference colour %d is %v, palette has %v: rerun the generator", k, v[:3], c)
		}
		if d := deltaE76(lab(linearRGB(c)), [3]float64{v[3], v[4], v[5]}); d > 0.05 {
			t.Errorf("colour %d: CIELAB off colorspacious by ΔE %.3f", k, d)
		}
		for j, m := range [][3][3]float64{deuteranopia, protanopia} {
			s := simulate(m, linearRGB(c))
			for i := range 3 {
				if got, want := srgbEncode(s[i]), v[6+3*j+i]; math.Abs(got-want) > 2e-4 {
					t.Errorf("colour %d, simulation %d, channel %d: %.5f, colorspacious %.5f", k, j, i, got, want)
				}
			}
		}
	}
}

// The five coverage classes of the sky map stay distinguishable in normal
// vision, in simulated deuteranopia and protanopia and in greyscale: every
// pair differs by at least minDeltaE (CIE76). About 2.3 is a just
// noticeable difference (G. Sharma, Digital Color Imaging Handbook, 2003,
// from memory); 15 is asked so neighbouring classes read apart at a glance
// (common practice, no source). The blind class must also be the darkest,
// so it stands out in greyscale.
func TestCoverageColoursDistinct(t *testing.T) {
	const minDeltaE = 15
	views := []struct {
		name string
		f    func([3]float64) [3]float64
	}{
		{"normal vision", func(l [3]float64) [3]float64 { return l }},
		{"deuteranopia", func(l [3]float64) [3]float64 { return simulate(deuteranopia, l) }},
		{"protanopia", func(l [3]float64) [3]float64 { return simulate(protanopia, l) }},
		{"greyscale", greyscale},
	}
	for _, v := range views {
		labs := make([][3]float64, len(coverageColours))
		for i, c := range coverageColours {
			labs[i] = lab(v.f(linearRGB(c)))
		}
		worst := math.Inf(1)
		for i := range labs {
			for j := i + 1; j < len(labs); j++ {
				d := deltaE76(labs[i], labs[j])
				worst = math.Min(worst, d)
				if d < minDeltaE {
					t.Errorf("%s: classes %s and %s differ by ΔE %.1f < %d", v.name, coverageLabels[i], coverageLabels[j], d, minDeltaE)
				}
			}
			if i > 0 && labs[i][0] <= labs[0][0]+15 {
				t.Errorf("%s: class %s (L* %.0f) is not clearly lighter than the blind class (L* %.0f)", v.name, coverageLabels[i], labs[i][0], labs[0][0])
			}
		}
		t.Logf("%s: smallest ΔE between classes %.1f", v.name, worst)
	}
}
