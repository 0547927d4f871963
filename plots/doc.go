// Package plots draws every sunsight figure and writes the self-contained
// HTML design-review report. It computes no physics and imports no other
// sunsight package: callers fill plain tables (SkyMap, Timeline, YearView,
// ErrorDist, Gaps, Sweep, BudgetBars, Sensitivity), each with a Plot method
// that returns a *Chart, and a Report for WriteReport.
//
// # Model
//
// The sky map shows the body-frame sphere in the Hammer (Hammer–Aitoff)
// equal-area projection, see Hammer. Each azimuth–elevation cell is drawn
// as its projected outline (six points per side) and shaded by the number
// of sensors that see the sun from that direction, in five classes 0, 1, 2,
// 3, 4+. The map keeps its 2:1 aspect whatever the canvas, so equal areas
// look equal. Empirical CDFs step by 1/n per sorted sample; the p95 of
// samples is gonum stat.Quantile(0.95, stat.Empirical); the p95 of a
// histogram is interpolated linearly inside its bin (common practice, no
// source). Time axes are in minutes up to 12 h, hours beyond.
//
// Figures are 10 × 6 in (7.5 in tall with three panels) with 14 pt axis
// labels, 12 pt ticks and legend and an 11 pt caption (common practice for
// projection, no source). Colours follow the Okabe–Ito colour-blind safe
// set (from memory). Save writes PNG, SVG or PDF through a temporary file
// renamed into place, so a failure never leaves a partial file.
//
// The report is one HTML file made with html/template and embedded CSS: no
// scripts, no remote assets, print CSS that keeps each figure on one page.
// Only SVG produced by Chart.SVG is inlined (its XML declaration and
// generator comment stripped); all other text is escaped.
//
// # Assumptions
//
// Azimuth is measured in the body X–Y plane from +X toward +Y, elevation
// from that plane toward +Z; sky-map cell edges lie half-way between the
// given centres. NaN in a series marks "undefined" and leaves a gap (gonum
// plotter.NewLine rejects NaN, so series are split there). Inputs of the
// wrong length or order are rejected with an error naming the field.
//
// # Accuracy
//
// Figures show the numbers they are given; nothing is smoothed or
// resampled. Projected cell areas match the sphere areas Δλ (sin φ₂ − sin φ₁)
// to better than 1e-3 (TestHammerEqualArea). The report is an analysis aid:
// it says so on its first screen, and flight hardware needs qualified
// verification.
//
// # References
//
//   - J. P. Snyder, "Map Projections — A Working Manual", USGS Professional
//     Paper 1395, 1987: Hammer projection (from memory; checked here in
//     closed form at the centre, poles and boundary ellipse x²/8 + y²/2 = 1,
//     and numerically for equal area).
//   - M. Okabe and K. Ito, "Color Universal Design", 2008 (from memory).
//   - gonum/plot v0.17.0 for drawing; its cmpimg golden-file pattern for
//     testdata/sweep_golden.svg (regenerate with `go test ./plots -regen`).
package plots
