package main

import (
	"bytes"
	"regexp"
	"strings"
	"testing"
)

// An aperture-array sensor: check prints the field and accuracy its
// geometry gives (tan α = (5.6 − 1)/(2·1.5), 56.9°; 5.5 µm × 0.2 px /
// (1.5 mm × √9) = 2.44·10⁻⁴ rad, 0.0140°; closed form), and the run's
// sensors table shows no full scale and no saturation for it (no converter
// model), while the cosine sensor keeps its ADC range.
func TestApertureArrayOnTheCommandLine(t *testing.T) {
	file := scenarioText(t, `name: aperture array
epoch: "2026-06-01T00:00:00Z"
duration: 3h
step: 10s
orbit: {altitude_km: 500, ltan: "10:30"}
attitude: {law: nadir, point_axis: "+Z", align_axis: "+X"}
body:
  sensors:
    - {name: dss, kind: aperture-array, face: "-Z", mask_height_mm: 1.5, detector_size_mm: 5.6,
       pixel_pitch_um: 5.5, centroid_px_1sigma: 0.2, apertures: 9, array_size_mm: 1.0}
    - {name: css, kind: cosine, face: "+X"}
albedo: {model: none}
`)
	var out, errb bytes.Buffer
	if code := runMain([]string{"check", file}, &out, &errb); code != 0 {
		t.Fatalf("check: exit %d: %s", code, errb.String())
	}
	if want := "dss: valid within ±56.9° per axis (every spot on the detector), 0.0140° 1σ per axis at the boresight"; !strings.Contains(out.String(), want) {
		t.Errorf("check does not print %q:\n%s", want, out.String())
	}
	out.Reset()
	if code := runMain([]string{"run", "--quiet", file}, &out, &errb); code != 0 {
		t.Fatalf("run: exit %d: %s", code, errb.String())
	}
	text := out.String()
	if !regexp.MustCompile(`(?m)^  dss +\S+ % +[0-9.]+ +— +— `).MatchString(text) {
		t.Errorf("the aperture array's row shows a full scale or a saturation:\n%s", text)
	}
	if !regexp.MustCompile(`(?m)^  css +\S+ % +[0-9.]+ +1\.50 \(\+[0-9]+ %\) +[0-9.]+ % `).MatchString(text) {
		t.Errorf("the cosine sensor's row lost its full scale:\n%s", text)
	}
}
